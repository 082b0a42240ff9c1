import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '@schema/audit';
import { createTestContext, type TestContext } from '../helpers/test-app';

describe('organization routes check membership and role on the server', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
  });
  afterAll(() => context.close());

  it('the summary counts the demo organization’s sites, groups, workers, agents and members', async () => {
    const manager = await context.signInAs('manager');
    const answer = await manager.get(`/api/orgs/${ridgeback}/summary`);
    expect(answer.status).toBe(200);
    expect(answer.body).toEqual({
      organization: { id: ridgeback, name: 'Ridgeback Timber Co.', slug: 'ridgeback-timber' },
      counts: { sites: 2, exposureGroups: 8, workers: 16, agents: 2, members: 5 },
    });
  });

  it('a manager cannot list members (403 naming the permission)', async () => {
    const manager = await context.signInAs('manager');
    const answer = await manager.get(`/api/orgs/${ridgeback}/members`);
    expect(answer.status).toBe(403);
    expect(answer.body.error).toEqual({ code: 'forbidden', message: 'Your role (manager) does not allow this (needs users:manage)' });
  });

  it('a member of the other organization gets 404, the same as for an organization that does not exist', async () => {
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const other = await slateAdmin.get(`/api/orgs/${ridgeback}/summary`);
    const missing = await slateAdmin.get('/api/orgs/999999/summary');
    expect(other.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
    expect((await slateAdmin.get(`/api/orgs/${ridgeback}/members`)).status).toBe(404);
    expect((await slateAdmin.get(`/api/orgs/${slateHarbor}/members`)).status).toBe(200);
  });

  it('organization routes answer 401 without a session', async () => {
    expect((await request(context.app).get(`/api/orgs/${ridgeback}/summary`)).status).toBe(401);
  });

  it('a malformed organization id answers 400 naming orgId', async () => {
    const admin = await context.signInAs('admin');
    const answer = await admin.get('/api/orgs/ridgeback/summary');
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toEqual({ orgId: expect.any(String) });
  });

  it('an admin lists members with e-mail, name, role and active flag', async () => {
    const admin = await context.signInAs('admin');
    const answer = await admin.get(`/api/orgs/${ridgeback}/members`);
    expect(answer.status).toBe(200);
    expect(answer.body).toHaveLength(5);
    expect(answer.body).toContainEqual({
      id: expect.any(Number),
      userId: expect.any(Number),
      email: 'consultant@fieldwise.example',
      name: 'Taylor Fenwick',
      role: 'consultant',
      active: true,
      createdAt: '2025-03-03T08:00:00.000Z',
    });
  });

  it('an admin changes a role; the change is audited with before and after', async () => {
    const admin = await context.signInAs('admin');
    const members = (await admin.get(`/api/orgs/${ridgeback}/members`)).body as Array<{ id: number; email: string }>;
    const analyst = members.find((member) => member.email === 'analyst@ridgeback.example')!;
    const answer = await admin.patch(`/api/orgs/${ridgeback}/members/${analyst.id}`, { role: 'hygienist' });
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ id: analyst.id, role: 'hygienist', active: true });
    const event = context.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.entityId, String(analyst.id)))
      .all()
      .at(-1)!;
    expect(event).toMatchObject({
      organizationId: ridgeback,
      actorUserId: admin.user.id,
      entityType: 'membership',
      action: 'role_changed',
      before: expect.objectContaining({ role: 'analyst', active: true }),
      after: expect.objectContaining({ role: 'hygienist', active: true }),
    });
    // The new role takes effect at the next request.
    const changed = await context.signIn('analyst@ridgeback.example');
    expect(changed.memberships[0].role).toBe('hygienist');
    await admin.patch(`/api/orgs/${ridgeback}/members/${analyst.id}`, { role: 'analyst' });
  });

  it('a deactivated member loses the organization: 404 on its routes and gone from /api/me', async () => {
    const admin = await context.signInAs('admin');
    const manager = await context.signInAs('manager');
    const members = (await admin.get(`/api/orgs/${ridgeback}/members`)).body as Array<{ id: number; email: string }>;
    const target = members.find((member) => member.email === 'manager@ridgeback.example')!;
    const answer = await admin.patch(`/api/orgs/${ridgeback}/members/${target.id}`, { active: false });
    expect(answer.status).toBe(200);
    expect(answer.body.active).toBe(false);
    expect((await manager.get(`/api/orgs/${ridgeback}/summary`)).status).toBe(404);
    expect((await manager.get('/api/me')).body.memberships).toEqual([]);
    const summary = await admin.get(`/api/orgs/${ridgeback}/summary`);
    expect(summary.body.counts.members).toBe(4);
    const reactivated = await admin.patch(`/api/orgs/${ridgeback}/members/${target.id}`, { active: true });
    expect(reactivated.body.active).toBe(true);
    expect((await manager.get(`/api/orgs/${ridgeback}/summary`)).status).toBe(200);
  });

  it('the last active admin cannot demote or deactivate themselves (409)', async () => {
    const admin = await context.signInAs('admin');
    const own = admin.memberships.find((membership) => membership.organizationId === ridgeback)!;
    const demote = await admin.patch(`/api/orgs/${ridgeback}/members/${own.id}`, { role: 'analyst' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toBe('Morgan Pike is the last active admin of this organization: make someone else admin first');
    expect((await admin.patch(`/api/orgs/${ridgeback}/members/${own.id}`, { active: false })).status).toBe(409);
  });

  it('a membership of another organization answers 404 to PATCH', async () => {
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const ridgebackAdmin = await context.signInAs('admin');
    const own = ridgebackAdmin.memberships[0];
    const answer = await slateAdmin.patch(`/api/orgs/${slateHarbor}/members/${own.id}`, { role: 'manager' });
    expect(answer.status).toBe(404);
  });

  it('a PATCH with nothing to change answers 400', async () => {
    const admin = await context.signInAs('admin');
    const answer = await admin.patch(`/api/orgs/${ridgeback}/members/${admin.memberships[0].id}`, {});
    expect(answer.status).toBe(400);
    expect(answer.body.error.message).toContain('Change the role or the active flag');
  });
});

describe('outbox', () => {
  it('admins read captured e-mails; other roles get 403', async () => {
    const context = await createTestContext();
    try {
      const admin = await context.signInAs('admin');
      await admin.post(`/api/orgs/${context.organizationId('ridgeback')}/invitations`, { email: 'outbox@ridgeback.example', role: 'manager' });
      const list = await admin.get('/api/outbox');
      expect(list.status).toBe(200);
      expect(list.body).toEqual([
        {
          id: expect.any(Number),
          to: 'outbox@ridgeback.example',
          from: expect.stringContaining('no-reply@'),
          subject: 'You are invited to Ridgeback Timber Co. on Bellwether',
          receivedAt: expect.any(String),
        },
      ]);
      const one = await admin.get(`/api/outbox/${list.body[0].id}`);
      expect(one.body.text).toContain('/accept-invitation/');
      expect(one.body.html).toContain('<a href=');
      expect((await admin.get('/api/outbox/9999')).status).toBe(404);
      const hygienist = await context.signInAs('hygienist');
      expect((await hygienist.get('/api/outbox')).status).toBe(403);
      expect((await request(context.app).get('/api/outbox')).status).toBe(401);
    } finally {
      await context.close();
    }
  });

  it('answers 404 when the local capture is not running', async () => {
    const context = await createTestContext({ capture: false });
    try {
      const admin = await context.signInAs('admin');
      const answer = await admin.get('/api/outbox');
      expect(answer.status).toBe(404);
    } finally {
      await context.close();
    }
  });
});
