import type { PlanProgress as Progress } from '@frontend/lib/api-types';

/** Shifts measured against the plan's target, as a bar with the figures beside it (never the bar alone). */
export function PlanProgress({ progress }: { progress: Progress }) {
  return (
    <div className="space-y-1">
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
        <span>
          <strong className="text-lg font-semibold text-slate-900 tabular-nums">{progress.done}</strong>
          <span className="text-slate-600"> of {progress.targetCount} shifts measured</span>
        </span>
        <span className="text-slate-600 tabular-nums">{progress.percentOfTarget}%</span>
      </div>
      <div
        role="progressbar"
        aria-label="Shifts measured against the target"
        aria-valuemin={0}
        aria-valuemax={progress.targetCount}
        aria-valuenow={Math.min(progress.done, progress.targetCount)}
        aria-valuetext={`${progress.done} of ${progress.targetCount} shifts measured`}
        className="h-2 overflow-hidden rounded-full bg-slate-200"
      >
        <div className="h-full rounded-full bg-primary-600" style={{ width: `${progress.percentOfTarget}%` }} />
      </div>
      <p className="text-xs text-slate-600">
        {progress.picked} picked · {progress.remaining} still to measure
        {progress.unplannedResultsInWindow > 0 && ` · ${progress.unplannedResultsInWindow} result(s) in the window on shifts the plan did not pick`}
      </p>
    </div>
  );
}
