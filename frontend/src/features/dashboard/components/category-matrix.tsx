import { Link } from 'react-router';
import type { OrganizationDashboard } from '@schema/dashboard';
import { CategoryBadge, exposureCategories } from '@frontend/components/category-badge';
import { resolveGroups, type DashboardGroupsById } from './group-lists';

/**
 * Sites down, exposure categories 0–4 across (plus "no approved record"): each cell lists its groups. A
 * group's category is its current approved decision record's; "out of date" marks results changed since.
 */
export function CategoryMatrix({
  organizationId,
  matrix,
  byId,
}: {
  organizationId: string;
  matrix: OrganizationDashboard['matrix'];
  byId: DashboardGroupsById;
}) {
  const groupLink = (group: { id: number; name: string; outOfDate: boolean }) => (
    <li key={group.id}>
      <Link to={`/orgs/${encodeURIComponent(organizationId)}/exposure-groups/${group.id}/decisions`}>{group.name}</Link>
      {group.outOfDate && <span className="ml-1 text-xs font-medium text-amber-900">(out of date)</span>}
    </li>
  );
  return (
    <div className="overflow-x-auto rounded-md border border-slate-200 bg-white">
      <table className="w-full text-sm" data-testid="category-matrix">
        <caption className="sr-only">Exposure groups by site and exposure category (current approved decision records)</caption>
        <thead className="bg-slate-50 text-left text-xs text-slate-600">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Site
            </th>
            {exposureCategories.map((entry) => (
              <th key={entry.category} scope="col" className="px-3 py-2 font-medium whitespace-nowrap">
                <CategoryBadge category={entry.category} />
              </th>
            ))}
            <th scope="col" className="px-3 py-2 font-medium">
              No approved record
            </th>
          </tr>
        </thead>
        <tbody>
          {matrix.map((row) => (
            <tr key={row.siteId} className="border-t border-slate-100 align-top">
              <th scope="row" className="px-3 py-2 text-left font-medium">
                {row.siteName}
              </th>
              {row.cells.map((cell, category) => (
                <td key={category} className="px-3 py-2">
                  {cell.length > 0 ? <ul className="space-y-1">{resolveGroups(cell, byId).map(groupLink)}</ul> : <span className="text-slate-400">–</span>}
                </td>
              ))}
              <td className="px-3 py-2">
                {row.undecided.length > 0 ? (
                  <ul className="space-y-1 text-slate-700">{resolveGroups(row.undecided, byId).map(groupLink)}</ul>
                ) : (
                  <span className="text-slate-400">–</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
