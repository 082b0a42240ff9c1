/**
 * The session store (backend/src/middleware/session.ts): a rolling session's stored expiry is written at
 * most once a minute, reads still see the session, and signing out removes it at once.
 */
import { setTimeout as sleep } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../helpers/test-app';

describe('session store', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  const storedExpiries = () => context.db.$client.prepare('SELECT expire FROM sessions ORDER BY sid').all() as Array<{ expire: string }>;

  it('pushes the stored expiry out once, not on every request within a minute', async () => {
    const client = await context.signInAs('analyst');
    expect((await client.get('/api/me')).status).toBe(200);
    const afterFirst = storedExpiries();
    await sleep(25); // a touch now would store a later expiry (cookie expiry = now + max age, in ms)
    for (let i = 0; i < 3; i++) expect((await client.get('/api/me')).status).toBe(200);
    expect(storedExpiries()).toEqual(afterFirst);
  });

  it('signing out deletes the stored session, so the old cookie no longer signs in', async () => {
    const client = await context.signInAs('manager');
    expect((await client.get('/api/me')).status).toBe(200);
    const before = storedExpiries().length;
    expect((await client.post('/api/auth/sign-out')).status).toBeLessThan(300);
    expect(storedExpiries().length).toBe(before - 1);
    expect((await client.get('/api/me')).status).toBe(401);
  });
});
