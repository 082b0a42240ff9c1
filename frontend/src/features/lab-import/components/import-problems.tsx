import type { LabImportProblem } from '../api/types';

/**
 * Every problem of a refused lab file, one row each: the row as a spreadsheet numbers it (the
 * header is row 1), the column, and what is wrong. Announced as an alert; nothing was stored.
 */
export function ImportProblems({ problems, title = 'The file was not imported' }: { problems: readonly LabImportProblem[]; title?: string }) {
  return (
    <div role="alert" className="space-y-2 rounded-md border border-red-300 bg-red-50 px-4 py-3 text-sm text-red-950">
      <p className="font-semibold">
        {title}: {problems.length} problem{problems.length === 1 ? '' : 's'}. Nothing was stored.
      </p>
      <p>Correct the file (or the column mapping) and try again; every row is checked each time.</p>
      <div className="max-h-96 overflow-auto rounded border border-red-200 bg-white text-slate-900">
        <table className="table-dense w-full">
          <caption className="sr-only">Problems by row and column</caption>
          <thead className="sticky top-0">
            <tr>
              <th scope="col">Row</th>
              <th scope="col">Column</th>
              <th scope="col">Problem</th>
            </tr>
          </thead>
          <tbody>
            {problems.map((problem, index) => (
              <tr key={`${problem.row}-${problem.column}-${index}`}>
                <td className="tabular-nums">{problem.row ?? '—'}</td>
                <td>{problem.column ?? '—'}</td>
                <td>{problem.message}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
