import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, type AuditEventView } from '@schema/audit';
import type { ListPage } from '@schema/list-query';
import type { Role } from '@schema/permissions';
import type { Db } from '../../backend/src/db/client';
import { recordAudit } from '../../backend/src/services/audit';
import { csvSafeCell } from '../../backend/src/services/audit-trail';
import { createTemporaryDatabase, createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

describe('the audit trail is append-only in the database itself', () => {
  let temporary: ReturnType<typeof createTemporaryDatabase>;
  let db: Db;
  beforeAll(() => {
    temporary = createTemporaryDatabase();
    db = temporary.db;
  });
  afterAll(() => temporary.close());

  it('recordAudit appends an event with its time, before and after', () => {
    recordAudit(db, {
      organizationId: null,
      actorUserId: null,
      entityType: 'test',
      entityId: '1',
      action: 'created',
      reason: 'checking the trail',
      before: null,
      after: { value: 1 },
      at: new Date('2025-01-02T03:04:05.000Z'),
    });
    const rows = db.select().from(auditEvents).where(eq(auditEvents.entityType, 'test')).all();
    expect(rows).toEqual([
      expect.objectContaining({ action: 'created', reason: 'checking the trail', before: null, after: { value: 1 }, at: '2025-01-02T03:04:05.000Z' }),
    ]);
  });

  it('an UPDATE of an audit event is refused by the trigger', () => {
    expect(() => db.$client.prepare(`update audit_events set action = 'forged'`).run()).toThrow(
      'audit_events is append-only: an audit event cannot be changed',
    );
    expect(() => db.update(auditEvents).set({ reason: 'rewritten' }).run()).toThrow(/append-only/);
  });

  it('a DELETE of an audit event is refused by the trigger', () => {
    expect(() => db.$client.prepare('delete from audit_events').run()).toThrow('audit_events is append-only: an audit event cannot be deleted');
    expect(db.select().from(auditEvents).all()).toHaveLength(1);
  });
});

describe('the audit trail page API (admins and consultants)', () => {
  let context: TestContext;
  let ridgeback: number;
  let admin: SignedIn;
  let consultant: SignedIn;
  let hygienist: SignedIn;
  const base = () => `/api/orgs/${ridgeback}`;
  const entityType = 'audit_page_check';

  /** Six events of one entity type at known times, by two people, with awkward reasons. */
  function seedEvents(): void {
    const events: Array<{ actor: SignedIn; day: string; action: string; reason: string | null }> = [
      { actor: admin, day: '2025-01-10', action: 'created', reason: null },
      { actor: hygienist, day: '2025-01-11', action: 'edited', reason: 'Corrected the flow rate, "as read" on the rotameter\nsecond line' },
      { actor: hygienist, day: '2025-01-12', action: 'edited', reason: '=HYPERLINK("http://bad.example","open")' },
      { actor: admin, day: '2025-01-13', action: 'edited', reason: '+1 day, per site note' },
      { actor: hygienist, day: '2025-01-14', action: 'edited', reason: '@SUM(A1:A3)' },
      { actor: admin, day: '2025-01-15', action: 'archived', reason: '-2 duplicates, kept one' },
    ];
    events.forEach((event, index) =>
      recordAudit(context.db, {
        organizationId: ridgeback,
        actorUserId: event.actor.user.id,
        entityType,
        entityId: String(100 + index),
        action: event.action,
        reason: event.reason,
        before: index === 0 ? null : { flowRate: 2 + index },
        after: { flowRate: 3 + index, note: 'plain' },
        at: new Date(`${event.day}T12:00:00.000Z`),
      }),
    );
  }

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    [admin, consultant, hygienist] = await Promise.all([context.signInAs('admin'), context.signInAs('consultant'), context.signInAs('hygienist')]);
    seedEvents();
  });
  afterAll(async () => {
    await context.close();
  });

  it('lists an action taken through the API, newest first, with who did it, before/after and the reason', async () => {
    const created = await admin.post(`${base()}/sites`, { name: 'Audit check yard', description: '' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const answer = await consultant.get(`${base()}/audit-events?entityType=site&person=${admin.user.id}`);
    expect(answer.status).toBe(200);
    const page = answer.body as ListPage<AuditEventView>;
    expect(page.items[0]).toMatchObject({
      actor: { id: admin.user.id, name: 'Morgan Pike', email: 'admin@ridgeback.example' },
      entityType: 'site',
      entityId: String(created.body.id),
      action: 'created',
    });
    const times = (await admin.get(`${base()}/audit-events?pageSize=200`)).body.items.map((event: AuditEventView) => event.at);
    expect(times).toEqual([...times].sort().reverse());
  });

  it('filters by person, entity type and inclusive UTC dates, and pages on the server', async () => {
    const byHygienist = (await admin.get(`${base()}/audit-events?entityType=${entityType}&person=${hygienist.user.id}`)).body as ListPage<AuditEventView>;
    expect(byHygienist.items.map((event) => event.entityId)).toEqual(['104', '102', '101']);
    expect(byHygienist.total).toBe(3);

    const dated = (await admin.get(`${base()}/audit-events?entityType=${entityType}&from=2025-01-11&to=2025-01-13`)).body as ListPage<AuditEventView>;
    expect(dated.items.map((event) => event.at)).toEqual(['2025-01-13T12:00:00.000Z', '2025-01-12T12:00:00.000Z', '2025-01-11T12:00:00.000Z']);

    const second = (await admin.get(`${base()}/audit-events?entityType=${entityType}&page=2&pageSize=4`)).body as ListPage<AuditEventView>;
    expect(second).toMatchObject({ total: 6, page: 2, pageSize: 4, pageCount: 2 });
    expect(second.items.map((event) => event.entityId)).toEqual(['101', '100']);
    expect(second.items[0]).toMatchObject({ before: { flowRate: 3 }, after: { flowRate: 4, note: 'plain' } });

    const filters = (await consultant.get(`${base()}/audit-filters`)).body as { people: Array<{ id: number }>; entityTypes: string[] };
    expect(filters.entityTypes).toContain(entityType);
    expect(filters.people.map((person) => person.id)).toEqual(expect.arrayContaining([admin.user.id, hygienist.user.id]));
  });

  it('refuses a bad filter with a message naming the parameter', async () => {
    const reversed = await admin.get(`${base()}/audit-events?from=2025-02-01&to=2025-01-01`);
    expect(reversed.status).toBe(400);
    expect(reversed.body.error.fields).toEqual({ from: 'The "from" date must not be after the "to" date' });
    const badDate = await admin.get(`${base()}/audit-events.csv?to=13/01/2025`);
    expect(badDate.status).toBe(400);
    expect(badDate.body.error.fields).toEqual({ to: 'Use a date written YYYY-MM-DD' });
    expect((await admin.get(`${base()}/audit-events?pageSize=1000`)).status).toBe(400);
  });

  it('exports the filtered events as quoted CSV with formula-like cells neutralised', async () => {
    const answer = await consultant.get(`${base()}/audit-events.csv?entityType=${entityType}&from=2025-01-11`);
    expect(answer.status).toBe(200);
    expect(answer.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(answer.headers['content-disposition']).toBe('attachment; filename="audit-trail-ridgeback-timber-2025-03-03.csv"');
    const parsed = Papa.parse<string[]>(answer.text, { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual(['at', 'person', 'personEmail', 'entityType', 'entityId', 'action', 'reason', 'before', 'after']);
    expect(rows.map((row) => row[4])).toEqual(['105', '104', '103', '102', '101']);
    const reasonOf = (id: string) => rows.find((row) => row[4] === id)![6];
    // Quotes, a comma and a line break survive the round trip (RFC 4180 quoting).
    expect(reasonOf('101')).toBe('Corrected the flow rate, "as read" on the rotameter\nsecond line');
    expect(answer.text).toContain('"Corrected the flow rate, ""as read"" on the rotameter');
    // OWASP CSV injection guidance: cells starting with = + - @ get a leading single quote.
    expect(reasonOf('102')).toBe(`'=HYPERLINK("http://bad.example","open")`);
    expect(reasonOf('103')).toBe("'+1 day, per site note");
    expect(reasonOf('104')).toBe("'@SUM(A1:A3)");
    expect(reasonOf('105')).toBe("'-2 duplicates, kept one");
    expect(rows[0]!.slice(1, 3)).toEqual(['Morgan Pike', 'admin@ridgeback.example']);
    expect(JSON.parse(rows[0]![8]!)).toEqual({ flowRate: 8, note: 'plain' });
    expect([csvSafeCell('plain'), csvSafeCell('\tTAB'), csvSafeCell('\rCR'), csvSafeCell('a=b')]).toEqual(['plain', "'\tTAB", "'\rCR", 'a=b']);
  });

  it('lets admins and consultants read the trail and refuses the other roles; another organization is a 404', async () => {
    const paths = ['/audit-events', '/audit-events.csv', '/audit-filters'];
    const expected: Record<Role, number> = { admin: 200, consultant: 200, hygienist: 403, analyst: 403, manager: 403 };
    for (const [role, status] of Object.entries(expected) as Array<[Role, number]>) {
      const client = await context.signInAs(role);
      for (const path of paths) expect([role, path, (await client.get(`${base()}${path}`)).status]).toEqual([role, path, status]);
    }
    const slateHarbor = context.organizationId('slateHarbor');
    for (const path of paths) expect((await admin.get(`/api/orgs/${slateHarbor}${path}`)).status).toBe(404);
    expect((await (await context.client()).get(`${base()}/audit-events`)).status).toBe(401);
  });
});
