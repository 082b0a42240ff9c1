import { permissionsOf, roleLabels, type Permission, type Role } from '@schema/permissions';

/** Each permission in plain words, for people reading what their role lets them do. */
const permissionWords: Record<Permission, string> = {
  'org:read': 'See the organization: groups, results, decisions and dashboards',
  'users:manage': 'Invite people, change their roles and deactivate memberships',
  'settings:manage': 'Change organization settings such as thresholds and review intervals',
  'outbox:read': 'Read the local e-mail outbox (development and test set-ups only)',
  'data:edit': 'Add and edit sites, agents, OELs, groups, workers, sampling plans, results and noise logs',
  'workerNames:read': 'See worker names (worker codes are always shown)',
  'stats:run': 'Run statistics and the sample planner',
  'decision:draft': 'Draft decision records',
  'decision:approve': 'Approve or return draft decision records (never your own)',
  'decision:acknowledge': 'Acknowledge approved decision records',
  'evidence:export': 'Download evidence packs',
  'comment:write': 'Comment on groups and decision records',
  'audit:read': 'Read the audit trail',
};

/** "As Manager you can: …", read from the one permission table the server also uses. */
export function RoleAccess({ role }: { role: Role }) {
  return (
    <section aria-labelledby="role-access-title" className="card px-4 py-3">
      <h2 id="role-access-title" className="text-sm">
        What you can do as {roleLabels[role]}
      </h2>
      <ul className="mt-2 space-y-1 text-sm text-slate-700">
        {permissionsOf(role).map((permission) => (
          <li key={permission} className="flex gap-2">
            <span aria-hidden="true" className="mt-2 size-1.5 shrink-0 rounded-full bg-primary-500" />
            {permissionWords[permission]}
          </li>
        ))}
      </ul>
    </section>
  );
}
