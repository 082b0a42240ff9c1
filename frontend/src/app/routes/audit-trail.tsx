import type { LoaderFunctionArgs } from 'react-router';
import { ButtonLink } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { SelectField, TextField } from '@frontend/components/form-field';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { auditCsvUrl, auditQueryString, useAuditEvents, useAuditFilterOptions, type AuditFilters } from '@frontend/features/audit-trail/api/get-audit-events';
import { AuditTable } from '@frontend/features/audit-trail/components/audit-table';
import { useListParams } from '@frontend/lib/list-params';
import { requirePermission } from '../session';
import { useMembership } from '../use-membership';

/** Admins and consultants only (audit:read); other roles get the 403 page. */
export async function loader(args: LoaderFunctionArgs) {
  return requirePermission(args, 'audit:read');
}

/**
 * /orgs/:orgId/audit — who changed what, when and why (admins and consultants, `audit:read`).
 * Filters live in the address like every list; "Export CSV" downloads the same filtered events.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  // The trail is always newest first: no sort choice, only paging.
  const params = useListParams({ defaultSort: '-at', sortFields: ['at'] });
  const filters: AuditFilters = {
    person: params.filter('person'),
    entityType: params.filter('entityType'),
    from: params.filter('from'),
    to: params.filter('to'),
  };
  const events = useAuditEvents(organizationId, auditQueryString(filters, { page: params.page, pageSize: params.pageSize }));
  const options = useAuditFilterOptions(organizationId);

  const personOptions = [{ value: '', label: 'Everyone' }, ...(options.data?.people ?? []).map((person) => ({ value: String(person.id), label: person.name }))];
  const entityOptions = [
    { value: '', label: 'All records' },
    ...(options.data?.entityTypes ?? []).map((type) => ({ value: type, label: type.replaceAll('_', ' ') })),
  ];

  return (
    <>
      <DocumentTitle title={`Audit trail · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Audit trail"
        description="Every change, with who made it, when, what it changed and the reason given. Events are never edited or removed."
        actions={
          <ButtonLink to={auditCsvUrl(organizationId, filters)} reloadDocument download>
            Export CSV
          </ButtonLink>
        }
      />
      <div className="space-y-3">
        <div className="flex flex-wrap items-start gap-3" role="search" aria-label="Filter the audit trail">
          {/* Remounted once the choices arrive, so a filter from the address shows as selected. */}
          <SelectField
            key={`person-${options.data ? 'ready' : 'loading'}`}
            label="Person"
            className="w-52"
            options={personOptions}
            value={filters.person ?? ''}
            onChange={(event) => params.update({ person: event.target.value })}
          />
          <SelectField
            key={`entity-${options.data ? 'ready' : 'loading'}`}
            label="Record type"
            className="w-52"
            options={entityOptions}
            value={filters.entityType ?? ''}
            onChange={(event) => params.update({ entityType: event.target.value })}
          />
          <TextField label="From" type="date" className="w-44" value={filters.from ?? ''} onChange={(event) => params.update({ from: event.target.value })} />
          <TextField label="To" type="date" className="w-44" value={filters.to ?? ''} onChange={(event) => params.update({ to: event.target.value })} />
        </div>
        <QueryState query={events} loading="Loading the audit trail…" errorTitle="The audit trail could not be loaded">
          {(page) => <AuditTable page={page} params={params} busy={events.isPlaceholderData} />}
        </QueryState>
      </div>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
