import { Link } from 'react-router';
import type { OverviewOrganization } from '@schema/dashboard';
import { roleLabels } from '@schema/permissions';
import { CategoryBadge, exposureCategories } from '@frontend/components/category-badge';

/** A person's organizations side by side (the consultant's view): groups per category, unacceptable groups, reviews due. */
export function MyOrganizations({ organizations }: { organizations: OverviewOrganization[] }) {
  return (
    <div className="overflow-x-auto rounded-md border border-slate-200 bg-white">
      <table className="w-full text-sm">
        <caption className="sr-only">Your organizations</caption>
        <thead className="bg-slate-50 text-left text-xs text-slate-600">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Organization
            </th>
            {exposureCategories.map((entry) => (
              <th key={entry.category} scope="col" className="px-3 py-2 font-medium whitespace-nowrap">
                <CategoryBadge category={entry.category} />
              </th>
            ))}
            <th scope="col" className="px-3 py-2 font-medium">
              Unacceptable
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Reviews overdue / due in 90 days
            </th>
          </tr>
        </thead>
        <tbody>
          {organizations.map((entry) => (
            <tr key={entry.organization.id} className="border-t border-slate-100">
              <th scope="row" className="px-3 py-2 text-left font-medium">
                <Link to={`/orgs/${entry.organization.id}`}>{entry.organization.name}</Link>
                <div className="text-xs font-normal text-slate-500">{roleLabels[entry.role]}</div>
              </th>
              {entry.categories.map((count, category) => (
                <td key={category} className="px-3 py-2 tabular-nums">
                  {count}
                </td>
              ))}
              <td className="px-3 py-2">{entry.unacceptable.length === 0 ? 'none' : entry.unacceptable.map((group) => group.name).join(', ')}</td>
              <td className="px-3 py-2 tabular-nums">
                {entry.reviewsOverdue} / {entry.reviewsWithin90}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
