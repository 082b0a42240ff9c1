import { useState } from 'react';
import { roleLabels } from '@schema/permissions';
import { Button } from '@frontend/components/button';
import { Notice } from '@frontend/components/notice';
import { EmptyState } from '@frontend/components/states';
import { formatDate } from '@frontend/lib/format';
import type { Invitation } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

/** Invitations not yet accepted (open or expired), newest first, each with a revoke button. */
export function PendingInvitations({ organizationId, invitations }: { organizationId: string; invitations: Invitation[] }) {
  const revoke = useRevokeInvitation(organizationId);
  const [outcome, setOutcome] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const pending = invitations.filter((invitation) => invitation.status !== 'accepted').sort((a, b) => String(b.createdAt).localeCompare(String(a.createdAt)));

  return (
    <div className="space-y-2">
      {outcome && <Notice tone={outcome.tone}>{outcome.text}</Notice>}
      {pending.length === 0 ? (
        <EmptyState title="No open invitations">Invitations you send appear here until they are accepted.</EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="table-dense w-full">
            <thead>
              <tr>
                <th scope="col">E-mail</th>
                <th scope="col">Role</th>
                <th scope="col">Invited by</th>
                <th scope="col">Sent</th>
                <th scope="col">Expires</th>
                <th scope="col">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {pending.map((invitation) => {
                const expired = invitation.status === 'expired';
                const busy = revoke.isPending && revoke.variables === invitation.id;
                return (
                  <tr key={String(invitation.id)}>
                    <td className="font-medium text-slate-900">{invitation.email}</td>
                    <td>{roleLabels[invitation.role]}</td>
                    <td className="text-slate-600">{invitation.invitedBy}</td>
                    <td className="text-slate-600 tabular-nums">{formatDate(invitation.createdAt)}</td>
                    <td className="tabular-nums">
                      {expired ? (
                        <span className="rounded bg-slate-100 px-1.5 py-0.5 text-xs font-medium text-slate-600">
                          Expired {formatDate(invitation.expiresAt)}
                        </span>
                      ) : (
                        <span className="text-slate-600">{formatDate(invitation.expiresAt)}</span>
                      )}
                    </td>
                    <td className="text-right">
                      <Button
                        size="sm"
                        variant="danger"
                        pending={busy}
                        aria-label={`Revoke the invitation for ${invitation.email}`}
                        onClick={() => {
                          setOutcome(null);
                          revoke.mutate(invitation.id, {
                            onSuccess: () =>
                              setOutcome({ tone: 'success', text: `The invitation for ${invitation.email} is revoked; its link no longer works.` }),
                            onError: (error) => setOutcome({ tone: 'error', text: error.message }),
                          });
                        }}
                      >
                        Revoke
                      </Button>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
