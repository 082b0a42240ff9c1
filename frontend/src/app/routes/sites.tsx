import { useState } from 'react';
import { useSites, type SiteView } from '@frontend/features/sites/api/get-sites';
import { SiteForm } from '@frontend/features/sites/components/site-form';
import { SitesTable } from '@frontend/features/sites/components/sites-table';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { DocumentTitle } from '@frontend/components/document-title';
import { ListToolbar } from '@frontend/components/list-filters';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/sites — every role reads; hygienists and admins add, edit and archive. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const params = useListParams({ defaultSort: 'name', sortFields: ['name', 'createdAt', 'updatedAt'] });
  const sites = useSites(organizationId, listQueryString(params, ['archived']));
  const [editing, setEditing] = useState<SiteView | 'new' | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  return (
    <>
      <DocumentTitle title={`Sites · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Sites"
        description="The places where people work. Each exposure group belongs to one site."
        actions={
          canEdit && (
            <Button variant="primary" onClick={() => setEditing('new')}>
              Add site
            </Button>
          )
        }
      />
      <div className="space-y-3">
        <ListToolbar params={params} label="Filter sites" searchLabel="Search name or description" />
        {saved && <Notice tone="success">{saved}</Notice>}
        <QueryState query={sites} loading="Loading sites…" errorTitle="Could not load the sites">
          {(page) => (
            <SitesTable
              organizationId={organizationId}
              page={page}
              params={params}
              busy={sites.isPlaceholderData}
              canEdit={canEdit}
              onEdit={setEditing}
              onOutcome={setSaved}
            />
          )}
        </QueryState>
      </div>
      <Dialog open={editing !== null} onClose={() => setEditing(null)} title={editing === 'new' ? 'Add a site' : 'Edit site'}>
        <SiteForm
          organizationId={organizationId}
          site={editing === 'new' || editing === null ? undefined : editing}
          onCancel={() => setEditing(null)}
          onSaved={(site) => {
            setSaved(`Site “${site.name}” ${editing === 'new' ? 'added' : 'saved'}.`);
            setEditing(null);
          }}
        />
      </Dialog>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
