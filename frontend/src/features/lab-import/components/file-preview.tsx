import type { LabImportPreview } from '../api/types';

const delimiterNames: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'bar' };

/** The columns found in the file (with example values) and its first rows, as the server read them. */
export function FilePreview({ preview }: { preview: LabImportPreview }) {
  const names = preview.columns.map((column) => column.name);
  return (
    <section aria-labelledby="preview-title" className="space-y-2">
      <h2 id="preview-title" className="text-base">
        What the file holds
      </h2>
      <p className="text-sm text-slate-600">
        {preview.rowCount} data row{preview.rowCount === 1 ? '' : 's'}, {names.length} columns, separated by a{' '}
        {delimiterNames[preview.delimiter] ?? `“${preview.delimiter}”`}.
        {preview.rows.length < preview.rowCount && ` The first ${preview.rows.length} rows are shown.`}
      </p>
      <div className="card max-h-80 overflow-auto">
        <table className="table-dense w-full">
          <caption className="sr-only">First rows of the file</caption>
          <thead className="sticky top-0">
            <tr>
              <th scope="col">Row</th>
              {names.map((name) => (
                <th key={name} scope="col" className="normal-case">
                  {name}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {preview.rows.map((row) => (
              <tr key={row.row}>
                <td className="text-slate-500 tabular-nums">{row.row}</td>
                {names.map((name) => (
                  <td key={name} className="whitespace-nowrap tabular-nums">
                    {row.values[name]}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
