import { lazy, Suspense, useState } from 'react';
import { Link, useParams } from 'react-router';
import { Button } from '@frontend/components/button';
import { CautionNote } from '@frontend/components/caution-note';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { LoadingState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import { useAcceptNoiseLog } from '@frontend/features/noise-logs/api/accept-noise-log';
import { useChangeNoiseMask } from '@frontend/features/noise-logs/api/change-noise-mask';
import { useNoiseChannels, useNoiseLog } from '@frontend/features/noise-logs/api/get-noise-log';
import type { NoiseLogDetail } from '@frontend/features/noise-logs/api/types';
import { MaskDialog, type MaskDialogState } from '@frontend/features/noise-logs/components/mask-dialog';
import { NoiseFiguresTable } from '@frontend/features/noise-logs/components/noise-figures-table';
import { NoiseMasksTable } from '@frontend/features/noise-logs/components/noise-masks-table';
import { clockTime, decibels, duration } from '@frontend/features/noise-logs/lib/format-noise';
import { isApiError } from '@frontend/lib/api-client';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

// Plotly (~1.4 MB gzip) loads only on this page.
const NoiseChart = lazy(() => import('@frontend/features/noise-logs/components/noise-chart'));

/** /orgs/:orgId/noise-logs/:logId — review a noise log: chart, masks, figures, accept into the group. */
export function Component() {
  const membership = useMembership();
  const { logId = '' } = useParams();
  const log = useNoiseLog(membership.organizationKey, logId);
  return (
    <QueryState query={log} loading="Loading the noise log…" errorTitle="The noise log could not be loaded">
      {(data) => <Review log={data} organizationId={membership.organizationKey} organizationName={membership.organizationName} />}
    </QueryState>
  );
}

function Review({ log, organizationId, organizationName }: { log: NoiseLogDetail; organizationId: string; organizationName: string }) {
  const canEdit = useCanEdit();
  const logId = String(log.id);
  const [chartWindow, setChartWindow] = useState<{ fromS?: number; toS?: number }>({});
  const channels = useNoiseChannels(organizationId, logId, chartWindow);
  const [mode, setMode] = useState<'zoom' | 'select'>('zoom');
  const [dialog, setDialog] = useState<MaskDialogState | null>(null);
  const changeMask = useChangeNoiseMask(organizationId, logId);
  const accept = useAcceptNoiseLog(organizationId, logId);
  const criteriaSet = log.group.noiseCriteriaSet && log.group.noiseCriteriaSet !== 'iso' ? log.group.noiseCriteriaSet : 'nioshRel';
  const longest = log.longestStillStretchSeconds;

  return (
    <>
      <DocumentTitle title={`Noise log ${log.fileName} · ${organizationName}`} />
      <PageHeader
        eyebrow={
          <Link to={`/orgs/${organizationId}/noise-logs`} className="hover:underline">
            Noise logs
          </Link>
        }
        title={`${log.workerCode} · ${log.shiftDate}`}
        description={
          <>
            {log.exposureGroupName} · {log.fileName} · {log.instrument || 'instrument not given'} · {log.intervalCount.toLocaleString('en')} intervals of{' '}
            {log.intervalSeconds} s ({duration(log.figures.runSeconds)} measured)
          </>
        }
        actions={
          <StatusBadge tone={log.status === 'accepted' ? 'positive' : log.status === 'reviewed' ? 'neutral' : 'muted'}>
            {log.status === 'accepted' ? 'In the group' : log.status === 'reviewed' ? 'Reviewed' : 'Uploaded'}
          </StatusBadge>
        }
      />
      <div className="space-y-6">
        {log.stillStretchNotice && (
          <Notice tone="warning" title="The meter was still for a long time">
            The wear check found {log.stillStretches?.length === 1 ? 'a still stretch' : `${log.stillStretches?.length} still stretches`} of at least{' '}
            {log.settings.stillMinutes} minutes
            {longest !== null && <> (longest {duration(longest)})</>}:{' '}
            {(log.stillStretches ?? []).map((stretch) => `${clockTime(stretch.startS)}–${clockTime(stretch.endS)}`).join(', ')}. The meter may have been put
            down rather than worn. If so, mask the span with a reason before accepting the log.
          </Notice>
        )}
        {!log.wearCheckAvailable && (
          <Notice tone="info" title="No wear check">
            This log has neither a motion column nor acceleration, so still stretches and knocks could not be looked for.
          </Notice>
        )}
        {log.calibration.exceedsLimit && (
          <Notice tone="warning" title="Calibration drift over the limit">
            The field calibration check drifted by {decibels(log.calibration.driftDb)} (before {decibels(log.calibration.beforeDb)}, after{' '}
            {decibels(log.calibration.afterDb)}), more than the {log.calibration.limitDb} dB limit set for the organization.
          </Notice>
        )}

        <section aria-labelledby="chart-title" className="rounded-md border border-slate-200 bg-white p-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="chart-title" className="text-base font-semibold">
              Time history
            </h2>
            <div className="flex items-center gap-2" role="group" aria-label="Chart mode">
              <Button size="sm" variant={mode === 'zoom' ? 'primary' : 'secondary'} aria-pressed={mode === 'zoom'} onClick={() => setMode('zoom')}>
                Zoom and pan
              </Button>
              {canEdit && (
                <Button size="sm" variant={mode === 'select' ? 'primary' : 'secondary'} aria-pressed={mode === 'select'} onClick={() => setMode('select')}>
                  Select a span to mask
                </Button>
              )}
              {canEdit && (
                <Button
                  size="sm"
                  onClick={() =>
                    setDialog({ kind: 'add', startS: chartWindow.fromS ?? log.startS, endS: Math.min(chartWindow.toS ?? log.startS + 60, log.endS) })
                  }
                >
                  Mask by times…
                </Button>
              )}
            </div>
          </div>
          <figure className="mt-1" aria-labelledby="chart-caption">
            <figcaption id="chart-caption" className="text-xs text-slate-600">
              Level line: LAeq per interval{channels.data?.downsampled ? ' (lowest and highest per bucket while zoomed out; zoom in for every interval)' : ''}.
              Points: LCpeak. Hatched bands: masked spans. Lower lane: still stretches (bars) and knocks (×). Dashed line: 85 dBA. The knocks, still stretches
              and masks are also listed below the chart.
            </figcaption>
            <div className="mt-2 min-h-[420px]">
              {channels.data ? (
                <Suspense fallback={<LoadingState label="Loading the chart…" />}>
                  <NoiseChart
                    log={log}
                    channels={channels.data}
                    mode={mode}
                    onSelectSpan={(span) => setDialog({ kind: 'add', ...span })}
                    onWindowChange={setChartWindow}
                  />
                </Suspense>
              ) : (
                <LoadingState label="Loading the levels…" />
              )}
            </div>
          </figure>
          <div className="mt-2 grid gap-1 text-sm sm:grid-cols-2">
            <p>
              Knocks:{' '}
              {log.knocks === null
                ? 'not looked for (no peak acceleration column)'
                : log.knocks.length === 0
                  ? 'none'
                  : log.knocks.map((knock) => `${clockTime(knock.tS)} (${Math.round(knock.peakMg)} mg)`).join(', ')}
            </p>
            <p>
              Still stretches:{' '}
              {log.stillStretches === null
                ? 'not checked'
                : log.stillStretches.length === 0
                  ? 'none'
                  : log.stillStretches.map((s) => `${clockTime(s.startS)}–${clockTime(s.endS)}`).join(', ')}
            </p>
          </div>
        </section>

        <section aria-labelledby="figures-title" className="space-y-2">
          <h2 id="figures-title" className="text-base font-semibold">
            As-logged and reviewed figures
          </h2>
          <p className="text-sm text-slate-700">
            Masked: {duration(log.figures.maskedSeconds)} of {duration(log.figures.runSeconds)}. Highest C-weighted peak:{' '}
            {decibels(log.figures.maxLcPeakDb, 'dBC')}
            {log.peakOver140Db ? ' — over 140 dB peak' : ''}. Calibration drift:{' '}
            {log.calibration.driftDb === null
              ? 'not recorded'
              : `${decibels(log.calibration.driftDb)} (limit ${log.calibration.limitDb} dB, ${log.calibration.exceedsLimit ? 'over the limit' : 'within'})`}
            .
          </p>
          <NoiseFiguresTable log={log} />
        </section>

        <section aria-labelledby="masks-title" className="space-y-2">
          <h2 id="masks-title" className="text-base font-semibold">
            Masked spans
          </h2>
          {changeMask.error && <Notice tone="error">{isApiError(changeMask.error) ? changeMask.error.message : 'The mask could not be changed.'}</Notice>}
          <NoiseMasksTable
            masks={log.masks}
            criteriaSet={criteriaSet}
            canEdit={canEdit}
            onEdit={(mask) => setDialog({ kind: 'change', maskId: mask.id, startS: mask.startS, endS: mask.endS })}
            onRemove={(mask) => setDialog({ kind: 'remove', maskId: mask.id, startS: mask.startS, endS: mask.endS })}
          />
        </section>

        <section aria-labelledby="group-title" className="space-y-2 rounded-md border border-slate-200 bg-white p-3">
          <h2 id="group-title" className="text-base font-semibold">
            Into the group
          </h2>
          {log.status === 'accepted' ? (
            <p className="text-sm" data-testid="accepted-note">
              In “{log.group.name}” as shift result {log.shiftResultId}. A mask changed now updates that result and marks decision drafts of the group out of
              date.
            </p>
          ) : (
            <>
              <p className="text-sm">
                Accepting stores the reviewed {log.group.oelUnit === 'dose-percent' ? `dose (${criteriaSet})` : 'level'} as {log.workerCode}'s shift result of{' '}
                {log.shiftDate} in “{log.group.name}”, with the TWA and LEX,8h in its details.
              </p>
              {accept.error && <Notice tone="error">{isApiError(accept.error) ? accept.error.message : 'The log could not be accepted.'}</Notice>}
              {canEdit && (
                <Button variant="primary" pending={accept.isPending} onClick={() => accept.mutate()}>
                  Accept into the group
                </Button>
              )}
            </>
          )}
        </section>
        <CautionNote />
      </div>
      <MaskDialog
        state={dialog}
        onClose={() => setDialog(null)}
        onSave={(values) => {
          if (!dialog) return Promise.resolve();
          if (dialog.kind === 'add') return changeMask.mutateAsync({ kind: 'add', ...values });
          if (dialog.kind === 'change') return changeMask.mutateAsync({ kind: 'change', maskId: dialog.maskId, ...values });
          return changeMask.mutateAsync({ kind: 'remove', maskId: dialog.maskId, reason: values.reason });
        }}
      />
    </>
  );
}
