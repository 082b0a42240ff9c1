import { can, type Permission, type Role } from '@schema/permissions';

/**
 * Pages inside an organization and the permission each needs. The sidebar shows only what
 * the role may open, and the organization switcher keeps the same page when the role in the
 * other organization allows it. Add a page here when you add a route under /orgs/:orgId.
 */
export const organizationPages = [
  { path: '', label: 'Overview', permission: 'org:read' },
  { path: '/exposure-groups', label: 'Exposure groups', permission: 'org:read' },
  { path: '/decision-records', label: 'Decision records', permission: 'org:read' },
  { path: '/workers', label: 'Workers', permission: 'org:read' },
  { path: '/sites', label: 'Sites', permission: 'org:read' },
  { path: '/agents', label: 'Agents & OELs', permission: 'org:read' },
  { path: '/hearing-protectors', label: 'Hearing protectors', permission: 'org:read' },
  // Importing writes results: only for roles that may change data (the import history is on the same page).
  { path: '/lab-imports', label: 'Import results', permission: 'data:edit' },
  { path: '/noise-logs', label: 'Noise logs', permission: 'org:read' },
  { path: '/noise-settings', label: 'Noise settings', permission: 'settings:manage' },
  { path: '/users', label: 'People', permission: 'users:manage' },
  { path: '/audit', label: 'Audit trail', permission: 'audit:read' },
] as const satisfies ReadonlyArray<{ path: string; label: string; permission: Permission }>;

/** "/orgs/7" + the part of the current path after the organization, if that role may open it. */
export function pathInOrganization(currentPathname: string, organizationId: string, role: Role): string {
  const base = `/orgs/${encodeURIComponent(organizationId)}`;
  const rest = /^\/orgs\/[^/]+(\/[^/]+)?/.exec(currentPathname)?.[1] ?? '';
  const page = organizationPages.find((p) => p.path === rest);
  return page && can(role, page.permission) ? base + page.path : base;
}
