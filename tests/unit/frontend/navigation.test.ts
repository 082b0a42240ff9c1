import { describe, expect, it } from 'vitest';
import { pathInOrganization } from '@frontend/app/navigation';

// Switching organization keeps the page when the role there may open it (schema/permissions.ts).

describe('pathInOrganization', () => {
  it('keeps the people page for a role that manages users there', () => {
    expect(pathInOrganization('/orgs/1/users', '2', 'admin')).toBe('/orgs/2/users');
  });

  it('falls back to the overview when the role there may not open the page', () => {
    expect(pathInOrganization('/orgs/1/users', '2', 'consultant')).toBe('/orgs/2');
  });

  it('opens the overview from pages outside an organization', () => {
    expect(pathInOrganization('/outbox/4', '2', 'admin')).toBe('/orgs/2');
    expect(pathInOrganization('/orgs/1', '2', 'manager')).toBe('/orgs/2');
  });
});
