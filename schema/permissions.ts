/**
 * The one permission table (PRODUCT.md "Who uses it"). The server's `requirePermission`
 * middleware and the browser's navigation both read it; the browser only hides, the server decides.
 */
export const roles = ['admin', 'hygienist', 'analyst', 'manager', 'consultant'] as const;
export type Role = (typeof roles)[number];

export const permissions = [
  'org:read', // see the organization, its groups, results, decisions and dashboards
  'users:manage', // invite people, change roles, deactivate memberships
  'settings:manage', // organization settings (thresholds, review intervals)
  'outbox:read', // the local e-mail capture (development and tests only)
  'data:edit', // sites, agents, OELs, groups, workers, plans, results, noise logs and masks
  'workerNames:read', // worker names (codes are always visible)
  'stats:run', // run statistics, what-if and the sample planner
  'decision:draft', // draft decision records
  'decision:approve', // approve or return drafts (never one's own)
  'decision:acknowledge', // acknowledge approved records
  'evidence:export', // download evidence packs
  'comment:write', // comment on groups and decision records
  'audit:read', // read the audit trail
] as const;
export type Permission = (typeof permissions)[number];

const grants: Record<Role, readonly Permission[]> = {
  admin: permissions,
  hygienist: ['org:read', 'data:edit', 'workerNames:read', 'stats:run', 'decision:draft', 'comment:write'],
  analyst: ['org:read', 'workerNames:read', 'stats:run', 'decision:approve', 'comment:write'],
  manager: ['org:read', 'workerNames:read', 'decision:acknowledge', 'comment:write'],
  consultant: ['org:read', 'stats:run', 'evidence:export', 'comment:write', 'audit:read'],
};

/** Whether a role holds a permission. `can('analyst', 'decision:approve')` → true */
export function can(role: Role, permission: Permission): boolean {
  return grants[role].includes(permission);
}

/** Every permission a role holds, for the client to shape its navigation. */
export function permissionsOf(role: Role): readonly Permission[] {
  return grants[role];
}

export const roleLabels: Record<Role, string> = {
  admin: 'Admin',
  hygienist: 'Hygienist',
  analyst: 'Analyst',
  manager: 'Manager',
  consultant: 'Consultant',
};
