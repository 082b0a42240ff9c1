import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, demoPassword, type TestContext } from '../helpers/test-app';

function sessionCookie(answer: request.Response): string | undefined {
  const cookies = answer.headers['set-cookie'] as unknown as string[] | undefined;
  return cookies?.find((cookie) => cookie.startsWith('bellwether.sid='));
}
const cookieValue = (cookie: string | undefined) => cookie?.split(';')[0];

describe('sign-in, sessions and CSRF', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext({
      config: {
        rateLimits: {
          signIn: { limit: 3, windowMs: 60_000 },
          signInPerAddress: { limit: 100, windowMs: 60_000 },
          forgotPassword: { limit: 100, windowMs: 60_000 },
          resetPassword: { limit: 100, windowMs: 60_000 },
        },
      },
    });
  });
  afterAll(() => context.close());

  it('GET /api/me answers 401 without a session', async () => {
    const answer = await request(context.app).get('/api/me');
    expect(answer.status).toBe(401);
    expect(answer.body.error.code).toBe('unauthorized');
  });

  it('signing in answers the user, memberships with permissions and a CSRF token, and /api/me then answers 200', async () => {
    const client = await context.client();
    const answer = await client.post('/api/auth/sign-in', { email: 'Analyst@Ridgeback.example ', password: demoPassword });
    expect(answer.status).toBe(200);
    expect(answer.body.user).toEqual({ id: expect.any(Number), email: 'analyst@ridgeback.example', name: 'Jordan Ames' });
    expect(answer.body.user).not.toHaveProperty('passwordHash');
    expect(answer.body.memberships).toEqual([
      expect.objectContaining({ organizationName: 'Ridgeback Timber Co.', organizationSlug: 'ridgeback-timber', role: 'analyst' }),
    ]);
    expect(answer.body.memberships[0].permissions).toContain('decision:approve');
    expect(answer.body.memberships[0].permissions).not.toContain('users:manage');
    expect(typeof answer.body.csrfToken).toBe('string');

    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: answer.body.user, memberships: answer.body.memberships });
  });

  it('the consultant sees both organizations in /api/me', async () => {
    const consultant = await context.signInAs('consultant');
    const me = await consultant.get('/api/me');
    expect(me.body.memberships.map((membership: { organizationName: string }) => membership.organizationName)).toEqual([
      'Ridgeback Timber Co.',
      'Slate Harbor Stoneworks',
    ]);
  });

  it('a wrong password and an unknown e-mail both answer 401 "E-mail or password is wrong"', async () => {
    const client = await context.client();
    const wrongPassword = await client.post('/api/auth/sign-in', { email: 'manager@ridgeback.example', password: 'not-the-password' });
    const unknownEmail = await client.post('/api/auth/sign-in', { email: 'nobody@ridgeback.example', password: demoPassword });
    for (const answer of [wrongPassword, unknownEmail]) {
      expect(answer.status).toBe(401);
      expect(answer.body).toEqual({ error: { code: 'unauthorized', message: 'E-mail or password is wrong' } });
    }
  });

  it('the session id changes at sign-in and the old session cookie does not carry the sign-in', async () => {
    const agent = request.agent(context.app);
    const before = await agent.get('/api/auth/csrf');
    const cookieBefore = cookieValue(sessionCookie(before));
    expect(cookieBefore).toBeDefined();
    const signIn = await agent.post('/api/auth/sign-in').set('X-CSRF-Token', before.body.csrfToken).send({
      email: 'hygienist@ridgeback.example',
      password: demoPassword,
    });
    expect(signIn.status).toBe(200);
    const cookieAfter = cookieValue(sessionCookie(signIn));
    expect(cookieAfter).toBeDefined();
    expect(cookieAfter).not.toBe(cookieBefore);
    // Someone holding the pre-sign-in cookie (session fixation) is not signed in.
    const withOldCookie = await request(context.app).get('/api/me').set('Cookie', cookieBefore!);
    expect(withOldCookie.status).toBe(401);
  });

  it('the session cookie is httpOnly and SameSite=Lax, and not Secure outside production', async () => {
    const answer = await request(context.app).get('/api/auth/csrf');
    const cookie = sessionCookie(answer)!;
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Lax');
    expect(cookie).not.toContain('Secure');
  });

  it('a POST without the X-CSRF-Token header is refused with 403 code "csrf", even with a valid session', async () => {
    const signedIn = await context.signInAs('admin');
    const answer = await signedIn.agent
      .post(`/api/orgs/${context.organizationId('ridgeback')}/invitations`)
      .send({ email: 'forged@elsewhere.example', role: 'admin' });
    expect(answer.status).toBe(403);
    expect(answer.body.error.code).toBe('csrf');
    expect(answer.body.error.message).toContain('X-CSRF-Token');
    const wrongToken = await signedIn.agent.post('/api/auth/sign-out').set('X-CSRF-Token', 'a'.repeat(43));
    expect(wrongToken.status).toBe(403);
    expect(wrongToken.body.error.code).toBe('csrf');
  });

  it('the CSRF token changes at sign-in: the token fetched before no longer works after', async () => {
    const client = await context.client();
    const oldToken = client.csrfToken;
    const signIn = await client.post('/api/auth/sign-in', { email: 'manager@slateharbor.example', password: demoPassword });
    expect(signIn.body.csrfToken).not.toBe(oldToken);
    const withOldToken = await client.agent.post('/api/auth/sign-out').set('X-CSRF-Token', oldToken);
    expect(withOldToken.status).toBe(403);
    const current = await client.agent.get('/api/auth/csrf');
    expect(current.body.csrfToken).toBe(signIn.body.csrfToken);
  });

  it('signing out answers 204 and ends the session', async () => {
    const signedIn = await context.signInAs('manager');
    expect((await signedIn.get('/api/me')).status).toBe(200);
    const answer = await signedIn.post('/api/auth/sign-out');
    expect(answer.status).toBe(204);
    expect((await signedIn.get('/api/me')).status).toBe(401);
  });

  it('bad sign-in input answers 400 naming each field', async () => {
    const client = await context.client();
    const answer = await client.post('/api/auth/sign-in', { email: 'not-an-address', password: '' });
    expect(answer.status).toBe(400);
    expect(answer.body.error.code).toBe('bad_request');
    expect(answer.body.error.fields).toEqual({ email: 'Enter a valid e-mail address', password: 'Enter your password' });
    expect(answer.body.error.message).toContain('email');
    expect(answer.body.error.message).toContain('password');
  });

  it('after 3 failed sign-ins for one e-mail the next attempt answers 429, even with the right password', async () => {
    const client = await context.client();
    const email = 'hygienist@slateharbor.example';
    for (let attempt = 1; attempt <= 3; attempt += 1) {
      const answer = await client.post('/api/auth/sign-in', { email, password: `wrong-${attempt}` });
      expect(answer.status).toBe(401);
    }
    const limited = await client.post('/api/auth/sign-in', { email, password: demoPassword });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(limited.body.error.message).toMatch(/Too many attempts/);
    // Another account from the same address is not affected.
    const other = await client.post('/api/auth/sign-in', { email: 'analyst@slateharbor.example', password: demoPassword });
    expect(other.status).toBe(200);
  });

  it('successful sign-ins do not count towards the limit', async () => {
    for (let attempt = 1; attempt <= 5; attempt += 1) {
      const signedIn = await context.signIn('admin@slateharbor.example');
      expect(signedIn.user.email).toBe('admin@slateharbor.example');
    }
  });
});

describe('session cookie in production', () => {
  it('is Secure when the request arrived over https through a trusted proxy', async () => {
    const context = await createTestContext({ seed: false, capture: false, config: { nodeEnv: 'production', trustProxy: 1 } });
    try {
      const answer = await request(context.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
      expect(answer.status).toBe(200);
      const cookie = sessionCookie(answer)!;
      expect(cookie).toContain('Secure');
      expect(answer.headers['strict-transport-security']).toBeDefined();
    } finally {
      await context.close();
    }
  });
});
