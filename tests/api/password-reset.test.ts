import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '@schema/audit';
import { createTestContext, demoPassword, type TestContext } from '../helpers/test-app';

const resetLink = /http:\/\/bellwether\.test\/reset-password\/([A-Za-z0-9_-]{43})/;

describe('password reset by e-mail', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  async function requestReset(email: string) {
    const client = await context.client();
    const answer = await client.post('/api/auth/forgot-password', { email });
    expect(answer.status).toBe(202);
    const message = await context.mailbox.waitFor((mail) => mail.to === email && mail.subject === 'Reset your Bellwether password');
    context.mailbox.clear();
    return resetLink.exec(message.text)![1];
  }

  it('forgot-password answers 202 for an unknown address and sends nothing to it', async () => {
    const client = await context.client();
    const unknown = await client.post('/api/auth/forgot-password', { email: 'nobody@ridgeback.example' });
    expect(unknown.status).toBe(202);
    // A known address sent afterwards arrives; the unknown one never does.
    await client.post('/api/auth/forgot-password', { email: 'manager@slateharbor.example' });
    await context.mailbox.waitFor((mail) => mail.to === 'manager@slateharbor.example');
    expect(context.mailbox.list().map((mail) => mail.to)).not.toContain('nobody@ridgeback.example');
    context.mailbox.clear();
  });

  it('the e-mailed link sets a new password once; the old password stops working; other sessions end', async () => {
    const email = 'hygienist@ridgeback.example';
    const otherSession = await context.signIn(email);
    const token = await requestReset(email);

    const client = await context.client();
    const reset = await client.post('/api/auth/reset-password', { token, password: 'a-brand-new-password' });
    expect(reset.status).toBe(204);

    expect((await otherSession.get('/api/me')).status).toBe(401);
    const oldPassword = await (await context.client()).post('/api/auth/sign-in', { email, password: demoPassword });
    expect(oldPassword.status).toBe(401);
    await context.signIn(email, 'a-brand-new-password');

    const reused = await (await context.client()).post('/api/auth/reset-password', { token, password: 'yet-another-password' });
    expect(reused.status).toBe(400);
    expect(reused.body.error.fields).toEqual({ token: 'The reset link is invalid, expired or already used' });

    const used = context.db.select().from(auditEvents).where(eq(auditEvents.action, 'password_reset_used')).all();
    expect(used).toHaveLength(1);
    expect(used[0].actorUserId).toBe(otherSession.user.id);
  });

  it('a reset link stops working after one hour', async () => {
    const token = await requestReset('analyst@ridgeback.example');
    context.clock.advance(3_600_000 + 1);
    try {
      const answer = await (await context.client()).post('/api/auth/reset-password', { token, password: 'a-brand-new-password' });
      expect(answer.status).toBe(400);
      expect(answer.body.error.message).toMatch(/invalid, expired or already used/);
    } finally {
      context.clock.advance(-(3_600_000 + 1));
    }
    // The old password still works: nothing changed.
    await context.signIn('analyst@ridgeback.example');
  });

  it('a new password shorter than 10 characters answers 400 naming the field', async () => {
    const answer = await (await context.client()).post('/api/auth/reset-password', { token: 'x'.repeat(43), password: 'short' });
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toEqual({ password: 'Use at least 10 characters' });
  });
});

describe('password reset rate limit', () => {
  it('answers 429 after the configured number of reset e-mails for one address', async () => {
    const context = await createTestContext({
      config: {
        rateLimits: {
          signIn: { limit: 100, windowMs: 60_000 },
          signInPerAddress: { limit: 100, windowMs: 60_000 },
          forgotPassword: { limit: 2, windowMs: 60_000 },
          resetPassword: { limit: 100, windowMs: 60_000 },
        },
      },
    });
    try {
      const client = await context.client();
      const statuses = [];
      for (let attempt = 0; attempt < 3; attempt += 1) {
        statuses.push((await client.post('/api/auth/forgot-password', { email: 'nobody@slateharbor.example' })).status);
      }
      expect(statuses).toEqual([202, 202, 429]);
    } finally {
      await context.close();
    }
  });
});
