/** A value as short readable text: strings as they are, everything else as compact JSON. */
function show(value: unknown): string {
  if (value === undefined) return '—';
  if (value === null || value === '') return '(blank)';
  const text = typeof value === 'string' ? value : JSON.stringify(value);
  return text.length > 120 ? `${text.slice(0, 117)}…` : text;
}

/** One line per field that an event touched: `field: before → after` (only the side that exists otherwise). */
export function changeLines(
  before: Record<string, unknown> | null,
  after: Record<string, unknown> | null,
): Array<{ field: string; before?: string; after?: string }> {
  const fields = [...new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})])];
  return fields.map((field) => ({
    field,
    before: before && field in before ? show(before[field]) : undefined,
    after: after && field in after ? show(after[field]) : undefined,
  }));
}

/** What an audit event changed, field by field, readable at a glance. */
export function ChangeSummary({ before, after }: { before: Record<string, unknown> | null; after: Record<string, unknown> | null }) {
  const lines = changeLines(before, after);
  if (lines.length === 0) return <span className="text-slate-500">—</span>;
  return (
    <ul className="max-w-md space-y-0.5 text-xs">
      {lines.map((line) => (
        <li key={line.field} className="break-all">
          <span className="font-medium text-slate-800">{line.field}</span>:{' '}
          {line.before !== undefined && (
            <>
              <del className="text-slate-500">{line.before}</del>
              {line.after !== undefined && <span aria-label="changed to"> → </span>}
            </>
          )}
          {line.after !== undefined && <ins className="text-slate-900 no-underline">{line.after}</ins>}
        </li>
      ))}
    </ul>
  );
}
