import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '@schema/audit';
import { invitations } from '@schema/organizations';
import { createTestContext, demoPassword, type SignedIn, type TestContext } from '../helpers/test-app';

const linkPattern = /http:\/\/bellwether\.test\/accept-invitation\/([A-Za-z0-9_-]{43})/;

describe('invitations', () => {
  let context: TestContext;
  let admin: SignedIn;
  let ridgebackId: number;

  beforeAll(async () => {
    context = await createTestContext();
    admin = await context.signInAs('admin');
    ridgebackId = context.organizationId('ridgeback');
  });
  afterAll(() => context.close());

  async function invite(email: string, role = 'hygienist') {
    const answer = await admin.post(`/api/orgs/${ridgebackId}/invitations`, { email, role });
    expect(answer.status).toBe(201);
    const message = await context.mailbox.waitFor((mail) => mail.to === email);
    const token = linkPattern.exec(message.text)?.[1];
    expect(token, `link in: ${message.text}`).toBeDefined();
    return { answer, message, token: token! };
  }

  it('an admin invites by e-mail: the message arrives in the capture with a working single-use link', async () => {
    const { answer, message, token } = await invite('new.hygienist@ridgeback.example');
    expect(answer.body).toMatchObject({
      email: 'new.hygienist@ridgeback.example',
      role: 'hygienist',
      invitedBy: 'Morgan Pike',
      acceptedAt: null,
      status: 'pending',
      createdAt: '2025-03-03T08:00:00.000Z',
      expiresAt: '2025-03-10T08:00:00.000Z',
    });
    expect(message.subject).toBe('You are invited to Ridgeback Timber Co. on Bellwether');
    expect(message.html).toContain(`/accept-invitation/${token}`);
    expect(message.text).toContain('Morgan Pike invited you to join Ridgeback Timber Co. on Bellwether as Hygienist.');

    // Only the hash of the token is stored.
    const stored = context.db.select().from(invitations).where(eq(invitations.id, answer.body.id)).get()!;
    expect(stored.tokenHash).not.toContain(token);
    expect(stored.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    const preview = await request(context.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toEqual({
      email: 'new.hygienist@ridgeback.example',
      organizationName: 'Ridgeback Timber Co.',
      role: 'hygienist',
      expiresAt: '2025-03-10T08:00:00.000Z',
    });

    const invitee = await context.client();
    const accepted = await invitee.post(`/api/invitations/${token}/accept`, { name: 'Pat Newcombe', password: 'a-long-new-password' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email: 'new.hygienist@ridgeback.example', name: 'Pat Newcombe' });
    expect(accepted.body.memberships).toEqual([expect.objectContaining({ organizationId: ridgebackId, role: 'hygienist' })]);
    // Signed in by accepting.
    invitee.csrfToken = accepted.body.csrfToken;
    expect((await invitee.get('/api/me')).status).toBe(200);
    // And the new password works for a normal sign-in.
    await context.signIn('new.hygienist@ridgeback.example', 'a-long-new-password');

    const again = await (
      await context.client()
    ).post(`/api/invitations/${token}/accept`, {
      name: 'Someone Else',
      password: 'another-long-password',
    });
    expect(again.status).toBe(404);
    expect((await request(context.app).get(`/api/invitations/${token}`)).status).toBe(404);

    const list = await admin.get(`/api/orgs/${ridgebackId}/invitations`);
    expect(list.body.find((row: { id: number }) => row.id === answer.body.id)).toMatchObject({ status: 'accepted' });

    const trail = context.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, 'invitation'), eq(auditEvents.entityId, String(answer.body.id))))
      .all();
    expect(trail.map((event) => event.action)).toEqual(['created', 'accepted']);
  });

  it('an invitation link stops working after 7 days', async () => {
    const { token } = await invite('late.analyst@ridgeback.example', 'analyst');
    context.clock.advance(7 * 24 * 3_600_000 + 1000);
    try {
      expect((await request(context.app).get(`/api/invitations/${token}`)).status).toBe(404);
      const accept = await (
        await context.client()
      ).post(`/api/invitations/${token}/accept`, {
        name: 'Late',
        password: 'a-long-new-password',
      });
      expect(accept.status).toBe(404);
      const list = await admin.get(`/api/orgs/${ridgebackId}/invitations`);
      expect(list.body.find((row: { email: string }) => row.email === 'late.analyst@ridgeback.example').status).toBe('expired');
    } finally {
      context.clock.advance(-(7 * 24 * 3_600_000 + 1000));
    }
  });

  it('a revoked invitation disappears from the list and its link answers 404; revoking twice answers 404', async () => {
    const { answer, token } = await invite('revoked@ridgeback.example', 'manager');
    const revoke = await admin.delete(`/api/orgs/${ridgebackId}/invitations/${answer.body.id}`);
    expect(revoke.status).toBe(204);
    expect((await request(context.app).get(`/api/invitations/${token}`)).status).toBe(404);
    const list = await admin.get(`/api/orgs/${ridgebackId}/invitations`);
    expect(list.body.map((row: { id: number }) => row.id)).not.toContain(answer.body.id);
    expect((await admin.delete(`/api/orgs/${ridgebackId}/invitations/${answer.body.id}`)).status).toBe(404);
  });

  it('inviting the same address again replaces the pending invitation', async () => {
    const first = await invite('twice@ridgeback.example', 'analyst');
    context.mailbox.clear();
    const second = await invite('twice@ridgeback.example', 'manager');
    expect((await request(context.app).get(`/api/invitations/${first.token}`)).status).toBe(404);
    expect((await request(context.app).get(`/api/invitations/${second.token}`)).body.role).toBe('manager');
  });

  it('an accepted invitation cannot be revoked (409)', async () => {
    const { answer, token } = await invite('accepted.then.revoked@ridgeback.example', 'analyst');
    await (await context.client()).post(`/api/invitations/${token}/accept`, { name: 'Acc', password: 'a-long-new-password' });
    const revoke = await admin.delete(`/api/orgs/${ridgebackId}/invitations/${answer.body.id}`);
    expect(revoke.status).toBe(409);
    expect(revoke.body.error.code).toBe('conflict');
  });

  it('someone with an account joins a second organization only with their existing password', async () => {
    // The Slate Harbor analyst is invited to Ridgeback.
    const { token } = await invite('analyst@slateharbor.example', 'analyst');
    const client = await context.client();
    const wrong = await client.post(`/api/invitations/${token}/accept`, { name: 'Emery Voss', password: 'not-their-password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toEqual({ password: 'Enter the password of your existing Bellwether account' });
    const right = await client.post(`/api/invitations/${token}/accept`, { name: 'ignored', password: demoPassword });
    expect(right.status).toBe(200);
    expect(right.body.user.name).toBe('Emery Voss');
    expect(right.body.memberships.map((membership: { organizationSlug: string; role: string }) => `${membership.organizationSlug}:${membership.role}`)).toEqual(
      ['ridgeback-timber:analyst', 'slate-harbor:analyst'],
    );
  });

  it('inviting someone who is already an active member answers 409', async () => {
    const answer = await admin.post(`/api/orgs/${ridgebackId}/invitations`, { email: 'manager@ridgeback.example', role: 'analyst' });
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toBe('manager@ridgeback.example is already a member of Ridgeback Timber Co.');
  });

  it('bad invitation input answers 400 naming the fields', async () => {
    const answer = await admin.post(`/api/orgs/${ridgebackId}/invitations`, { email: 'nope', role: 'owner' });
    expect(answer.status).toBe(400);
    expect(Object.keys(answer.body.error.fields).sort()).toEqual(['email', 'role']);
    const accept = await (await context.client()).post(`/api/invitations/${'x'.repeat(43)}/accept`, { name: '', password: 'short' });
    expect(accept.status).toBe(400);
    expect(accept.body.error.fields).toEqual({ name: 'Enter your name', password: 'Use at least 10 characters' });
  });

  it('an unknown invitation token answers 404', async () => {
    const answer = await request(context.app).get(`/api/invitations/${'A'.repeat(43)}`);
    expect(answer.status).toBe(404);
    expect(answer.body.error.code).toBe('not_found');
  });
});
