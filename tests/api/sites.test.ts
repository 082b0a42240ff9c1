import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, siteId } from '../helpers/org-data';

describe('sites', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let base: string;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}/sites`;
  });
  afterAll(() => context.close());

  it('a hygienist creates a site; the answer is 201 with the row and the creation is audited', async () => {
    const answer = await hygienist.post(base, { name: 'Ridgeback kiln yard', description: 'Dry kilns and stickers.' });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({ name: 'Ridgeback kiln yard', description: 'Dry kilns and stickers.', archived: false, exposureGroupCount: 0 });
    const events = auditOf(context.db, 'site', answer.body.id);
    expect(events).toEqual([
      expect.objectContaining({
        action: 'created',
        actorUserId: hygienist.user.id,
        after: { name: 'Ridgeback kiln yard', description: 'Dry kilns and stickers.' },
      }),
    ]);
  });

  it('lists with search, sort and pages, and counts the groups in use per site', async () => {
    const all = await hygienist.get(`${base}?sort=-name&pageSize=2`);
    expect(all.status).toBe(200);
    expect(all.body).toMatchObject({ total: 3, page: 1, pageSize: 2, pageCount: 2 });
    expect(all.body.items.map((site: { name: string }) => site.name)).toEqual(['Ridgeback sawmill', 'Ridgeback planing mill']);
    const second = await hygienist.get(`${base}?sort=-name&pageSize=2&page=2`);
    expect(second.body.items.map((site: { name: string }) => site.name)).toEqual(['Ridgeback kiln yard']);
    const search = await hygienist.get(`${base}?q=PLANER`);
    expect(search.body.items).toEqual([expect.objectContaining({ name: 'Ridgeback planing mill', exposureGroupCount: 3 })]);
  });

  it('bad query parameters answer 400 naming the parameter', async () => {
    const sort = await hygienist.get(`${base}?sort=colour`);
    expect(sort.status).toBe(400);
    expect(sort.body.error.fields).toEqual({ sort: 'Sort by one of name, createdAt, updatedAt (prefix - for descending)' });
    const size = await hygienist.get(`${base}?pageSize=500`);
    expect(size.body.error.fields).toEqual({ pageSize: 'Use at most 200' });
  });

  it('a blank name answers 400 naming the field; a duplicate name answers 409 naming the site', async () => {
    const blank = await hygienist.post(base, { name: '  ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.fields).toEqual({ name: 'Enter a name' });
    const duplicate = await hygienist.post(base, { name: 'Ridgeback sawmill' });
    expect(duplicate.status).toBe(409);
    expect(duplicate.body.error.message).toMatch(/A site named "Ridgeback sawmill" already exists/);
  });

  it('edits a site, audited with before and after', async () => {
    const id = siteId(context.db, ridgeback, 'Ridgeback planing mill');
    const answer = await hygienist.patch(`${base}/${id}`, { description: 'Planer line and sheds.' });
    expect(answer.status).toBe(200);
    expect(answer.body.description).toBe('Planer line and sheds.');
    expect(auditOf(context.db, 'site', id).at(-1)).toMatchObject({
      action: 'updated',
      before: { description: 'Planer line, grading and packaging, lumber yard and sheds.' },
      after: { description: 'Planer line and sheds.' },
    });
  });

  it('a site with groups in use is not archived (409); an empty one is archived, hidden from the default list, and brought back', async () => {
    const busy = siteId(context.db, ridgeback, 'Ridgeback sawmill');
    const refused = await hygienist.post(`${base}/${busy}/archive`, {});
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('Site "Ridgeback sawmill" still has 5 exposure groups in use: archive them first');

    const created = await hygienist.post(base, { name: 'Old log yard' });
    const archived = await hygienist.post(`${base}/${created.body.id}/archive`, { reason: 'Closed in 2024' });
    expect(archived.status).toBe(200);
    expect(archived.body.archived).toBe(true);
    expect(auditOf(context.db, 'site', created.body.id).at(-1)).toMatchObject({ action: 'archived', reason: 'Closed in 2024' });
    const inUse = await hygienist.get(base);
    expect(inUse.body.items.map((site: { name: string }) => site.name)).not.toContain('Old log yard');
    const onlyArchived = await hygienist.get(`${base}?archived=true`);
    expect(onlyArchived.body.items.map((site: { name: string }) => site.name)).toEqual(['Old log yard']);
    const back = await hygienist.post(`${base}/${created.body.id}/unarchive`, {});
    expect(back.body.archived).toBe(false);
  });

  it('reads one site; a malformed id answers 400 naming siteId', async () => {
    const id = siteId(context.db, ridgeback, 'Ridgeback sawmill');
    const answer = await hygienist.get(`${base}/${id}`);
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ id, name: 'Ridgeback sawmill', exposureGroupCount: 5 });
    const malformed = await hygienist.get(`${base}/sawmill`);
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toEqual({ siteId: 'Invalid input: expected number, received NaN' });
  });

  it('another organization’s site answers 404 for reads and writes', async () => {
    const other = siteId(context.db, slateHarbor, 'Fabrication shop');
    expect((await hygienist.get(`${base}/${other}`)).status).toBe(404);
    expect((await hygienist.patch(`${base}/${other}`, { name: 'Taken over' })).status).toBe(404);
    expect((await hygienist.post(`${base}/${other}/archive`, {})).status).toBe(404);
  });

  it('a manager may read sites but not create or edit them (403)', async () => {
    const manager = await context.signInAs('manager');
    expect((await manager.get(base)).status).toBe(200);
    const answer = await manager.post(base, { name: 'Manager’s site' });
    expect(answer.status).toBe(403);
    expect(answer.body.error.message).toBe('Your role (manager) does not allow this (needs data:edit)');
  });
});
