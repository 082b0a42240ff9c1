import { useState } from 'react';
import { archiveRequest } from '@schema/list-query';
import { Button } from './button';
import { ReasonDialog } from './reason-dialog';

/**
 * "Archive" or "Bring back" for one record, confirmed in a dialog with an optional reason (kept
 * in the audit trail). Archived records stay, with their history; they leave pick lists.
 */
export function ArchiveToggle({
  archived,
  name,
  what,
  consequence,
  onChange,
  onDone,
  size = 'sm',
}: {
  archived: boolean;
  /** The record's name, for the button's accessible name and the dialog ("Ridgeback sawmill"). */
  name: string;
  /** The kind of record ("site"). */
  what: string;
  /** What archiving means for this kind of record, in a sentence. */
  consequence: string;
  onChange: (archived: boolean, reason: string | undefined) => Promise<unknown>;
  /** Told in words once the change is saved ("Site “Kiln yard” archived."), for a status message. */
  onDone?: (message: string) => void;
  size?: 'sm' | 'md';
}) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button
        size={size}
        variant={archived ? 'secondary' : 'danger'}
        aria-label={`${archived ? 'Bring back' : 'Archive'} ${what} ${name}`}
        onClick={() => setOpen(true)}
      >
        {archived ? 'Bring back' : 'Archive'}
      </Button>
      <ReasonDialog
        open={open}
        onClose={() => setOpen(false)}
        title={archived ? `Bring back ${what} “${name}”?` : `Archive ${what} “${name}”?`}
        description={archived ? `It returns to the lists and pick lists.` : consequence}
        confirmLabel={archived ? 'Bring back' : 'Archive'}
        tone={archived ? 'primary' : 'danger'}
        schema={archiveRequest}
        reasonLabel="Reason (optional)"
        reasonHint="Kept in the audit trail with your name."
        onConfirm={async (reason) => {
          await onChange(!archived, reason);
          onDone?.(`${what[0].toUpperCase()}${what.slice(1)} “${name}” ${archived ? 'brought back' : 'archived'}.`);
        }}
      />
    </>
  );
}
