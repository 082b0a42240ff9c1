import { useState } from 'react';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { formatCalendarDate } from '@frontend/lib/format';
import { MembershipDatesForm } from './membership-dates-form';

/** "End" (open periods) and "Dates" for one membership period, each in a dialog. */
export function MembershipActions({
  organizationId,
  period,
  who,
  onDone,
}: {
  organizationId: string;
  period: { id: number; fromDate: string; toDate: string | null };
  /** "RT-001 in Planer feeder – noise", for accessible names and the dialog title. */
  who: string;
  onDone: (message: string) => void;
}) {
  const [mode, setMode] = useState<'end' | 'dates' | null>(null);
  return (
    <div className="flex justify-end gap-1.5">
      {period.toDate === null && (
        <Button size="sm" aria-label={`End membership of ${who}`} onClick={() => setMode('end')}>
          End
        </Button>
      )}
      <Button size="sm" variant="ghost" aria-label={`Change dates of ${who}`} onClick={() => setMode('dates')}>
        Dates
      </Button>
      <Dialog
        open={mode !== null}
        onClose={() => setMode(null)}
        title={mode === 'end' ? 'End membership' : 'Change membership dates'}
        description={`${who}, since ${formatCalendarDate(period.fromDate)}.`}
      >
        <MembershipDatesForm
          organizationId={organizationId}
          membership={period}
          ending={mode === 'end'}
          onCancel={() => setMode(null)}
          onSaved={() => {
            onDone(mode === 'end' ? `Membership of ${who} ended.` : `Dates of ${who} saved.`);
            setMode(null);
          }}
        />
      </Dialog>
    </div>
  );
}
