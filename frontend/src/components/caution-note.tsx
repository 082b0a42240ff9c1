/**
 * The cautions PRODUCT.md asks every assessment page and evidence pack to show, in one place
 * so the wording stays the same everywhere.
 */
export const cautionText = {
  judgement: 'Statistics support and never replace the judgement of a qualified hygienist.',
  regulations:
    'Limits, sampling duties and hearing conservation requirements come from the local regulations that apply; follow them and licensed or certified professional practice.',
} as const;

/** `panel` for pages that show results; `footer` for the quiet line at the foot of every page. */
export function CautionNote({ variant = 'panel' }: { variant?: 'panel' | 'footer' }) {
  if (variant === 'footer') {
    return (
      <p className="text-xs leading-relaxed text-slate-500">
        {cautionText.judgement} {cautionText.regulations}
      </p>
    );
  }
  return (
    <aside aria-labelledby="caution-title" className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-3 text-sm text-amber-950">
      <h2 id="caution-title" className="text-sm font-semibold text-amber-950">
        Read the figures with care
      </h2>
      <p className="mt-1">{cautionText.judgement}</p>
      <p className="mt-1">{cautionText.regulations}</p>
    </aside>
  );
}
