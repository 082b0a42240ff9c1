import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '@schema/audit';
import type { Db } from '../../backend/src/db/client';
import { recordAudit } from '../../backend/src/services/audit';
import { createTemporaryDatabase } from '../helpers/test-app';

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
    expect(() => db.$client.prepare('delete from audit_events').run()).toThrow(
      'audit_events is append-only: an audit event cannot be deleted',
    );
    expect(db.select().from(auditEvents).all()).toHaveLength(1);
  });
});
