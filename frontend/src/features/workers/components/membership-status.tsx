import { StatusBadge } from '@frontend/components/status-badge';
import { todayCalendarDate } from '@frontend/lib/format';

/** Current, ended or starting later — read from the period's dates against today. */
export function MembershipStatus({ period }: { period: { fromDate: string; toDate: string | null; current: boolean } }) {
  if (period.current) return <StatusBadge tone="positive">Current</StatusBadge>;
  if (period.fromDate > todayCalendarDate()) return <StatusBadge tone="warning">Starts later</StatusBadge>;
  return <StatusBadge tone="muted">Ended</StatusBadge>;
}
