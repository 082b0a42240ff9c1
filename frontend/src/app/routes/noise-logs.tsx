import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { SelectField } from '@frontend/components/form-field';
import { useExposureGroupChoices } from '@frontend/features/exposure-groups/api/get-exposure-groups';
import { useWorkerChoices } from '@frontend/features/workers/api/get-workers';
import { useNoiseLogs } from '@frontend/features/noise-logs/api/get-noise-logs';
import { NoiseUploadForm } from '@frontend/features/noise-logs/components/upload-form';
import { dose, duration } from '@frontend/features/noise-logs/lib/format-noise';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

/** /orgs/:orgId/noise-logs — noise logs per group and worker; hygienists and admins upload. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const navigate = useNavigate();
  const [search, setSearch] = useSearchParams();
  const groupId = search.get('groupId') ?? '';
  const workerId = search.get('workerId') ?? '';
  const query = new URLSearchParams({ ...(groupId ? { groupId } : {}), ...(workerId ? { workerId } : {}) }).toString();
  const logs = useNoiseLogs(organizationId, query);
  const groups = useExposureGroupChoices(organizationId);
  const workers = useWorkerChoices(organizationId);
  const [uploading, setUploading] = useState(false);
  const noiseGroups = (groups.data?.items ?? [])
    .filter((group) => group.agentKind === 'noise')
    .map((group) => ({ value: String(group.id), label: group.name }));
  const workerChoices = (workers.data?.items ?? []).map((worker) => ({
    value: String(worker.id),
    label: worker.name ? `${worker.code} · ${worker.name}` : worker.code,
  }));
  const setFilter = (key: string, value: string) => {
    const next = new URLSearchParams(search);
    if (value) next.set(key, value);
    else next.delete(key);
    setSearch(next, { replace: true });
  };

  return (
    <>
      <DocumentTitle title={`Noise logs · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Noise logs"
        description="Dosimeter time histories: wear check, knocks, masked spans and the dose per criteria set, before a log becomes a worker's shift result."
        actions={
          canEdit && (
            <Button variant="primary" onClick={() => setUploading(true)}>
              Upload a noise log
            </Button>
          )
        }
      />
      <div className="mb-3 grid max-w-2xl gap-3 sm:grid-cols-2">
        <SelectField
          label="Exposure group"
          value={groupId}
          onChange={(event) => setFilter('groupId', event.target.value)}
          options={[{ value: '', label: 'All noise groups' }, ...noiseGroups]}
        />
        <SelectField
          label="Worker"
          value={workerId}
          onChange={(event) => setFilter('workerId', event.target.value)}
          options={[{ value: '', label: 'All workers' }, ...workerChoices]}
        />
      </div>
      <QueryState query={logs} loading="Loading noise logs…" errorTitle="The noise logs could not be loaded">
        {(data) =>
          data.items.length === 0 ? (
            <EmptyState title="No noise logs here yet">
              {canEdit ? 'Upload a dosimeter log to review it.' : 'A hygienist uploads dosimeter logs here.'}
            </EmptyState>
          ) : (
            <div className="overflow-x-auto rounded-md border border-slate-200 bg-white">
              <table className="min-w-full text-sm" aria-label="Noise logs">
                <thead>
                  <tr className="border-b border-slate-300 text-left text-slate-600">
                    <th scope="col" className="px-3 py-2 font-medium">
                      Shift
                    </th>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Worker
                    </th>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Group
                    </th>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Measured
                    </th>
                    <th scope="col" className="px-3 py-2 text-right font-medium">
                      Dose as logged (NIOSH REL)
                    </th>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Wear check
                    </th>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Status
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {data.items.map((log) => (
                    <tr key={log.id} className="border-b border-slate-100">
                      <td className="px-3 py-1.5">
                        <Link className="font-medium text-primary-700 hover:underline" to={`/orgs/${organizationId}/noise-logs/${log.id}`}>
                          {log.shiftDate}
                        </Link>
                        <span className="block text-xs text-slate-500">{log.fileName}</span>
                      </td>
                      <td className="px-3 py-1.5">{log.workerCode}</td>
                      <td className="px-3 py-1.5">{log.exposureGroupName}</td>
                      <td className="px-3 py-1.5">
                        {duration(log.runSeconds)} at {log.intervalSeconds} s
                      </td>
                      <td className="px-3 py-1.5 text-right tabular-nums">{dose(log.summary.asLogged.nioshRel.dose)}</td>
                      <td className="px-3 py-1.5">
                        {log.summary.stillStretchCount === null
                          ? 'Not available'
                          : `${log.summary.stillStretchCount} still · ${log.summary.knockCount ?? 0} knocks`}
                      </td>
                      <td className="px-3 py-1.5">
                        <StatusBadge tone={log.status === 'accepted' ? 'positive' : log.status === 'reviewed' ? 'neutral' : 'muted'}>
                          {log.status === 'accepted' ? 'In the group' : log.status === 'reviewed' ? 'Reviewed' : 'Uploaded'}
                        </StatusBadge>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )
        }
      </QueryState>
      <p className="mt-3 text-sm text-slate-700">
        Action level (hearing conservation trigger): 85 dBA TWA = 50 % dose on the OSHA hearing-conservation set. Each log's page shows it for the reviewed
        figures.
      </p>
      <div className="mt-4">
        <CautionNote />
      </div>
      <Dialog open={uploading} onClose={() => setUploading(false)} title="Upload a noise log" wide>
        <NoiseUploadForm
          organizationId={organizationId}
          groups={noiseGroups}
          workers={workerChoices}
          onUploaded={(log) => {
            setUploading(false);
            void navigate(`/orgs/${organizationId}/noise-logs/${log.id}`);
          }}
        />
      </Dialog>
    </>
  );
}
