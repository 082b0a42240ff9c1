import { and, count, eq, type SQL } from 'drizzle-orm';
import type { SQLiteTable } from 'drizzle-orm/sqlite-core';
import { agents } from '@schema/agents';
import { exposureGroups } from '@schema/exposure-groups';
import { memberships, type Organization } from '@schema/organizations';
import { sites } from '@schema/sites';
import { workers } from '@schema/workers';
import type { Db } from '../db/client';

/** Home-page figures: counts of what is in use (archived rows and inactive members left out). */
export function organizationSummary(db: Db, organization: Organization) {
  const countOf = (table: SQLiteTable, where: SQL | undefined) => db.select({ total: count() }).from(table).where(where).get()?.total ?? 0;
  return {
    organization: { id: organization.id, name: organization.name, slug: organization.slug },
    counts: {
      sites: countOf(sites, and(eq(sites.organizationId, organization.id), eq(sites.archived, false))),
      exposureGroups: countOf(exposureGroups, and(eq(exposureGroups.organizationId, organization.id), eq(exposureGroups.archived, false))),
      workers: countOf(workers, and(eq(workers.organizationId, organization.id), eq(workers.archived, false))),
      agents: countOf(agents, and(eq(agents.organizationId, organization.id), eq(agents.archived, false))),
      members: countOf(memberships, and(eq(memberships.organizationId, organization.id), eq(memberships.active, true))),
    },
  };
}
