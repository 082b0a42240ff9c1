import { useAgentChoices } from '@frontend/features/agents/api/get-agents';
import { useExposureGroups } from '@frontend/features/exposure-groups/api/get-exposure-groups';
import { GroupsTable } from '@frontend/features/exposure-groups/components/groups-table';
import { useSiteChoices } from '@frontend/features/sites/api/get-sites';
import { ButtonLink } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { FilterSelect, ListToolbar } from '@frontend/components/list-filters';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/exposure-groups — every group, with site and agent filters. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const params = useListParams({
    defaultSort: 'name',
    sortFields: ['name', 'siteName', 'agentName', 'processArea', 'shiftHours', 'resultsChangedAt', 'createdAt', 'updatedAt'],
  });
  const groups = useExposureGroups(organizationId, listQueryString(params, ['archived', 'siteId', 'agentId']));
  const sites = useSiteChoices(organizationId);
  const agents = useAgentChoices(organizationId);

  return (
    <>
      <DocumentTitle title={`Exposure groups · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Exposure groups"
        description="Workers with similar exposure to one agent, each judged against its limit. Open a group for its members, sampling plan and results."
        actions={
          canEdit && (
            <ButtonLink to="new" variant="primary">
              New exposure group
            </ButtonLink>
          )
        }
      />
      <div className="space-y-3">
        <ListToolbar params={params} label="Filter exposure groups" searchLabel="Search groups, tasks, job titles">
          <FilterSelect
            params={params}
            name="siteId"
            label="Site"
            options={[{ value: '', label: 'Every site' }, ...(sites.data?.items ?? []).map((site) => ({ value: String(site.id), label: site.name }))]}
          />
          <FilterSelect
            params={params}
            name="agentId"
            label="Agent"
            className="w-56"
            options={[{ value: '', label: 'Every agent' }, ...(agents.data?.items ?? []).map((agent) => ({ value: String(agent.id), label: agent.name }))]}
          />
        </ListToolbar>
        <QueryState query={groups} loading="Loading exposure groups…" errorTitle="Could not load the exposure groups">
          {(page) => <GroupsTable organizationId={organizationId} page={page} params={params} busy={groups.isPlaceholderData} canEdit={canEdit} />}
        </QueryState>
      </div>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
