import { useState, type FormEvent } from 'react';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { clockTime } from '../lib/format-noise';

export type MaskDialogState =
  | { kind: 'add'; startS: number; endS: number }
  | { kind: 'change'; maskId: number; startS: number; endS: number }
  | { kind: 'remove'; maskId: number; startS: number; endS: number };

/**
 * Add, change (extend or shorten) or remove a mask. Every change needs a reason; it goes to the
 * audit trail with the span. Times are seconds from the log start (shown also as h:mm:ss).
 */
export function MaskDialog({
  state,
  onClose,
  onSave,
}: {
  state: MaskDialogState | null;
  onClose: () => void;
  onSave: (values: { startS: number; endS: number; reason: string }) => Promise<unknown>;
}) {
  return (
    <Dialog
      open={state !== null}
      onClose={onClose}
      title={state?.kind === 'remove' ? 'Remove the mask' : state?.kind === 'change' ? 'Change the masked span' : 'Mask a span'}
      description="The reviewed figures leave masked intervals out and give that time the mean of the rest. Give a reason: it is kept in the audit trail."
    >
      {state && <MaskForm key={JSON.stringify(state)} state={state} onClose={onClose} onSave={onSave} />}
    </Dialog>
  );
}

function MaskForm({
  state,
  onClose,
  onSave,
}: {
  state: MaskDialogState;
  onClose: () => void;
  onSave: (values: { startS: number; endS: number; reason: string }) => Promise<unknown>;
}) {
  const [start, setStart] = useState(String(Math.round(state.startS * 10) / 10));
  const [end, setEnd] = useState(String(Math.round(state.endS * 10) / 10));
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);
  const startS = Number(start);
  const endS = Number(end);

  async function submit(event: FormEvent) {
    event.preventDefault();
    const problems: Record<string, string> = {};
    if (state.kind !== 'remove') {
      if (!(start.trim() !== '' && startS >= 0)) problems.startS = 'Give the start in seconds (0 or more)';
      if (!(end.trim() !== '' && endS > startS)) problems.endS = 'The end must be after the start';
    }
    if (reason.trim().length < 3) problems.reason = 'Give a reason (at least 3 characters)';
    setFields(problems);
    if (Object.keys(problems).length) return;
    setPending(true);
    setError(null);
    try {
      await onSave({ startS, endS, reason: reason.trim() });
      onClose();
    } catch (failure) {
      setError(isApiError(failure) ? failure.message : 'The mask could not be saved.');
      if (isApiError(failure) && failure.fields) setFields(failure.fields);
    } finally {
      setPending(false);
    }
  }

  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      {error && <Notice tone="error">{error}</Notice>}
      {state.kind === 'remove' ? (
        <p className="text-sm">
          Span {clockTime(state.startS)}–{clockTime(state.endS)}. The mask is kept as removed, and the reviewed figures include this time again.
        </p>
      ) : (
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Start, s from log start"
            inputMode="decimal"
            value={start}
            onChange={(e) => setStart(e.target.value)}
            error={fields.startS}
            hint={Number.isFinite(startS) ? clockTime(startS) : undefined}
          />
          <TextField
            label="End, s from log start"
            inputMode="decimal"
            value={end}
            onChange={(e) => setEnd(e.target.value)}
            error={fields.endS}
            hint={Number.isFinite(endS) ? clockTime(endS) : undefined}
          />
        </div>
      )}
      <TextField label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} error={fields.reason} maxLength={500} />
      <div className="flex justify-end gap-2">
        <Button onClick={onClose}>Cancel</Button>
        <Button type="submit" variant={state.kind === 'remove' ? 'danger' : 'primary'} pending={pending}>
          {state.kind === 'remove' ? 'Remove mask' : 'Save mask'}
        </Button>
      </div>
    </form>
  );
}
