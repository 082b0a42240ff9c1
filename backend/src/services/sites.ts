import { and, count, eq, sql } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import type { ListPage, SiteListQuery } from '@schema/list-query';
import { sites, type Site, type SiteCreate, type SiteUpdate } from '@schema/sites';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict } from '../errors';
import { saveAuditedChange, audit, changedFields, ownedOrNotFound, sameNameRow, type Actor, type Tx } from './changes';
import { archivedCondition, orderBy, pageOf, pageWindow, qualified, searchCondition } from './list';

/** A site with the number of its exposure groups in use. */
export type SiteView = Site & { exposureGroupCount: number };

const activeGroupCount = sql<number>`(select count(*) from ${exposureGroups} where ${qualified(exposureGroups.siteId)} = ${qualified(sites.id)} and ${qualified(exposureGroups.archived)} = 0)`;

/** Sites of the organization: search in name and description, sort, page, archived filter. */
export function listSites(db: Db, organizationId: number, query: SiteListQuery): ListPage<SiteView> {
  const where = and(
    eq(sites.organizationId, organizationId),
    archivedCondition(query.archived, sites.archived),
    searchCondition(query.q, [sites.name, sites.description]),
  );
  const total = db.select({ total: count() }).from(sites).where(where).get()?.total ?? 0;
  const { limit, offset } = pageWindow(query.page, query.pageSize);
  const items = db
    .select({ site: sites, exposureGroupCount: activeGroupCount })
    .from(sites)
    .where(where)
    .orderBy(...orderBy(query.sort, { name: sites.name, createdAt: sites.createdAt, updatedAt: sites.updatedAt }, sites.id))
    .limit(limit)
    .offset(offset)
    .all()
    .map((row) => ({ ...row.site, exposureGroupCount: row.exposureGroupCount }));
  return pageOf(items, total, query.page, query.pageSize);
}

/** The site, or 404 (also for another organization's site). */
export function findSite(db: Tx, organizationId: number, siteId: number): Site {
  return ownedOrNotFound(db, sites, organizationId, siteId, 'site');
}

export function getSite(db: Db, organizationId: number, siteId: number): SiteView {
  const site = findSite(db, organizationId, siteId);
  const row = db.select({ exposureGroupCount: activeGroupCount }).from(sites).where(eq(sites.id, site.id)).get();
  return { ...site, exposureGroupCount: row?.exposureGroupCount ?? 0 };
}

function checkNameFree(db: Tx, organizationId: number, name: string, exceptId?: number): void {
  const clash = sameNameRow(db, sites, organizationId, name, exceptId);
  if (clash !== undefined) throw new Conflict(`A site named "${name}" already exists in this organization (site ${clash})`);
}

export function createSite(db: Db, clock: Clock, input: { organizationId: number; actor: Actor; site: SiteCreate }): SiteView {
  const now = clock.now();
  return db.transaction((tx) => {
    checkNameFree(tx, input.organizationId, input.site.name);
    const stamp = now.toISOString();
    const row = tx
      .insert(sites)
      .values({ organizationId: input.organizationId, name: input.site.name, description: input.site.description ?? '', createdAt: stamp, updatedAt: stamp })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'site',
      entityId: row.id,
      action: 'created',
      after: { name: row.name, description: row.description },
      at: now,
    });
    return { ...row, exposureGroupCount: 0 };
  });
}

/**
 * Edits a site; `archived` archives or brings it back. A site is archived only when none of its
 * exposure groups is still in use (409 naming how many), so no group in use hangs off a hidden site.
 */
export function updateSite(
  db: Db,
  clock: Clock,
  input: { organizationId: number; siteId: number; actor: Actor; changes: SiteUpdate; reason?: string },
): SiteView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = findSite(tx, input.organizationId, input.siteId);
    const { before, after } = changedFields(current, input.changes);
    if (Object.keys(after).length === 0) return;
    if (after.name !== undefined) checkNameFree(tx, input.organizationId, String(after.name), current.id);
    if (after.archived === true) {
      const inUse =
        tx
          .select({ total: count() })
          .from(exposureGroups)
          .where(and(eq(exposureGroups.siteId, current.id), eq(exposureGroups.archived, false)))
          .get()?.total ?? 0;
      if (inUse > 0)
        throw new Conflict(
          `Site "${current.name}" still has ${inUse} exposure group${inUse === 1 ? '' : 's'} in use: archive ${inUse === 1 ? 'it' : 'them'} first`,
        );
    }
    saveAuditedChange(tx, sites, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'site',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return getSite(db, input.organizationId, input.siteId);
}
