import type { ReactNode } from 'react';
import { Button } from '@frontend/components/button';
import { CategoryBadge } from '@frontend/components/category-badge';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatFigure, formatProbability, unitLabel } from '../lib/format-figure';
import { JudgementBadge } from './judgement-badge';

interface Change {
  label: string;
  before: ReactNode;
  after: ReactNode;
  changed: boolean;
}

function changesBetween(baseline: GroupAssessmentResponse, current: GroupAssessmentResponse): Change[] {
  const unit = unitLabel(current.group.oelUnit);
  const list: Change[] = [
    {
      label: 'Judgement',
      before: <JudgementBadge judgement={baseline.classical.judgement} />,
      after: <JudgementBadge judgement={current.classical.judgement} />,
      changed: baseline.classical.judgement !== current.classical.judgement,
    },
    {
      label: 'Exposure category',
      before: <CategoryBadge category={baseline.classical.categoryByP95} />,
      after: <CategoryBadge category={current.classical.categoryByP95} />,
      changed: baseline.classical.categoryByP95 !== current.classical.categoryByP95,
    },
    {
      label: '95th percentile',
      before: `${formatFigure(baseline.classical.p95)} ${unit}`,
      after: `${formatFigure(current.classical.p95)} ${unit}`,
      changed: baseline.classical.p95 !== current.classical.p95,
    },
    {
      label: 'UTL95%,95%',
      before: `${formatFigure(baseline.classical.utl95_95)} ${unit}`,
      after: `${formatFigure(current.classical.utl95_95)} ${unit}`,
      changed: baseline.classical.utl95_95 !== current.classical.utl95_95,
    },
    {
      label: 'EN 689',
      before: baseline.classical.en689.result,
      after: current.classical.en689.result,
      changed: baseline.classical.en689.result !== current.classical.en689.result,
    },
  ];
  if (baseline.bayes?.probabilityP95AboveOel != null && current.bayes?.probabilityP95AboveOel != null) {
    list.push({
      label: 'Bayesian P(P95 > OEL)',
      before: formatProbability(baseline.bayes.probabilityP95AboveOel),
      after: formatProbability(current.bayes.probabilityP95AboveOel),
      changed: baseline.bayes.probabilityP95AboveOel !== current.bayes.probabilityP95AboveOel,
    });
  }
  return list;
}

/**
 * What leaving results out changed, before → after, with the reminder that stored data stay as they
 * are. `baseline` is the assessment of all valid results (null while it loads or when it cannot be made).
 */
export function WhatIfChanges({
  baseline,
  current,
  leftOut,
  onClear,
}: {
  baseline: GroupAssessmentResponse | null;
  current: GroupAssessmentResponse | null;
  leftOut: number;
  onClear: () => void;
}) {
  const changes = baseline && current ? changesBetween(baseline, current) : [];
  // Judgement and category always show (changed or not); other figures when they changed.
  const shown = changes.filter((change, index) => index < 2 || change.changed);
  const changed = changes.filter((change) => change.changed);
  return (
    <section aria-labelledby="what-if-title" className="rounded-md border border-primary-200 bg-primary-50/60 px-4 py-3 text-sm">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h2 id="what-if-title" className="text-sm">
            What-if: {leftOut} {leftOut === 1 ? 'result' : 'results'} left out
          </h2>
          <p className="mt-0.5 text-slate-700">
            The figures on this page leave {leftOut === 1 ? 'it' : 'them'} out. The stored results are not changed. When a decision is drafted from this page,
            the results left out are saved with the draft.
          </p>
        </div>
        <Button size="sm" onClick={onClear}>
          Put every result back
        </Button>
      </div>
      {baseline && current && (
        <table className="mt-2 text-sm" aria-label="What changed when results were left out">
          <thead className="sr-only">
            <tr>
              <th scope="col">Figure</th>
              <th scope="col">With every result</th>
              <th scope="col">With results left out</th>
            </tr>
          </thead>
          <tbody>
            {shown.map((change) => (
              <tr key={change.label}>
                <th scope="row" className="py-0.5 pr-3 text-left font-medium text-slate-700">
                  {change.label}
                </th>
                <td className="py-0.5 pr-2">{change.before}</td>
                <td className="py-0.5">
                  <span aria-hidden="true" className="pr-2 text-slate-500">
                    →
                  </span>
                  {change.after}
                  {!change.changed && <span className="ml-2 text-xs text-slate-600">(unchanged)</span>}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {baseline && current && changed.length === 0 && <p className="mt-1 text-slate-700">No figure changed.</p>}
    </section>
  );
}
