import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultRateLimits } from '../../backend/src/config';
import { createTestContext, demoPassword, type TestContext } from '../helpers/test-app';

/*
 * Security headers on API answers and pages (OWASP Secure Headers Project, common practice), and
 * the rate limits on sign-in and password reset with small limits set for the test. Session id
 * rotation and CSRF are in sign-in.test.ts and route-inventory.test.ts.
 */

describe('security headers', () => {
  let context: TestContext;
  const clientFolder = mkdtempSync(join(tmpdir(), 'bellwether-client-'));

  beforeAll(async () => {
    mkdirSync(clientFolder, { recursive: true });
    writeFileSync(join(clientFolder, 'index.html'), '<!doctype html><title>Bellwether</title>');
    context = await createTestContext({ seed: false, capture: false, config: { clientDir: clientFolder } });
  });
  afterAll(async () => {
    await context?.close();
    rmSync(clientFolder, { recursive: true, force: true });
  });

  it.each(['/api/health', '/api/no-such-endpoint', '/sign-in', '/orgs/1/exposure-groups'])(
    '%s carries the CSP, nosniff, frame, referrer headers and no X-Powered-By',
    async (path) => {
      const answer = await request(context.app).get(path);
      const policy = answer.headers['content-security-policy'] as string;
      expect(policy).toContain("default-src 'self'");
      expect(policy).toContain("script-src 'self'");
      expect(policy).toContain("script-src-attr 'none'");
      expect(policy).toContain("object-src 'none'");
      expect(policy).toContain("frame-ancestors 'none'");
      expect(policy).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
      expect(answer.headers['x-content-type-options']).toBe('nosniff');
      expect(answer.headers['x-frame-options']).toBe('SAMEORIGIN');
      expect(answer.headers['referrer-policy']).toBe('no-referrer');
      expect(answer.headers['x-powered-by']).toBeUndefined();
    },
  );

  it('API answers are never cached', async () => {
    const answer = await request(context.app).get('/api/health');
    expect(answer.headers['cache-control']).toBe('no-store');
  });
});

describe('rate limits on sign-in and password reset', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext({
      capture: false,
      config: {
        rateLimits: {
          ...defaultRateLimits,
          signIn: { limit: 100, windowMs: 60_000 },
          signInPerAddress: { limit: 3, windowMs: 60_000 },
          resetPassword: { limit: 2, windowMs: 60_000 },
        },
      },
    });
  }, 60_000);
  afterAll(() => context?.close());

  it('failed sign-ins from one address across different e-mails answer 429 after the per-address limit', async () => {
    const client = await context.client();
    const statuses: number[] = [];
    for (const email of ['a@ridgeback.example', 'b@ridgeback.example', 'c@ridgeback.example', 'analyst@ridgeback.example']) {
      statuses.push(
        (await client.post('/api/auth/sign-in', { email, password: email === 'analyst@ridgeback.example' ? demoPassword : 'wrong-password' })).status,
      );
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
  });

  it('failed password resets from one address answer 429 after the limit, naming the wait', async () => {
    const client = await context.client();
    const statuses: number[] = [];
    let last: request.Response | undefined;
    for (let attempt = 0; attempt < 3; attempt += 1) {
      last = await client.post('/api/auth/reset-password', { token: 'x'.repeat(43), password: 'a-long-enough-password' });
      statuses.push(last.status);
    }
    expect(statuses).toEqual([400, 400, 429]);
    expect(last!.body.error).toEqual({ code: 'rate_limited', message: 'Too many attempts. Wait 1 minutes and try again.' });
  });
});
