import { useState } from 'react';
import { can } from '@schema/permissions';
import { useExposureGroupChoices } from '@frontend/features/exposure-groups/api/get-exposure-groups';
import { useWorkers, type WorkerListItem } from '@frontend/features/workers/api/get-workers';
import { WorkerForm } from '@frontend/features/workers/components/worker-form';
import { WorkersTable } from '@frontend/features/workers/components/workers-table';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { DocumentTitle } from '@frontend/components/document-title';
import { FilterSelect, ListToolbar } from '@frontend/components/list-filters';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/workers — codes for everyone, names only for roles that may see them. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const canSeeNames = can(membership.role, 'workerNames:read');
  const params = useListParams({
    defaultSort: 'code',
    sortFields: canSeeNames ? ['code', 'name', 'jobTitle', 'createdAt', 'updatedAt'] : ['code', 'jobTitle', 'createdAt', 'updatedAt'],
  });
  const workers = useWorkers(organizationId, listQueryString(params, ['archived', 'groupId']));
  const groups = useExposureGroupChoices(organizationId);
  const [editing, setEditing] = useState<WorkerListItem | 'new' | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  return (
    <>
      <DocumentTitle title={`Workers · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Workers"
        description={
          canSeeNames
            ? 'Everyone whose exposure is measured, by the code results refer to. Names are optional and never shown to consultants.'
            : 'Everyone whose exposure is measured, by the code results refer to. Names are not shared with your role.'
        }
        actions={
          canEdit && (
            <Button variant="primary" onClick={() => setEditing('new')}>
              Add worker
            </Button>
          )
        }
      />
      <div className="space-y-3">
        <ListToolbar params={params} label="Filter workers" searchLabel={canSeeNames ? 'Search code, name or job title' : 'Search code or job title'}>
          <FilterSelect
            params={params}
            name="groupId"
            label="Member of (today)"
            className="w-64"
            options={[
              { value: '', label: 'Any group or none' },
              ...(groups.data?.items ?? []).map((group) => ({ value: String(group.id), label: group.name })),
            ]}
          />
        </ListToolbar>
        {saved && <Notice tone="success">{saved}</Notice>}
        <QueryState query={workers} loading="Loading workers…" errorTitle="Could not load the workers">
          {(page) => (
            <WorkersTable
              organizationId={organizationId}
              page={page}
              params={params}
              busy={workers.isPlaceholderData}
              canEdit={canEdit}
              canSeeNames={canSeeNames}
              onEdit={setEditing}
              onOutcome={setSaved}
            />
          )}
        </QueryState>
      </div>
      <Dialog open={editing !== null} onClose={() => setEditing(null)} title={editing === 'new' ? 'Add a worker' : 'Edit worker'}>
        <WorkerForm
          organizationId={organizationId}
          canSeeNames={canSeeNames}
          worker={editing === 'new' || editing === null ? undefined : editing}
          onCancel={() => setEditing(null)}
          onSaved={(worker) => {
            setSaved(`Worker ${worker.code} ${editing === 'new' ? 'added' : 'saved'}.`);
            setEditing(null);
          }}
        />
      </Dialog>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
