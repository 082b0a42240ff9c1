import { useState, type FormEvent } from 'react';
import type { z } from 'zod';
import { isApiError } from '@frontend/lib/api-client';
import { Button } from './button';
import { TextField } from './form-field';
import { Notice } from './notice';

/** One numeric setting: its key in the settings document, label and hint. */
export interface NumberSettingField<TKey extends string> {
  key: TKey;
  label: string;
  hint: string;
}

/**
 * A form of numeric organization settings (noise settings, protector thresholds): an admin edits and
 * saves, everyone else reads the values. The shared schema checks the numbers in the browser (errors
 * next to each field) and the server's field errors land on the same fields.
 */
export function NumberSettingsForm<TValues extends Record<string, number>, TUpdate>({
  fields,
  values,
  schema,
  save,
  pending,
  canManage,
  savedMessage,
  readOnlyMessage,
  submitLabel,
  saveError,
  className,
  gridClassName,
}: {
  fields: ReadonlyArray<NumberSettingField<Extract<keyof TValues, string>>>;
  values: TValues;
  /** Parses the typed numbers into what `save` sends (the shared request schema). */
  schema: z.ZodType<TUpdate>;
  save: (values: TUpdate) => Promise<unknown>;
  pending: boolean;
  canManage: boolean;
  savedMessage: string;
  readOnlyMessage: string;
  submitLabel: string;
  /** The last save's error, shown above the fields when set. */
  saveError?: unknown;
  className: string;
  gridClassName: string;
}) {
  const [draft, setDraft] = useState<Record<string, string>>(() => Object.fromEntries(Object.entries(values).map(([key, value]) => [key, String(value)])));
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const parsed = schema.safeParse(Object.fromEntries(Object.entries(draft).map(([key, value]) => [key, value.trim() === '' ? undefined : Number(value)])));
    if (!parsed.success) {
      setProblems(Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])));
      return;
    }
    setProblems({});
    try {
      await save(parsed.data);
      setSaved(true);
    } catch (failure) {
      if (isApiError(failure) && failure.fields) setProblems(failure.fields);
    }
  }

  return (
    <form onSubmit={submit} className={className} noValidate>
      {saved && <Notice tone="success">{savedMessage}</Notice>}
      {saveError !== undefined && saveError !== null && (
        <Notice tone="error">{isApiError(saveError) ? saveError.message : 'The settings could not be saved.'}</Notice>
      )}
      {!canManage && <Notice tone="info">{readOnlyMessage}</Notice>}
      <div className={gridClassName}>
        {fields.map((field) => (
          <TextField
            key={field.key}
            label={field.label}
            hint={field.hint}
            inputMode="decimal"
            value={draft[field.key] ?? ''}
            disabled={!canManage}
            onChange={(event) => setDraft({ ...draft, [field.key]: event.target.value })}
            error={problems[field.key]}
          />
        ))}
      </div>
      {canManage && (
        <Button type="submit" variant="primary" pending={pending}>
          {submitLabel}
        </Button>
      )}
    </form>
  );
}
