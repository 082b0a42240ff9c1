import type { ReactNode } from 'react';

/** A two- or three-column table of figures: what, the value, and its limits or notes. Row headers name each figure. */
export function FigureTable({ label, children }: { label: string; children: ReactNode }) {
  return (
    <table className="w-full text-sm" aria-label={label}>
      <tbody className="divide-y divide-slate-100">{children}</tbody>
    </table>
  );
}

export function FigureRow({ label, value, note, testId }: { label: ReactNode; value: ReactNode; note?: ReactNode; testId?: string }) {
  return (
    <tr data-testid={testId}>
      <th scope="row" className="w-2/5 py-1.5 pr-3 text-left align-top font-normal text-slate-600">
        {label}
      </th>
      <td className="py-1.5 align-top">
        <div className="font-medium text-slate-900">{value}</div>
        {note && <div className="text-xs text-slate-600">{note}</div>}
      </td>
    </tr>
  );
}

/** A bordered panel with a heading (h2) and optional subtitle. */
export function Panel({
  id,
  title,
  subtitle,
  children,
  className = '',
}: {
  id: string;
  title: string;
  subtitle?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <section aria-labelledby={id} className={`card p-4 ${className}`}>
      <h2 id={id} className="text-base">
        {title}
      </h2>
      {subtitle && <p className="mt-0.5 text-xs text-slate-600">{subtitle}</p>}
      <div className="mt-2">{children}</div>
    </section>
  );
}

/** The header row of a small table of figures: one column heading per name. */
export function ColumnHeads({ names }: { names: readonly string[] }) {
  return (
    <thead>
      <tr className="text-left text-xs text-slate-500">
        {names.map((name) => (
          <th key={name} scope="col" className="pb-1 font-medium">
            {name}
          </th>
        ))}
      </tr>
    </thead>
  );
}
