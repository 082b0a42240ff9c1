import type { DecisionStatus } from '@schema/decision-records';
import type { Judgement } from '@stats/types';
import { StatusBadge } from '@frontend/components/status-badge';

const statusLooks: Record<DecisionStatus, { label: string; tone: 'neutral' | 'positive' | 'muted' | 'warning' }> = {
  draft: { label: 'Waiting for review', tone: 'neutral' },
  returned: { label: 'Returned', tone: 'warning' },
  approved: { label: 'Approved', tone: 'positive' },
  superseded: { label: 'Superseded', tone: 'muted' },
};

/** A record's status in words ("Waiting for review", "Approved"…), never colour alone. */
export function DecisionStatusBadge({ status }: { status: DecisionStatus }) {
  const look = statusLooks[status];
  return <StatusBadge tone={look.tone}>{look.label}</StatusBadge>;
}

export const decisionStatusLabel = (status: DecisionStatus) => statusLooks[status].label;

const judgementLooks: Record<Judgement, { label: string; mark: string; box: string }> = {
  acceptable: { label: 'Acceptable', mark: '✓', box: 'border-emerald-300 bg-emerald-50 text-emerald-900' },
  uncertain: { label: 'Uncertain', mark: '?', box: 'border-amber-300 bg-amber-50 text-amber-950' },
  unacceptable: { label: 'Unacceptable', mark: '!', box: 'border-red-300 bg-red-50 text-red-900' },
};

/** The judgement as a word with a mark. */
export function DecisionJudgement({ judgement }: { judgement: Judgement }) {
  const look = judgementLooks[judgement];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold whitespace-nowrap ${look.box}`}>
      <span aria-hidden="true">{look.mark}</span>
      {look.label}
    </span>
  );
}

export const judgementWord = (judgement: Judgement) => judgementLooks[judgement].label;

/** "Out of date": results changed after approval. */
export function OutOfDateMarker() {
  return (
    <StatusBadge tone="warning" title="The group's results changed after this record was approved">
      Out of date
    </StatusBadge>
  );
}
