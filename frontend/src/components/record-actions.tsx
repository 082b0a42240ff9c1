import { ArchiveToggle } from './archive-toggle';
import { Button } from './button';

/** Edit and Archive / Bring back for one row of a list (editors only). */
export function RecordActions({
  name,
  what,
  archived,
  consequence,
  onEdit,
  onArchive,
  onDone,
}: {
  name: string;
  what: string;
  archived: boolean;
  consequence: string;
  onEdit?: () => void;
  onArchive: (archived: boolean, reason: string | undefined) => Promise<unknown>;
  onDone?: (message: string) => void;
}) {
  return (
    <div className="flex justify-end gap-1.5">
      {onEdit && !archived && (
        <Button size="sm" aria-label={`Edit ${what} ${name}`} onClick={onEdit}>
          Edit
        </Button>
      )}
      <ArchiveToggle archived={archived} name={name} what={what} consequence={consequence} onChange={onArchive} onDone={onDone} />
    </div>
  );
}
