import { NavLink } from 'react-router';
import { EmptyState } from '@frontend/components/states';
import { formatDateTime } from '@frontend/lib/format';
import type { OutboxEntry } from '../api/get-outbox';

/** Captured e-mails, newest first; each opens its message view at /outbox/:id. */
export function OutboxList({ entries }: { entries: OutboxEntry[] }) {
  if (entries.length === 0) {
    return <EmptyState title="No e-mail captured yet">Invitations and password-reset e-mails appear here as the server sends them.</EmptyState>;
  }
  return (
    <ul className="card divide-y divide-slate-100 overflow-hidden" aria-label="Captured e-mails">
      {entries.map((entry) => (
        <li key={String(entry.id)}>
          <NavLink
            to={`/outbox/${encodeURIComponent(String(entry.id))}`}
            className={({ isActive }) =>
              `block px-3 py-2 text-sm no-underline hover:bg-slate-50 hover:no-underline ${isActive ? 'bg-primary-50 shadow-[inset_3px_0_0_var(--color-primary-600)]' : ''}`
            }
          >
            <span className="block truncate font-medium text-slate-900">{entry.subject || '(no subject)'}</span>
            <span className="flex justify-between gap-2 text-xs text-slate-600">
              <span className="truncate">To {entry.to}</span>
              <span className="shrink-0 tabular-nums">{formatDateTime(entry.receivedAt)}</span>
            </span>
          </NavLink>
        </li>
      ))}
    </ul>
  );
}
