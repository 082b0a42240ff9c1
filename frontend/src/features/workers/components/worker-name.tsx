import type { WorkerReference } from '@frontend/lib/api-types';

/** A worker's name as a cell: the name, "—" when none was recorded, or "hidden" for roles that may not see names. */
export function WorkerName({ worker }: { worker: Pick<WorkerReference, 'name' | 'nameHidden'> }) {
  if (worker.nameHidden) return <span className="text-xs text-slate-500 italic">hidden</span>;
  return worker.name ? <span>{worker.name}</span> : <span className="text-slate-400">—</span>;
}

/** "RT-001 · Alex Corran" for pick lists, or just the code when the name is hidden or missing. */
export function workerLabel(worker: Pick<WorkerReference, 'code' | 'name' | 'jobTitle'>): string {
  const parts = [worker.code, worker.name, worker.jobTitle].filter((part): part is string => Boolean(part));
  return parts.join(' · ');
}
