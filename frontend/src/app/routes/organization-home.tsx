import { Link } from 'react-router';
import { can, roleLabels } from '@schema/permissions';
import { useOrganizationSummary } from '@frontend/features/organizations/api/get-organization-summary';
import { RoleAccess } from '@frontend/features/organizations/components/role-access';
import { SummaryCounts, SummaryCountsSkeleton } from '@frontend/features/organizations/components/summary-counts';
import { useDashboard } from '@frontend/features/dashboard/api/get-dashboard';
import { useMyOverview } from '@frontend/features/dashboard/api/get-my-overview';
import { CategoryMatrix } from '@frontend/features/dashboard/components/category-matrix';
import { AttentionLists, groupsById, ReviewLists, SamplingProgress } from '@frontend/features/dashboard/components/group-lists';
import { MyOrganizations } from '@frontend/features/dashboard/components/my-organizations';
import { DecisionList } from '@frontend/features/decision-records/components/decision-list';
import { CategoryLegend } from '@frontend/components/category-legend';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { EmptyState, ErrorState, LoadingState } from '@frontend/components/states';
import { useSession } from '../session';
import { useMembership } from '../use-membership';

/**
 * /orgs/:orgId — the organization's overview and dashboard: counts, the site × category matrix of current
 * approved decision records, unacceptable and uncertain groups, review dates due, sampling progress, recent
 * decisions; for someone in several organizations (a consultant), those organizations side by side.
 */
export function Component() {
  const membership = useMembership();
  const summary = useOrganizationSummary(membership.organizationKey);
  const dashboard = useDashboard(membership.organizationKey);
  const me = useSession();
  const several = me.memberships.length > 1;
  const overview = useMyOverview(several);
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

      <DashboardSections organizationId={membership.organizationKey} dashboard={dashboard} />

      {several && overview.data && (
        <section aria-labelledby="my-organizations-title" className="mb-6">
          <h2 id="my-organizations-title" className="mb-2 text-base">
            Your organizations
          </h2>
          <MyOrganizations organizations={overview.data.organizations} />
        </section>
      )}

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

function DashboardSections({ organizationId, dashboard }: { organizationId: string; dashboard: ReturnType<typeof useDashboard> }) {
  if (dashboard.isPending) return <LoadingState label="Loading the dashboard…" className="mb-6" />;
  if (dashboard.isError)
    return <ErrorState title="Could not load the dashboard" error={dashboard.error} onRetry={() => dashboard.refetch()} className="mb-6" />;
  const data = dashboard.data;
  const byId = groupsById(data);
  return (
    <div className="mb-6 space-y-6">
      <section aria-labelledby="matrix-title">
        <h2 id="matrix-title" className="mb-1 text-base">
          Exposure categories by site
        </h2>
        <p className="mb-2 text-sm text-slate-600">
          From each group's current approved decision record. {data.counts.decided} of {data.counts.groups} groups have one
          {data.counts.outOfDate > 0 ? `; ${data.counts.outOfDate} out of date (results changed since approval)` : ''}
          {data.counts.openDrafts > 0 ? `; ${data.counts.openDrafts} open drafts` : ''}.
        </p>
        <CategoryMatrix organizationId={organizationId} matrix={data.matrix} byId={byId} />
      </section>
      <section aria-labelledby="attention-title">
        <h2 id="attention-title" className="mb-2 text-base">
          Groups needing attention
        </h2>
        <AttentionLists organizationId={organizationId} dashboard={data} byId={byId} />
      </section>
      <section aria-labelledby="reviews-title">
        <h2 id="reviews-title" className="mb-2 text-base">
          Review dates
        </h2>
        <ReviewLists organizationId={organizationId} dashboard={data} byId={byId} />
      </section>
      <section aria-labelledby="progress-title">
        <h2 id="progress-title" className="mb-2 text-base">
          Sampling progress
        </h2>
        <SamplingProgress dashboard={data} />
      </section>
      <section aria-labelledby="recent-title">
        <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="recent-title" className="text-base">
            Recent decisions
          </h2>
          <Link to={`/orgs/${encodeURIComponent(organizationId)}/decision-records`} className="text-sm">
            All decision records
          </Link>
        </div>
        {data.recentDecisions.length === 0 ? (
          <EmptyState title="No decision records yet" />
        ) : (
          <DecisionList organizationId={organizationId} records={data.recentDecisions} showGroup caption="Recent decision records" />
        )}
      </section>
    </div>
  );
}
