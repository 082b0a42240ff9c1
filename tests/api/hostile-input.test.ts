import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../backend/src/routes';
import { agentId, groupId, siteId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

/*
 * Hostile input (OWASP Top 10 A03 "Injection", common practice): SQL-injection strings and script
 * payloads go into every free-text field of the create routes and into every list's search, filter
 * and sort parameter. Text must be stored verbatim (it is data, not code), no table may be dropped,
 * and a sort outside the allowed list is a 400 that says which values are allowed. The browser half
 * (the stored payloads shown as inert text) is tests/e2e/hostile-input.test.ts.
 */

/** Payloads stored as text; each must come back byte for byte. */
export const hostilePayloads = [
  "'; DROP TABLE shift_results; --",
  '" OR 1=1 --',
  '<script>window.__bellwetherInjected = 1</script>',
  '<img src=x onerror="window.__bellwetherInjected = 1">',
  'javascript:window.__bellwetherInjected=1',
] as const;

/** Filter and sort names tried on every list (unknown names are ignored by the list's schema). */
const listParameters = [
  'q',
  'sort',
  'archived',
  'kind',
  'status',
  'source',
  'jobTitle',
  'groupId',
  'workerId',
  'siteId',
  'agentId',
  'from',
  'to',
  'memberOn',
  'judgement',
  'category',
];

describe('hostile text in every field and filter', () => {
  let context: TestContext;
  let hygienist: SignedIn;
  let analyst: SignedIn;
  let admin: SignedIn;
  let ridgeback: number;
  let base: string;
  let tablesBefore: string[];
  let resultsBefore: number;

  const tables = () =>
    (context.db.$client.prepare("select name from sqlite_master where type = 'table' order by name").all() as Array<{ name: string }>).map((row) => row.name);
  const shiftResultCount = () => (context.db.$client.prepare('select count(*) as n from shift_results').get() as { n: number }).n;

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    base = `/api/orgs/${ridgeback}`;
    hygienist = await context.signInAs('hygienist');
    analyst = await context.signInAs('analyst');
    admin = await context.signInAs('admin');
    tablesBefore = tables();
    resultsBefore = shiftResultCount();
    // Seeding hashes passwords and writes the demo: allow for a busy machine.
  }, 60_000);
  afterAll(() => context.close());

  /** Posts `body`, expects 201/200, and checks each named field came back verbatim. */
  async function createVerbatim(path: string, body: Record<string, unknown>, textFields: readonly string[], expected = 201) {
    const answer = await hygienist.post(path, body);
    expect(answer.status, `${path}: ${JSON.stringify(answer.body)}`).toBe(expected);
    for (const field of textFields) expect(answer.body[field], `${path} ${field}`).toEqual(body[field]);
    return answer.body as Record<string, unknown> & { id: number };
  }

  it.each(hostilePayloads.map((payload, index) => ({ payload, index })))(
    'stores $payload verbatim in sites, agents, OELs, groups, workers and plans',
    async ({ payload, index }) => {
      const site = await createVerbatim(`${base}/sites`, { name: payload, description: payload }, ['name', 'description']);
      expect((await hygienist.get(`${base}/sites/${site.id}`)).body).toMatchObject({ name: payload, description: payload });

      const agent = await createVerbatim(`${base}/agents`, { name: payload, kind: 'chemical', notes: payload }, ['name', 'notes']);
      await createVerbatim(`${base}/oel-entries`, { agentId: agent.id, source: payload, value: 1, unit: 'mg/m3', averagingTime: '8h-twa', notes: payload }, [
        'source',
        'notes',
      ]);

      const groupText = { name: payload, processArea: payload, tasks: payload, oelSource: payload, exposureProfile: payload };
      const group = await createVerbatim(
        `${base}/exposure-groups`,
        { ...groupText, siteId: site.id, agentId: agent.id, jobTitles: [payload], oelValue: 1, oelUnit: 'mg/m3', oelAveragingTime: '8h-twa' },
        [...Object.keys(groupText), 'jobTitles'],
      );
      expect((await hygienist.get(`${base}/exposure-groups/${group.id}`)).body).toMatchObject(groupText);

      const worker = await createVerbatim(`${base}/workers`, { code: `HX-${index}`, name: payload, jobTitle: payload }, ['name', 'jobTitle']);
      // A worker code has a pattern: a payload there is refused naming the field, not stored.
      const badCode = await hygienist.post(`${base}/workers`, { code: payload });
      expect(badCode.status).toBe(400);
      expect(Object.keys(badCode.body.error.fields)).toEqual(['code']);

      await createVerbatim(
        `${base}/exposure-groups/${group.id}/sampling-plans`,
        { title: payload, notes: payload, startDate: '2025-01-06', endDate: '2025-01-31', targetCount: 3 },
        ['title', 'notes'],
      );
      const archived = await hygienist.post(`${base}/workers/${worker.id}/archive`, { reason: payload });
      expect(archived.status, JSON.stringify(archived.body)).toBe(200);
      expect(archived.body.archived).toBe(true);
      // The reason goes to the audit trail, verbatim.
      const audited = context.db.$client
        .prepare('select count(*) as n from audit_events where entity_id = ? and reason = ?')
        .get(String(worker.id), payload) as { n: number };
      expect(audited.n).toBe(1);
    },
  );

  it('stores hostile void reasons, mask reasons, rationales and comments verbatim', async () => {
    const woodDust = groupId(context.db, ridgeback, 'Head sawyer – wood dust');
    const results = await hygienist.get(`${base}/shift-results?groupId=${woodDust}&pageSize=10`);
    const resultIds = (results.body.items as Array<{ id: number }>).map((item) => item.id);
    const logs = await hygienist.get(`${base}/noise-logs`);
    const logId = (logs.body.items as Array<{ id: number }>)[0].id;
    for (const [index, payload] of hostilePayloads.entries()) {
      const voided = await hygienist.post(`${base}/shift-results/${resultIds[index]}/void`, { reason: payload });
      expect(voided.status, JSON.stringify(voided.body)).toBe(200);
      expect(voided.body.voidReason).toBe(payload);
      const mask = await hygienist.post(`${base}/noise-logs/${logId}/masks`, { startS: index * 60, endS: index * 60 + 30, reason: payload });
      expect(mask.status, JSON.stringify(mask.body)).toBe(201);
      expect(JSON.stringify(mask.body)).toContain(JSON.stringify(payload).slice(1, -1));
    }
    const stored = context.db.$client.prepare('select reason from noise_masks where noise_log_id = ? order by id').all(logId) as Array<{ reason: string }>;
    for (const payload of hostilePayloads) expect(stored.map((row) => row.reason)).toContain(payload);

    const rationale = hostilePayloads.join('\n');
    const draft = await hygienist.post(`${base}/exposure-groups/${woodDust}/decision-records`, { rationale, actions: rationale });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    expect(draft.body).toMatchObject({ rationale, actions: rationale });
    for (const payload of hostilePayloads) {
      const comment = await analyst.post(`${base}/decision-records/${draft.body.id}/comments`, { body: payload });
      expect(comment.status, JSON.stringify(comment.body)).toBe(201);
    }
    const comments = context.db.$client.prepare('select body from decision_comments where decision_record_id = ? order by id').all(draft.body.id) as Array<{
      body: string;
    }>;
    expect(comments.map((row) => row.body)).toEqual([...hostilePayloads]);
  });

  it('a search for an injection string finds only the rows that contain it, never every row', async () => {
    const payload = '" OR 1=1 --';
    const sites = await hygienist.get(`${base}/sites`).query({ q: payload, archived: 'all' });
    expect(sites.status).toBe(200);
    expect(sites.body.items.length).toBeGreaterThan(0);
    for (const item of sites.body.items as Array<{ name: string; description: string }>) expect(`${item.name} ${item.description}`).toContain(payload);
    const everything = await hygienist.get(`${base}/sites`).query({ archived: 'all' });
    expect(sites.body.total).toBeLessThan(everything.body.total);
    const workers = await hygienist.get(`${base}/workers`).query({ q: "' OR '1'='1" });
    expect(workers.status).toBe(200);
    expect(workers.body.total).toBe(0);
  });

  // Every GET list in the inventory (no id in its path besides the organization), every parameter.
  const listRoutes = apiRoutes.filter((route) => route.method === 'get' && route.access === 'organization' && !/:(?!orgId)/.test(route.path));

  for (const route of listRoutes) {
    it(`GET ${route.path}: hostile search, filter and sort values answer 200 or a clear 400, never 500`, async () => {
      const path = `/api${route.path.replace(':orgId', String(ridgeback))}`;
      // The admin holds every permission, so every list answers.
      const client = admin;
      const plain = await client.get(path);
      expect(plain.status, JSON.stringify(plain.body)).toBe(200);
      for (const parameter of listParameters) {
        for (const payload of hostilePayloads) {
          const answer = await client.get(path).query({ [parameter]: payload });
          expect([200, 400], `${parameter}=${payload}: ${answer.status} ${JSON.stringify(answer.body)}`).toContain(answer.status);
          if (answer.status === 400) {
            expect(answer.body.error.code).toBe('bad_request');
            expect(Object.keys(answer.body.error.fields ?? {}), `${parameter}: the error names the parameter`).toContain(parameter);
          }
          if (parameter === 'sort') {
            // A list that sorts refuses a value outside its list; one that does not sort ignores it entirely.
            if (answer.status === 400) expect(answer.body.error.fields.sort).toMatch(/^Sort by one of /);
            else expect(answer.body).toEqual(plain.body);
          }
        }
      }
    });
  }

  it.each(['sites', 'agents', 'oel-entries', 'exposure-groups', 'workers', 'shift-results'])(
    'GET %s with a sort outside the allowed list answers 400 naming the allowed fields',
    async (list) => {
      for (const payload of hostilePayloads) {
        const answer = await hygienist.get(`${base}/${list}`).query({ sort: payload });
        expect(answer.status).toBe(400);
        expect(answer.body.error.fields.sort).toMatch(/^Sort by one of [a-zA-Z]+(, [a-zA-Z]+)+ \(prefix - for descending\)$/);
      }
    },
  );

  it('no table was dropped and no result was lost', () => {
    expect(tables()).toEqual(tablesBefore);
    expect(tablesBefore).toContain('shift_results');
    // Results were voided above, never deleted.
    expect(shiftResultCount()).toBe(resultsBefore);
  });

  it('the demo lookups still work after the payloads (the schema is intact)', () => {
    expect(siteId(context.db, ridgeback, 'Ridgeback sawmill')).toBeGreaterThan(0);
    expect(agentId(context.db, ridgeback, 'Inhalable wood dust')).toBeGreaterThan(0);
  });
});
