import type { Judgement } from '@stats/types';

const looks: Record<Judgement, { label: string; box: string; mark: string }> = {
  acceptable: { label: 'Acceptable', box: 'border-emerald-300 bg-emerald-50 text-emerald-900', mark: '✓' },
  uncertain: { label: 'Uncertain', box: 'border-amber-300 bg-amber-50 text-amber-950', mark: '?' },
  unacceptable: { label: 'Unacceptable', box: 'border-red-300 bg-red-50 text-red-900', mark: '!' },
};

/** A judgement as a word with a mark (never colour alone). */
export function JudgementBadge({ judgement, size = 'sm' }: { judgement: Judgement; size?: 'sm' | 'lg' }) {
  const look = looks[judgement];
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border font-semibold whitespace-nowrap ${look.box} ${size === 'lg' ? 'px-3 py-1 text-sm' : 'px-2 py-0.5 text-xs'}`}
    >
      <span aria-hidden="true">{look.mark}</span>
      {look.label}
    </span>
  );
}

export const judgementLabel = (judgement: Judgement) => looks[judgement].label;
