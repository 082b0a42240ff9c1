import { sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import type { z } from 'zod';
import { archived, id, timestamps } from './columns';
import { organizationReference } from './organizations';

/** A place where people work (a mill, a shop). Exposure groups belong to a site. */
export const sites = sqliteTable(
  'sites',
  {
    id: id(),
    organizationId: organizationReference(),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    archived: archived(),
    ...timestamps(),
  },
  (table) => [
    uniqueIndex('sites_organization_name_idx').on(table.organizationId, table.name),
    // Lets child tables reference (id, organization_id) so a row can never point into another organization.
    uniqueIndex('sites_id_organization_idx').on(table.id, table.organizationId),
  ],
);

export const siteSelect = createSelectSchema(sites);
export const siteCreate = createInsertSchema(sites, {
  name: (schema) => schema.trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  description: (schema) => schema.trim().max(2000, 'Use at most 2000 characters'),
}).pick({ name: true, description: true });
export const siteUpdate = siteCreate.partial().extend({ archived: siteSelect.shape.archived.optional() });

export type Site = z.infer<typeof siteSelect>;
export type SiteCreate = z.infer<typeof siteCreate>;
export type SiteUpdate = z.infer<typeof siteUpdate>;
