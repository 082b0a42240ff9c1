/** Exposure categories 0–4, bands of the 95th percentile as a share of the OEL. */
export const exposureCategories = [
  { category: 0, word: 'Very low', band: 'below 1% of the OEL' },
  { category: 1, word: 'Low', band: '1% to 10% of the OEL' },
  { category: 2, word: 'Moderate', band: '10% to 50% of the OEL' },
  { category: 3, word: 'High', band: '50% to 100% of the OEL' },
  { category: 4, word: 'Above the limit', band: 'above the OEL' },
] as const;

export type ExposureCategory = (typeof exposureCategories)[number]['category'];

/**
 * An exposure category as colour, number and word together ("2 · Moderate"), never colour
 * alone. The colours are the sequential --category-N palette in styles.css.
 */
export function CategoryBadge({ category }: { category: ExposureCategory }) {
  const entry = exposureCategories[category];
  return (
    <span
      className="inline-flex items-center gap-1.5 rounded-full border border-slate-300 bg-white py-0.5 pr-2.5 pl-1 text-xs font-medium text-slate-800"
      title={`Exposure category ${category}: ${entry.word}, ${entry.band}`}
    >
      <span
        aria-hidden="true"
        className="inline-block size-3.5 rounded-full ring-1 ring-slate-900/20 ring-inset"
        style={{ background: `var(--category-${category})` }}
      />
      <span>
        <span className="sr-only">Exposure category </span>
        {category} · {entry.word}
      </span>
    </span>
  );
}
