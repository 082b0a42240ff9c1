import { and, eq } from 'drizzle-orm';
import { agents } from '@schema/agents';
import { auditEvents } from '@schema/audit';
import { exposureGroups } from '@schema/exposure-groups';
import { importBatches } from '@schema/lab-imports';
import { shiftResults } from '@schema/shift-results';
import { sites } from '@schema/sites';
import { workers } from '@schema/workers';
import type { Db } from '../../backend/src/db/client';

/*
 * Look-ups into a seeded test database by the demo names, so API tests can name "Head sawyer –
 * wood dust" or "RT-011" instead of guessing ids.
 */

export function groupId(db: Db, organizationId: number, name: string): number {
  const row = db
    .select({ id: exposureGroups.id })
    .from(exposureGroups)
    .where(and(eq(exposureGroups.organizationId, organizationId), eq(exposureGroups.name, name)))
    .get();
  if (!row) throw new Error(`No demo group "${name}"`);
  return row.id;
}

export function workerId(db: Db, organizationId: number, code: string): number {
  const row = db
    .select({ id: workers.id })
    .from(workers)
    .where(and(eq(workers.organizationId, organizationId), eq(workers.code, code)))
    .get();
  if (!row) throw new Error(`No demo worker ${code}`);
  return row.id;
}

export function siteId(db: Db, organizationId: number, name: string): number {
  const row = db
    .select({ id: sites.id })
    .from(sites)
    .where(and(eq(sites.organizationId, organizationId), eq(sites.name, name)))
    .get();
  if (!row) throw new Error(`No demo site "${name}"`);
  return row.id;
}

export function agentId(db: Db, organizationId: number, name: string): number {
  const row = db
    .select({ id: agents.id })
    .from(agents)
    .where(and(eq(agents.organizationId, organizationId), eq(agents.name, name)))
    .get();
  if (!row) throw new Error(`No demo agent "${name}"`);
  return row.id;
}

/** Rows in shift_results (all organizations). */
export function resultCount(db: Db): number {
  return db.select().from(shiftResults).all().length;
}

/** Rows in import_batches (all organizations). */
export function batchCount(db: Db): number {
  return db.select().from(importBatches).all().length;
}

/** The audit events about one entity, oldest first. */
export function auditOf(db: Db, entityType: string, entityId: number) {
  return db
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.entityType, entityType), eq(auditEvents.entityId, String(entityId))))
    .all();
}
