import { formatNumber } from '@frontend/lib/format';

export interface KeyFigureValues {
  n: number;
  gm: number;
  p95: number;
  utl95_95: number;
  exceedanceFraction: number;
  oel: number;
  oelUnit: string;
}

/** The main figures of a record (frozen) or of a draft (as they would be frozen now), with the OEL they are judged against. */
export function KeyFigures({ figures, caption }: { figures: KeyFigureValues; caption: string }) {
  const unit = figures.oelUnit === 'mg/m3' ? 'mg/m³' : figures.oelUnit === 'dose-percent' ? '% dose' : figures.oelUnit;
  const rows: Array<[string, string]> = [
    ['Results used (n)', String(figures.n)],
    ['Geometric mean', `${formatNumber(figures.gm)} ${unit}`],
    ['95th percentile', `${formatNumber(figures.p95)} ${unit}`],
    ['Upper tolerance limit (95 %, 95 %)', `${formatNumber(figures.utl95_95)} ${unit}`],
    ['Exceedance fraction', `${formatNumber(100 * figures.exceedanceFraction)} %`],
    ['OEL judged against', `${formatNumber(figures.oel, 4)} ${unit}`],
  ];
  return (
    <table className="w-full text-sm">
      <caption className="mb-1 text-left text-xs font-medium tracking-wide text-slate-500 uppercase">{caption}</caption>
      <tbody>
        {rows.map(([label, value]) => (
          <tr key={label} className="border-t border-slate-100">
            <th scope="row" className="py-1 pr-3 text-left font-normal text-slate-700">
              {label}
            </th>
            <td className="py-1 text-right font-medium tabular-nums">{value}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
