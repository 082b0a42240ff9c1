import { CategoryBadge, exposureCategories } from './category-badge';

/** The five exposure categories with their bands, for pages that show or explain categories. */
export function CategoryLegend() {
  return (
    <section aria-labelledby="category-legend-title" className="card self-start px-4 py-3">
      <h2 id="category-legend-title" className="text-sm">
        Exposure categories
      </h2>
      <p className="mt-0.5 text-xs text-slate-600">Where a group's 95th percentile falls, as a share of its OEL.</p>
      <ul className="mt-2 space-y-1.5">
        {exposureCategories.map((entry) => (
          <li key={entry.category} className="flex flex-wrap items-center gap-2 text-sm">
            <CategoryBadge category={entry.category} />
            <span className="text-slate-600">{entry.band}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
