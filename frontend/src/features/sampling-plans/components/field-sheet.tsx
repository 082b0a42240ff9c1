import { averagingTimeLabels, exposureUnitLabels } from '@schema/agents';
import { Button } from '@frontend/components/button';
import { formatCalendarDate, formatDateTime, formatNumber } from '@frontend/lib/format';
import type { FieldSheet as Sheet } from '../api/get-field-sheet';
import './field-sheet.css';

/** Rows per printed page: about what fits an A4 landscape sheet with room to write. */
export const rowsPerPage = 25;

/** Columns the technician fills in by hand beyond the sample id go into one wide notes box. */
const longFields = /tasks|controls|protection/i;

function chunk<T>(items: readonly T[], size: number): T[][] {
  const pages: T[][] = [];
  for (let start = 0; start < items.length; start += size) pages.push(items.slice(start, start + size));
  return pages.length > 0 ? pages : [[]];
}

/**
 * The printable field sheet of a plan: every picked worker-shift in date order with blank boxes
 * for the person who samples (sample id and the agent's own fields) and a notes box. Each printed
 * page repeats the heading (organization, group, agent, limit, plan, seed) and carries 25 rows.
 */
export function FieldSheet({ sheet }: { sheet: Sheet }) {
  const { group, agent, plan } = sheet;
  const pages = chunk(sheet.rows, rowsPerPage);
  const boxes = sheet.fieldsToRecord.filter((field) => !longFields.test(field));
  const noteFields = sheet.fieldsToRecord.filter((field) => longFields.test(field));
  const unit = exposureUnitLabels[group.oel.unit];
  const showNames = sheet.rows.some((row) => row.worker.name);

  return (
    <article className="field-sheet space-y-4" aria-labelledby="sheet-title">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-slate-600">
          {sheet.rows.length} worker-shifts on {pages.length} printed page{pages.length === 1 ? '' : 's'} ({rowsPerPage} rows each, A4 landscape).
        </p>
        <Button variant="primary" onClick={() => window.print()}>
          Print
        </Button>
      </div>
      {pages.map((rows, pageIndex) => (
        <section key={pageIndex} className="sheet-page card space-y-3 bg-white p-5" aria-label={`Page ${pageIndex + 1} of ${pages.length}`}>
          <header className="space-y-0.5 border-b border-slate-300 pb-2">
            <p className="flex flex-wrap justify-between gap-x-4 text-xs font-medium tracking-wide text-slate-500 uppercase">
              <span>
                {sheet.organization.name} · {sheet.site.name} · Field sheet
              </span>
              <span className="tabular-nums">
                Page {pageIndex + 1} of {pages.length}
              </span>
            </p>
            <h1 id={pageIndex === 0 ? 'sheet-title' : undefined} className="text-lg leading-tight">
              {group.name}
            </h1>
            <p className="text-sm">
              {agent.name}
              {agent.casNumber && ` (CAS ${agent.casNumber})`} · OEL {formatNumber(group.oel.value, 6)} {unit}, {averagingTimeLabels[group.oel.averagingTime]} (
              {group.oel.source}){group.actionLevel !== null && ` · action level ${formatNumber(group.actionLevel, 6)} ${unit}`} · shift{' '}
              {formatNumber(group.shiftHours)} h
            </p>
            <p className="text-xs text-slate-700 tabular-nums">
              {plan.title || `Plan ${plan.id}`} · {formatCalendarDate(plan.startDate)} – {formatCalendarDate(plan.endDate)} · seed {plan.seed}, draw {plan.draw}{' '}
              · {plan.targetCount} shifts planned
            </p>
          </header>
          {pageIndex === 0 && (
            <ul className="list-disc space-y-0.5 pl-5 text-xs text-slate-700">
              {sheet.instructions.map((instruction) => (
                <li key={instruction}>{instruction}</li>
              ))}
            </ul>
          )}
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-xs">
              <caption className="sr-only">Picked worker-shifts, page {pageIndex + 1}</caption>
              <thead>
                <tr className="bg-slate-50 text-left">
                  <th scope="col" className="border border-slate-300 px-1.5 py-1">
                    #
                  </th>
                  <th scope="col" className="border border-slate-300 px-1.5 py-1">
                    Date
                  </th>
                  <th scope="col" className="border border-slate-300 px-1.5 py-1">
                    Worker
                  </th>
                  <th scope="col" className="border border-slate-300 px-1.5 py-1">
                    Group
                  </th>
                  <th scope="col" className="border border-slate-300 px-1.5 py-1">
                    Agent
                  </th>
                  {boxes.map((field) => (
                    <th key={field} scope="col" className="border border-slate-300 px-1.5 py-1 font-medium">
                      {field}
                    </th>
                  ))}
                  <th scope="col" className="w-1/4 border border-slate-300 px-1.5 py-1 font-medium">
                    Notes{noteFields.length > 0 && <span className="block font-normal text-slate-500">{noteFields.join('; ')}</span>}
                  </th>
                </tr>
              </thead>
              <tbody>
                {rows.map((row, index) => (
                  <tr key={row.id} className="h-9 align-top">
                    <td className="border border-slate-300 px-1.5 py-1 tabular-nums">{pageIndex * rowsPerPage + index + 1}</td>
                    <td className="border border-slate-300 px-1.5 py-1 whitespace-nowrap tabular-nums">
                      {formatCalendarDate(row.date)} <span className="text-slate-500">{row.weekday.slice(0, 3)}</span>
                    </td>
                    <td className="border border-slate-300 px-1.5 py-1 whitespace-nowrap">
                      <span className="font-semibold tabular-nums">{row.worker.code}</span>
                      {showNames && row.worker.name && <span> {row.worker.name}</span>}
                    </td>
                    <td className="border border-slate-300 px-1.5 py-1 whitespace-nowrap">{group.name}</td>
                    <td className="border border-slate-300 px-1.5 py-1 whitespace-nowrap">{agent.name}</td>
                    {boxes.map((field) => (
                      <td key={field} className="border border-slate-300 px-1.5 py-1">
                        <span className="sr-only">{field}: to fill in</span>
                      </td>
                    ))}
                    <td className="border border-slate-300 px-1.5 py-1" />
                  </tr>
                ))}
              </tbody>
            </table>
            {sheet.rows.length === 0 && <p className="py-4 text-sm text-slate-600">The plan has no picks: the group has no members on the plan's days.</p>}
          </div>
          <footer className="sheet-footer text-[11px] text-slate-600">
            {sheet.cautions.join(' ')} <span className="tabular-nums">Printed from Bellwether, {formatDateTime(sheet.generatedAt)}.</span>
          </footer>
        </section>
      ))}
    </article>
  );
}
