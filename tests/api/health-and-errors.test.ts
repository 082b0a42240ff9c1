import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../helpers/test-app';

describe('health, unknown routes and request errors', () => {
  let context: TestContext;
  const emptyClientFolder = mkdtempSync(join(tmpdir(), 'bellwether-no-client-'));

  beforeAll(async () => {
    context = await createTestContext({ seed: false, config: { clientDir: emptyClientFolder, jsonLimit: '1kb' } });
  });
  afterAll(async () => {
    await context.close();
    rmSync(emptyClientFolder, { recursive: true, force: true });
  });

  it('GET /api/health answers 200 { ok: true } with the applied migrations when the database answers', async () => {
    const answer = await request(context.app).get('/api/health');
    expect(answer.status).toBe(200);
    const applied = (context.db.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n;
    expect(applied).toBeGreaterThan(0);
    expect(answer.body).toEqual({ ok: true, database: { migrations: applied } });
  });

  it('answers with a Content Security Policy that allows only our own scripts', async () => {
    const answer = await request(context.app).get('/api/health');
    const policy = answer.headers['content-security-policy'];
    expect(policy).toContain("script-src 'self'");
    expect(policy).toContain("style-src 'self' 'unsafe-inline'");
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).not.toMatch(/script-src[^;]*unsafe-inline/);
  });

  it('an unknown API path answers 404 in the JSON error shape', async () => {
    const answer = await request(context.app).get('/api/no-such-thing');
    expect(answer.status).toBe(404);
    expect(answer.body).toEqual({ error: { code: 'not_found', message: 'No API endpoint GET /api/no-such-thing' } });
  });

  it('a body that is not JSON answers 400 saying so', async () => {
    const client = await context.client();
    const answer = await client.agent
      .post('/api/auth/sign-in')
      .set('X-CSRF-Token', client.csrfToken)
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(answer.status).toBe(400);
    expect(answer.body.error).toEqual({ code: 'bad_request', message: 'The request body is not valid JSON' });
  });

  it('a body over the JSON limit answers 413 naming the limit', async () => {
    const client = await context.client();
    const answer = await client.post('/api/auth/sign-in', { email: 'a@b.example', password: 'x'.repeat(2000) });
    expect(answer.status).toBe(413);
    expect(answer.body.error.code).toBe('payload_too_large');
    expect(answer.body.error.message).toContain('1kb');
  });

  it('without a built client, pages answer 503 saying the client has not been built', async () => {
    const answer = await request(context.app).get('/groups/12');
    expect(answer.status).toBe(503);
    expect(answer.text).toContain('The client has not been built yet');
  });

  it('GET /api/health answers 503 { ok: false, reason } when the database cannot answer', async () => {
    const broken = await createTestContext({ seed: false, capture: false });
    broken.db.$client.close();
    const answer = await request(broken.app).get('/api/health');
    expect(answer.status).toBe(503);
    expect(answer.body).toEqual({ ok: false, reason: 'the database cannot answer: The database connection is not open' });
    await broken.close();
  });

  it('GET /api/health answers 503 naming the missing migrations when the database is behind this build', async () => {
    const behind = await createTestContext({ seed: false, capture: false });
    try {
      const applied = (behind.db.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n;
      behind.db.$client.prepare('delete from __drizzle_migrations where rowid = (select max(rowid) from __drizzle_migrations)').run();
      const answer = await request(behind.app).get('/api/health');
      expect(answer.status).toBe(503);
      expect(answer.body).toEqual({ ok: false, reason: `${applied - 1} of ${applied} migrations applied: run npm run db:migrate` });
    } finally {
      await behind.close();
    }
  });
});
