import { describe, expect, it } from 'vitest';
import { can, roles } from '@schema/permissions';
import { organizationPages, pathInOrganization } from '@frontend/app/navigation';

// Switching organization keeps the page when the role there may open it (schema/permissions.ts).

describe('pathInOrganization', () => {
  it('keeps the people page for a role that manages users there', () => {
    expect(pathInOrganization('/orgs/1/users', '2', 'admin')).toBe('/orgs/2/users');
  });

  it('falls back to the overview when the role there may not open the page', () => {
    expect(pathInOrganization('/orgs/1/users', '2', 'consultant')).toBe('/orgs/2');
  });

  it('lists the decision-record register for every role that may read the organization, and keeps it when switching', () => {
    const register = organizationPages.find((page) => page.path === '/decision-records');
    expect(register).toEqual({ path: '/decision-records', label: 'Decision records', permission: 'org:read' });
    for (const role of roles) {
      expect(can(role, 'org:read'), role).toBe(true);
      // A record's own page is under the register: switching organization opens the other register.
      expect(pathInOrganization('/orgs/1/decision-records/12', '2', role), role).toBe('/orgs/2/decision-records');
    }
  });

  it('opens the overview from pages outside an organization', () => {
    expect(pathInOrganization('/outbox/4', '2', 'admin')).toBe('/orgs/2');
    expect(pathInOrganization('/orgs/1', '2', 'manager')).toBe('/orgs/2');
  });
});
