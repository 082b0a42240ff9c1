import { useState } from 'react';
import { exposureUnitLabels, type ExposureUnit } from '@schema/agents';
import { workerLetterCancel, type GroupWorkerLetters, type WorkerLetterView } from '@schema/worker-letters';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { TextAreaField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { ReasonDialog } from '@frontend/components/reason-dialog';
import { EmptyState } from '@frontend/components/states';
import { StatusBadge } from '@frontend/components/status-badge';
import { isApiError } from '@frontend/lib/api-client';
import { formatCalendarDate, formatDateTime, formatNumber, todayCalendarDate } from '@frontend/lib/format';
import { useCancelWorkerLetter } from '../api/cancel-worker-letter';
import { useDraftWorkerLetters } from '../api/draft-worker-letters';
import { workerLetterPdfUrl } from '../api/get-worker-letters';
import { useHandOverWorkerLetter } from '../api/hand-over-worker-letter';
import { useSendWorkerLetter } from '../api/send-worker-letter';

/** "86.2 dB(A)", "73 % dose", "0.031 mg/m³". */
function valueWithUnit(value: number, unit: ExposureUnit): string {
  return unit === 'dBA' ? `${value.toFixed(1)} dB(A)` : `${formatNumber(value)} ${exposureUnitLabels[unit]}`;
}

function workerText(worker: { code: string; name: string | null }): string {
  return worker.name ? `${worker.name} (${worker.code})` : worker.code;
}

function LetterStatus({ letter }: { letter: WorkerLetterView }) {
  if (letter.status === 'cancelled') return <StatusBadge tone="void">Cancelled</StatusBadge>;
  if (letter.status === 'drafted') return <StatusBadge tone="warning">Drafted</StatusBadge>;
  return <StatusBadge tone="positive">{letter.delivery === 'hand' ? 'Handed over' : 'Sent by e-mail'}</StatusBadge>;
}

function LetterDates({ letter }: { letter: WorkerLetterView }) {
  return (
    <ul className="space-y-0.5 text-xs text-slate-700">
      <li>
        Drafted {formatDateTime(letter.draftedAt)} by {letter.draftedBy.name}
      </li>
      {letter.delivery === 'email' && (
        <li>
          Sent {formatDateTime(letter.sentAt)} to {letter.recipientAddress} by {letter.sentBy?.name}
        </li>
      )}
      {letter.delivery === 'hand' && (
        <li>
          Handed over {formatCalendarDate(letter.handedOverOn)} (recorded by {letter.sentBy?.name})
        </li>
      )}
      {letter.status === 'cancelled' && (
        <li>
          Cancelled {formatDateTime(letter.cancelledAt)} by {letter.cancelledBy?.name}: {letter.cancelReason}
        </li>
      )}
    </ul>
  );
}

/** Record the day the printed letter was handed to the worker. */
function HandOverDialog({
  letter,
  onClose,
  onConfirm,
}: {
  letter: WorkerLetterView | null;
  onClose: () => void;
  onConfirm: (date: string) => Promise<unknown>;
}) {
  const [date, setDate] = useState(todayCalendarDate());
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  return (
    <Dialog
      open={letter !== null}
      onClose={onClose}
      title="Mark the letter handed over"
      description={letter ? `The printed letter to ${workerText(letter.worker)}. Record the day it was handed over.` : undefined}
    >
      <form
        noValidate
        className="space-y-3"
        onSubmit={async (event) => {
          event.preventDefault();
          setError(null);
          setPending(true);
          try {
            await onConfirm(date);
            onClose();
          } catch (failure) {
            setError(isApiError(failure) ? (failure.fields?.handedOverOn ?? failure.message) : 'The hand-over could not be recorded');
          } finally {
            setPending(false);
          }
        }}
      >
        <TextField label="Handed over on" type="date" value={date} onChange={(event) => setDate(event.target.value)} error={error ?? undefined} />
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="primary" pending={pending}>
            Mark handed over
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/**
 * The group's worker letters (docs/decisions/024-worker-letters.md): the results at or above the
 * action level still without a letter, "Draft letters", and each letter with its status, dates,
 * PDF, "Send by e-mail", "Mark handed over" and "Cancel".
 */
export function WorkerLettersPanel({ organizationId, data, canEdit }: { organizationId: string; data: GroupWorkerLetters; canEdit: boolean }) {
  const draft = useDraftWorkerLetters(organizationId);
  const send = useSendWorkerLetter(organizationId);
  const handOver = useHandOverWorkerLetter(organizationId);
  const cancel = useCancelWorkerLetter(organizationId);
  const [duty, setDuty] = useState(data.defaultDuty);
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const [handing, setHanding] = useState<WorkerLetterView | null>(null);
  const [cancelling, setCancelling] = useState<WorkerLetterView | null>(null);
  const level = data.actionLevel;

  const run = async (action: () => Promise<string>) => {
    setMessage(null);
    try {
      setMessage({ tone: 'success', text: await action() });
    } catch (error) {
      setMessage({ tone: 'error', text: isApiError(error) ? error.message : 'The request failed' });
    }
  };

  return (
    <div className="space-y-6">
      {message && <Notice tone={message.tone}>{message.text}</Notice>}

      <section aria-labelledby="pending-title" className="space-y-3">
        <h2 id="pending-title" className="text-base">
          Results at or above the action level without a letter
        </h2>
        {level ? (
          <p className="text-sm text-slate-700">
            Action level: <strong>{valueWithUnit(level.value, level.unit)}</strong>. {level.basis} Non-detects never count.
          </p>
        ) : (
          <Notice tone="warning" title="No action level">
            {data.actionLevelMissing}
          </Notice>
        )}
        {data.pending.length === 0 ? (
          level && (
            <EmptyState title="No result is waiting for a letter">
              Results at or above the action level appear here when they are entered or imported.
            </EmptyState>
          )
        ) : (
          <>
            <div className="card overflow-x-auto">
              <table className="table-dense w-full">
                <thead>
                  <tr>
                    <th scope="col">Worker</th>
                    <th scope="col">E-mail</th>
                    <th scope="col">Shift date</th>
                    <th scope="col" className="text-right">
                      Result
                    </th>
                    <th scope="col">Compared with the limit</th>
                  </tr>
                </thead>
                <tbody>
                  {data.pending.map((row) => (
                    <tr key={row.shiftResultId}>
                      <td>{workerText(row.worker)}</td>
                      <td>{row.worker.email ?? <span className="text-slate-600">None: print and hand over</span>}</td>
                      <td className="tabular-nums">{formatCalendarDate(row.date)}</td>
                      <td className="text-right tabular-nums">{valueWithUnit(row.value, row.unit)}</td>
                      <td>{row.atOrAboveLimit ? <StatusBadge tone="void">At or above the limit</StatusBadge> : 'Below the limit'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {canEdit && (
              <div className="space-y-3">
                <details className="text-sm">
                  <summary className="cursor-pointer">Duty named in the letters (follow the local regulation)</summary>
                  <TextAreaField
                    className="mt-2"
                    label="Duty named in the letters"
                    hint="The regulation the letter serves. Change it where a local rule applies instead."
                    value={duty}
                    rows={3}
                    onChange={(event) => setDuty(event.target.value)}
                  />
                </details>
                <Button
                  variant="primary"
                  pending={draft.isPending}
                  onClick={() =>
                    run(async () => {
                      const answer = await draft.mutateAsync({
                        groupId: data.group.id,
                        draft: duty.trim() === data.defaultDuty ? {} : { dutyCited: duty.trim() },
                      });
                      return `Drafted ${answer.letters.length} letter${answer.letters.length === 1 ? '' : 's'}: preview each PDF, then send or hand it over.`;
                    })
                  }
                >
                  Draft letters ({new Set(data.pending.map((row) => row.worker.id)).size})
                </Button>
              </div>
            )}
          </>
        )}
      </section>

      <section aria-labelledby="letters-title" className="space-y-3">
        <h2 id="letters-title" className="text-base">
          Letters
        </h2>
        {data.letters.length === 0 ? (
          <EmptyState title="No letters yet" />
        ) : (
          <div className="card overflow-x-auto">
            <table className="table-dense w-full">
              <thead>
                <tr>
                  <th scope="col">Worker</th>
                  <th scope="col">Results</th>
                  <th scope="col">Status</th>
                  <th scope="col">Dates</th>
                  <th scope="col">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.letters.map((letter) => (
                  <tr key={letter.id} aria-label={`Letter ${letter.id} to ${letter.worker.code}`}>
                    <td>{workerText(letter.worker)}</td>
                    <td className="tabular-nums">
                      {letter.results.map((result) => (
                        <div key={result.shiftResultId}>
                          {formatCalendarDate(result.date)}: {result.valueText}
                        </div>
                      ))}
                    </td>
                    <td>
                      <LetterStatus letter={letter} />
                    </td>
                    <td>
                      <LetterDates letter={letter} />
                    </td>
                    <td>
                      <div className="flex flex-wrap justify-end gap-2">
                        <a className="text-sm" href={workerLetterPdfUrl(organizationId, letter.id)} target="_blank" rel="noreferrer">
                          {letter.status === 'sent' ? 'PDF as sent' : 'Preview PDF'}
                        </a>
                        {canEdit && letter.status === 'drafted' && (
                          <>
                            {letter.worker.email && (
                              <Button
                                size="sm"
                                variant="primary"
                                pending={send.isPending && send.variables === letter.id}
                                onClick={() =>
                                  run(async () => {
                                    const sent = await send.mutateAsync(letter.id);
                                    return `Letter to ${workerText(sent.worker)} sent to ${sent.recipientAddress}.`;
                                  })
                                }
                              >
                                Send by e-mail
                              </Button>
                            )}
                            <Button size="sm" onClick={() => setHanding(letter)}>
                              Mark handed over
                            </Button>
                            <Button size="sm" variant="danger" onClick={() => setCancelling(letter)}>
                              Cancel letter
                            </Button>
                          </>
                        )}
                      </div>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      <aside aria-label="Cautions" className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-3 text-sm text-amber-950">
        <ul className="space-y-1">
          {data.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
          <li>Letters follow the local regulation: check the duty named and the next steps against the rules that apply before sending.</li>
        </ul>
      </aside>

      <HandOverDialog
        letter={handing}
        onClose={() => setHanding(null)}
        onConfirm={async (handedOverOn) => {
          const letter = handing!;
          await handOver.mutateAsync({ letterId: letter.id, handedOverOn });
          setMessage({ tone: 'success', text: `Letter to ${workerText(letter.worker)} marked handed over on ${formatCalendarDate(handedOverOn)}.` });
        }}
      />
      <ReasonDialog
        open={cancelling !== null}
        onClose={() => setCancelling(null)}
        title="Cancel the letter"
        description={cancelling ? `The letter to ${workerText(cancelling.worker)} is kept as cancelled; its results wait for a new letter.` : undefined}
        confirmLabel="Cancel letter"
        tone="danger"
        schema={workerLetterCancel}
        onConfirm={async (reason) => {
          await cancel.mutateAsync({ letterId: cancelling!.id, reason: reason ?? '' });
        }}
      />
    </div>
  );
}
