import { Button } from './button';
import { Notice } from './notice';

/** The foot of a form: its error for the whole form (an alert), then Cancel and the submit button. */
export function FormActions({ error, submitLabel, pending, onCancel }: { error: string | null; submitLabel: string; pending: boolean; onCancel?: () => void }) {
  return (
    <div className="space-y-3 pt-1">
      {error && <Notice tone="error">{error}</Notice>}
      <div className="flex justify-end gap-2">
        {onCancel && <Button onClick={onCancel}>Cancel</Button>}
        <Button type="submit" variant="primary" pending={pending}>
          {submitLabel}
        </Button>
      </div>
    </div>
  );
}
