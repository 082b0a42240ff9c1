import { useId, useRef, useState } from 'react';
import { labImportMaximumBytes } from '@schema/lab-imports';
import { Spinner } from '@frontend/components/spinner';

/**
 * Choose a lab file with the file picker (keyboard: Tab to it, Enter or Space opens it) or drop
 * it on the box. Only the first file counts. The server checks the type, size and content again.
 */
export function LabFileDrop({ onFile, busy }: { onFile: (file: File) => void; busy: boolean }) {
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const id = useId();
  const hintId = `${id}-hint`;

  function take(files: FileList | null) {
    const file = files?.[0];
    if (file) onFile(file);
    if (input.current) input.current.value = '';
  }

  return (
    <div
      onDragOver={(event) => {
        event.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(event) => {
        event.preventDefault();
        setOver(false);
        take(event.dataTransfer.files);
      }}
      className={`rounded-md border-2 border-dashed px-6 py-8 text-center transition-colors ${over ? 'border-primary-500 bg-primary-50' : 'border-slate-300 bg-white'}`}
      data-testid="lab-file-drop"
    >
      <label htmlFor={id} className="block text-sm font-medium text-slate-800">
        Lab results file (CSV)
      </label>
      <p id={hintId} className="mt-1 text-xs text-slate-600">
        Drop the file here, or choose it. Comma, semicolon or tab separated, with a header row; at most {labImportMaximumBytes / 1024 / 1024} MB.
      </p>
      <input
        ref={input}
        id={id}
        type="file"
        accept=".csv,.txt,text/csv,text/plain"
        aria-describedby={hintId}
        disabled={busy}
        onChange={(event) => take(event.target.files)}
        className="mx-auto mt-3 block text-sm file:mr-3 file:rounded file:border file:border-slate-300 file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-slate-800 hover:file:bg-slate-50"
      />
      {busy && (
        <p role="status" className="mt-3 inline-flex items-center gap-2 text-sm text-slate-600">
          <Spinner /> Reading the file…
        </p>
      )}
    </div>
  );
}
