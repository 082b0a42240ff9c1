import type { AssessmentRefusalDetails } from '../api/get-assessment';
import { Figure } from './figure';
import { FigureRow, FigureTable } from './figure-table';

/** A group the engine cannot assess (422): the rule in plain words and what can still be said about the data. */
export function RefusalPanel({ refusal }: { refusal: AssessmentRefusalDetails & { message: string } }) {
  const d = refusal.descriptive;
  const unit = refusal.group.oelUnit;
  return (
    <section aria-labelledby="refusal-title" className="rounded-md border border-amber-300 bg-amber-50/70 p-4 text-sm text-amber-950">
      <h2 id="refusal-title" className="text-base text-amber-950">
        This group cannot be assessed yet
      </h2>
      <p className="mt-1" data-testid="refusal-rule">
        {refusal.rule.charAt(0).toUpperCase() + refusal.rule.slice(1)}.
      </p>
      <p className="mt-1">
        {refusal.data.excludedIds.length > 0
          ? 'Put back results left out below, or add shift results, and the figures appear here.'
          : 'When more shift results are added, the figures appear here.'}
      </p>
      {d && (
        <div className="mt-3 rounded border border-amber-200 bg-white p-3 text-slate-900">
          <FigureTable label="What the results show so far">
            <FigureRow
              label="Results"
              value={
                <>
                  {d.n}
                  {d.nonDetects > 0 && ` (${d.nonDetects} non-detects)`}
                </>
              }
            />
            <FigureRow
              label="Lowest · highest detected"
              value={
                <>
                  <Figure value={d.minimum} unit={unit} /> · <Figure value={d.maximum} unit={unit} />
                </>
              }
            />
            <FigureRow
              label="Above the OEL"
              value={
                <>
                  {d.countAboveOel} of {d.n}
                </>
              }
              note={
                <>
                  OEL <Figure value={refusal.group.oel} unit={unit} />
                </>
              }
            />
            {d.countAboveActionLevel !== null && (
              <FigureRow
                label="Above the action level"
                value={
                  <>
                    {d.countAboveActionLevel} of {d.n}
                  </>
                }
              />
            )}
          </FigureTable>
        </div>
      )}
    </section>
  );
}
