import { decisionRecordSortFields, decisionStatuses, judgements } from '@schema/decision-records';
import { useDecisionRegister } from '@frontend/features/decision-records/api/get-decision-register';
import { decisionStatusLabel, judgementWord } from '@frontend/features/decision-records/components/decision-badges';
import { decisionRegisterFilters, DecisionRegisterTable } from '@frontend/features/decision-records/components/decision-register-table';
import { useSiteChoices } from '@frontend/features/sites/api/get-sites';
import { exposureCategories } from '@frontend/components/category-badge';
import { DocumentTitle } from '@frontend/components/document-title';
import { CheckboxField, TextField } from '@frontend/components/form-field';
import { FilterSelect, ListToolbar } from '@frontend/components/list-filters';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useMembership } from '../use-membership';

const statusOptions = [{ value: '', label: 'Every status' }, ...decisionStatuses.map((status) => ({ value: status, label: decisionStatusLabel(status) }))];
const categoryOptions = [
  { value: '', label: 'Every category' },
  ...exposureCategories.map((entry) => ({ value: String(entry.category), label: `${entry.category} · ${entry.word}` })),
];
const judgementOptions = [{ value: '', label: 'Every judgement' }, ...judgements.map((judgement) => ({ value: judgement, label: judgementWord(judgement) }))];

/** /orgs/:orgId/decision-records — every decision record of the organization, searched, filtered and paged on the server. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const params = useListParams({ defaultSort: '-updatedAt', sortFields: decisionRecordSortFields });
  const records = useDecisionRegister(organizationId, listQueryString(params, decisionRegisterFilters));
  const sites = useSiteChoices(organizationId);

  return (
    <>
      <DocumentTitle title={`Decision records · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Decision records"
        description="Every decision record of the organization: drafts waiting for review, returned drafts, approved and superseded records. An approved record is out of date when its group’s results changed after approval."
      />
      <div className="space-y-3">
        <ListToolbar params={params} label="Filter decision records" searchLabel="Search exposure groups and sites" archivable={false}>
          <FilterSelect params={params} name="status" label="Status" options={statusOptions} />
          <FilterSelect params={params} name="category" label="Exposure category" options={categoryOptions} />
          <FilterSelect params={params} name="judgement" label="Judgement" options={judgementOptions} className="w-40" />
          <FilterSelect
            params={params}
            name="siteId"
            label="Site"
            options={[{ value: '', label: 'Every site' }, ...(sites.data?.items ?? []).map((site) => ({ value: String(site.id), label: site.name }))]}
          />
          <TextField
            type="date"
            label="Review due by"
            title="Approved records whose review date is on or before this day"
            className="w-44"
            value={params.filter('reviewBy') ?? ''}
            onChange={(event) => params.update({ reviewBy: event.target.value || undefined })}
          />
          <CheckboxField
            label="Out of date only"
            className="self-end pb-2"
            checked={params.filter('outOfDate') === 'true'}
            onChange={(event) => params.update({ outOfDate: event.target.checked ? 'true' : undefined })}
          />
        </ListToolbar>
        <QueryState query={records} loading="Loading decision records…" errorTitle="Could not load the decision records">
          {(page) => <DecisionRegisterTable organizationId={organizationId} page={page} params={params} busy={records.isPlaceholderData} />}
        </QueryState>
      </div>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
