import { Link } from 'react-router';
import { can, roleLabels } from '@schema/permissions';
import { useOrganizationSummary } from '@frontend/features/organizations/api/get-organization-summary';
import { RoleAccess } from '@frontend/features/organizations/components/role-access';
import { SummaryCounts, SummaryCountsSkeleton } from '@frontend/features/organizations/components/summary-counts';
import { CategoryLegend } from '@frontend/components/category-legend';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { EmptyState, ErrorState } from '@frontend/components/states';
import { useMembership } from '../use-membership';

/** /orgs/:orgId — the organization's overview. */
export function Component() {
  const membership = useMembership();
  const summary = useOrganizationSummary(membership.organizationKey);
  const name = summary.data?.organization.name ?? membership.organizationName;
  const counts = summary.data?.counts;
  const nothingSetUp = counts && counts.sites + counts.exposureGroups + counts.workers + counts.agents === 0;

  return (
    <>
      <DocumentTitle title={name} />
      <PageHeader
        eyebrow="Overview"
        title={name}
        description={
          <>
            You work here as <strong className="font-medium text-slate-800">{roleLabels[membership.role]}</strong>.
          </>
        }
        actions={
          can(membership.role, 'users:manage') ? (
            <Link to="users" className="text-sm">
              Manage people
            </Link>
          ) : undefined
        }
      />

      <section aria-labelledby="counts-title" aria-busy={summary.isPending} className="mb-6">
        <h2 id="counts-title" className="sr-only">
          Records in this organization
        </h2>
        {summary.isPending && (
          <>
            <p role="status" className="sr-only">
              Loading the organization's figures…
            </p>
            <SummaryCountsSkeleton />
          </>
        )}
        {summary.isError && <ErrorState title="Could not load the organization's figures" error={summary.error} onRetry={() => summary.refetch()} />}
        {counts && <SummaryCounts counts={counts} />}
        {nothingSetUp && (
          <EmptyState title="Nothing set up yet" className="mt-3">
            Sites, exposure groups, workers and agents appear here once a hygienist adds them.
          </EmptyState>
        )}
      </section>

      <div className="grid gap-4 lg:grid-cols-[1fr_20rem]">
        <div className="space-y-4">
          <CautionNote />
          <RoleAccess role={membership.role} />
        </div>
        <CategoryLegend />
      </div>
    </>
  );
}
