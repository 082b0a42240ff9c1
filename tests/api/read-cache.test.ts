/**
 * Cached answers of the dashboard and the exposure-group list (backend/src/middleware/read-cache.ts):
 * the same bytes while nothing changes (ETag, 304 on revalidation, gzip when accepted), and fresh figures
 * after a write through the API or a commit by another connection to the same file.
 */
import BetterSqlite3 from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrganizationDashboard } from '@schema/dashboard';
import { groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

describe('cached read answers', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;

  beforeAll(async () => {
    context = await createTestContext({ capture: false });
    ridgeback = context.organizationId('ridgeback');
    hygienist = await context.signInAs('hygienist');
  }, 60_000);
  afterAll(() => context.close());

  it('answers the same dashboard with one ETag, and 304 when the browser already has it', async () => {
    const first = await hygienist.get(`/api/orgs/${ridgeback}/dashboard`);
    const second = await hygienist.get(`/api/orgs/${ridgeback}/dashboard`);
    expect(first.status).toBe(200);
    expect(first.headers.etag).toMatch(/^W\/".+"$/);
    expect(second.headers.etag).toBe(first.headers.etag);
    expect(second.body).toEqual(first.body);
    const revalidated = await hygienist.get(`/api/orgs/${ridgeback}/dashboard`).set('If-None-Match', first.headers.etag);
    expect(revalidated.status).toBe(304);
  });

  it('sends gzip to a client that accepts it and plain JSON to one that does not', async () => {
    const zipped = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups`).set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body.total).toBeGreaterThan(0);
    const plain = await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups`).set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers['content-type']).toMatch(/^application\/json/);
    expect(plain.body).toEqual(zipped.body);
  });

  it('shows a result entered through the API at once in the dashboard and the group list', async () => {
    const forklift = groupId(context.db, ridgeback, 'Forklift driver – noise');
    const countOf = (dashboard: OrganizationDashboard) => dashboard.groups.find((group) => group.id === forklift)!.validResults;
    const listCount = async () =>
      ((await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups?q=Forklift`)).body.items as Array<{ id: number; validResultCount: number }>).find(
        (group) => group.id === forklift,
      )!.validResultCount;
    const before = (await hygienist.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    const listedBefore = await listCount();
    const added = await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, {
      exposureGroupId: forklift,
      workerId: workerId(context.db, ridgeback, 'RT-014'),
      date: '2025-02-18',
      value: 60,
    });
    expect(added.status).toBe(201);
    const after = (await hygienist.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(countOf(after)).toBe(countOf(before) + 1);
    expect(await listCount()).toBe(listedBefore + 1);
  });

  it('sees a commit by another connection to the same database file', async () => {
    const before = (await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups?q=Saw%20filer`)).body.items as Array<{ id: number; name: string }>;
    const other = new BetterSqlite3(context.config.databasePath);
    try {
      other.prepare('UPDATE exposure_groups SET name = ? WHERE id = ?').run('Saw filer – noise (renamed elsewhere)', before[0].id);
    } finally {
      other.close();
    }
    const after = (await hygienist.get(`/api/orgs/${ridgeback}/exposure-groups?q=Saw%20filer`)).body.items as Array<{ id: number; name: string }>;
    expect(after.find((group) => group.id === before[0].id)?.name).toBe('Saw filer – noise (renamed elsewhere)');
  });
});
