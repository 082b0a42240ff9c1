import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { Button } from './button';
import { Dialog } from './dialog';
import { TextAreaField } from './form-field';
import { Notice } from './notice';

type ReasonSchema = z.ZodType<{ reason?: string | undefined }, { reason?: string | undefined }>;

/**
 * "Are you sure?" with a reason: void or restore a result, archive or bring back a record. The
 * reason is checked with the server's own schema (required for results, optional for archiving)
 * and goes to the audit trail. Enter in the reason box adds a line; the button (or Ctrl+Enter)
 * confirms; Escape cancels.
 */
export function ReasonDialog({
  open,
  onClose,
  title,
  description,
  confirmLabel,
  tone = 'primary',
  schema,
  reasonLabel = 'Reason',
  reasonHint,
  onConfirm,
}: {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  confirmLabel: string;
  tone?: 'primary' | 'danger';
  schema: ReasonSchema;
  reasonLabel?: string;
  reasonHint?: ReactNode;
  /** Runs the request; a rejection shows its message in the dialog, which stays open. */
  onConfirm: (reason: string | undefined) => Promise<unknown>;
}) {
  return (
    <Dialog open={open} onClose={onClose} title={title} description={description}>
      <ReasonForm
        onClose={onClose}
        confirmLabel={confirmLabel}
        tone={tone}
        schema={schema}
        reasonLabel={reasonLabel}
        reasonHint={reasonHint}
        onConfirm={onConfirm}
      />
    </Dialog>
  );
}

function ReasonForm({
  onClose,
  confirmLabel,
  tone,
  schema,
  reasonLabel,
  reasonHint,
  onConfirm,
}: {
  onClose: () => void;
  confirmLabel: string;
  tone: 'primary' | 'danger';
  schema: ReasonSchema;
  reasonLabel: string;
  reasonHint?: ReactNode;
  onConfirm: (reason: string | undefined) => Promise<unknown>;
}) {
  const form = useForm({ resolver: zodResolver(schema), defaultValues: { reason: '' } });
  const [formError, setFormError] = useState<string | null>(null);
  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onConfirm(values.reason ? values.reason : undefined);
      onClose();
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['reason']));
    }
  });
  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <TextAreaField
        label={reasonLabel}
        hint={reasonHint}
        error={form.formState.errors.reason?.message}
        onKeyDown={(event) => {
          if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) void submit();
        }}
        {...form.register('reason')}
      />
      {formError && <Notice tone="error">{formError}</Notice>}
      <div className="flex justify-end gap-2">
        <Button onClick={onClose}>Cancel</Button>
        <Button type="submit" variant={tone === 'danger' ? 'danger' : 'primary'} pending={form.formState.isSubmitting}>
          {confirmLabel}
        </Button>
      </div>
    </form>
  );
}
