import { index, integer, sqliteTable, uniqueIndex, foreignKey } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';
import { agents } from './agents';
import { organizationReference } from './organizations';
import { timestamp } from './columns';
import type { ShiftResultDetails } from './shift-results';

/**
 * A mixture of agents an organization marks as having similar (additive) effects. The mixture
 * itself is an agent of kind `mixture` (so an exposure group can be set up for it, judged against
 * an OEL of 1 in the unit `index`); this table lists its component agents. The shift result of the
 * mixture group is the index Σ Cᵢ/OELᵢ (OSHA 29 CFR 1910.1000(d)(2)(i); stats/mixture-index.ts).
 */
export const mixtureComponents = sqliteTable(
  'mixture_components',
  {
    organizationId: organizationReference(),
    mixtureAgentId: integer('mixture_agent_id').notNull(),
    componentAgentId: integer('component_agent_id').notNull(),
    createdAt: timestamp('created_at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.mixtureAgentId, table.organizationId], foreignColumns: [agents.id, agents.organizationId] }),
    foreignKey({ columns: [table.componentAgentId, table.organizationId], foreignColumns: [agents.id, agents.organizationId] }),
    uniqueIndex('mixture_components_pair_idx').on(table.mixtureAgentId, table.componentAgentId),
    index('mixture_components_component_idx').on(table.componentAgentId),
  ],
);

/** Define a mixture: a name and at least two distinct chemical agents. */
export const mixtureCreate = z.object({
  name: z.string({ message: 'Enter a name' }).trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  componentAgentIds: z
    .array(z.number().int().positive(), { message: 'Choose the component agents' })
    .min(2, 'Choose at least 2 component agents')
    .max(20, 'Use at most 20 component agents')
    .refine((ids) => new Set(ids).size === ids.length, 'Choose each agent once'),
  notes: z.string().trim().max(2000).optional(),
});
/** Edit a mixture's name, notes or components (components only while no mixture result exists). */
export const mixtureUpdate = mixtureCreate.partial().extend({ archived: z.boolean().optional() });

export type MixtureCreate = z.infer<typeof mixtureCreate>;
export type MixtureUpdate = z.infer<typeof mixtureUpdate>;

// ---------------------------------------------------------------- over the wire (backend/src/services/mixtures.ts)

/** A mixture as the API sends it: its components, the groups assessing it and its valid results. */
export interface MixtureView {
  id: number;
  name: string;
  notes: string;
  archived: boolean;
  components: Array<{ id: number; name: string; archived: boolean }>;
  groupCount: number;
  validResultCount: number;
}

/** One worker-shift's mixture index, as computing would write it. */
export interface MixtureShiftRow {
  workerId: number;
  workerCode: string;
  date: string;
  index: number;
  nonDetect: boolean;
  lowerBound: number;
  components: NonNullable<ShiftResultDetails['mixture']>['components'];
  statement: string;
  flags: string[];
}

/** A shift left out of the computation, with why. */
export interface MixtureSkippedShift {
  workerCode: string;
  date: string;
  reason: string;
  /** Component agents with no valid result on that shift. */
  missing: string[];
}

/** What computing a mixture group's results would write, skip and replace (the preview and the answer). */
export interface MixturePlan {
  group: { id: number; name: string };
  mixture: { id: number; name: string; components: string[] };
  formula: string;
  source: string;
  nonDetectRule: string;
  rows: MixtureShiftRow[];
  skipped: MixtureSkippedShift[];
  /** Valid mixture results now in the group: voided ("recomputed") when the new ones are written. */
  replaces: Array<{ id: number; workerCode: string; date: string; value: number }>;
}
