import { useState } from 'react';
import { can } from '@schema/permissions';
import { useHearingProtectors, useProtectorSettings } from '@frontend/features/hearing-protectors/api/hearing-protectors';
import { ProtectorForm } from '@frontend/features/hearing-protectors/components/protector-form';
import { ProtectorSettingsForm } from '@frontend/features/hearing-protectors/components/protector-settings-form';
import { ProtectorsTable } from '@frontend/features/hearing-protectors/components/protectors-table';
import { Button } from '@frontend/components/button';
import { CautionNote } from '@frontend/components/caution-note';
import { Dialog } from '@frontend/components/dialog';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/hearing-protectors — the organization's protector list and the verdict thresholds. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const [showArchived, setShowArchived] = useState(false);
  const protectors = useHearingProtectors(organizationId, showArchived ? 'all' : 'false');
  const settings = useProtectorSettings(organizationId);
  const [adding, setAdding] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);

  return (
    <>
      <DocumentTitle title={`Hearing protectors · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Hearing protectors"
        description="The protectors your people wear, with the ratings from their data sheets. A noise group’s page shows the level at the ear under each one it uses."
        actions={
          canEdit && (
            <Button variant="primary" onClick={() => setAdding(true)}>
              Add protector
            </Button>
          )
        }
      />
      <div className="space-y-8">
        {saved && <Notice tone="success">{saved}</Notice>}
        <section aria-labelledby="protector-list-title" className="space-y-3">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <h2 id="protector-list-title" className="text-base">
              Protector list
            </h2>
            <label className="inline-flex items-center gap-1 text-sm">
              <input type="checkbox" checked={showArchived} onChange={(event) => setShowArchived(event.target.checked)} /> Show archived
            </label>
          </div>
          <QueryState query={protectors} loading="Loading the protectors…" errorTitle="Could not load the protectors">
            {(list) => <ProtectorsTable organizationId={organizationId} protectors={list} canEdit={canEdit} onOutcome={setSaved} />}
          </QueryState>
        </section>
        <section aria-labelledby="protector-settings-title" className="space-y-3">
          <h2 id="protector-settings-title" className="text-base">
            Verdict thresholds
          </h2>
          <p className="text-sm text-slate-600">
            The level at the ear is judged in the bands of EN 458 around the action level: above it, not enough; just below, acceptable; 5–10 dB below, good;
            10–15 dB below, acceptable; further below, over-protection (warning signals and speech may go unheard).
          </p>
          <QueryState query={settings} loading="Loading the thresholds…" errorTitle="Could not load the thresholds">
            {(values) => (
              <ProtectorSettingsForm
                key={JSON.stringify(values)}
                organizationId={organizationId}
                values={values}
                canManage={can(membership.role, 'settings:manage')}
              />
            )}
          </QueryState>
        </section>
        <CautionNote />
      </div>
      <Dialog open={adding} onClose={() => setAdding(false)} title="Add a hearing protector">
        <ProtectorForm
          organizationId={organizationId}
          onCancel={() => setAdding(false)}
          onSaved={(protector) => {
            setSaved(`Protector “${protector.name}” added.`);
            setAdding(false);
          }}
        />
      </Dialog>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
