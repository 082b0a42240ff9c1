import { sql } from 'drizzle-orm';
import { check, foreignKey, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { archived, id, timestamp, timestamps } from './columns';
import { organizationReference } from './organizations';

/**
 * `mixture`: agents with similar (additive) effects judged together by the mixture index
 * Σ Cᵢ/OELᵢ (schema/mixtures.ts); created through the mixtures list, never typed in as an agent.
 */
export const agentKinds = ['noise', 'chemical', 'mixture'] as const;
export type AgentKind = (typeof agentKinds)[number];

/**
 * Units an OEL or a shift result may be written in. `dose-percent` is a noise dose in % of the
 * criterion (100 % = the limit): unlike dB(A), a dose is on a linear scale, so noise results can be
 * judged with the same lognormal statistics as concentrations.
 */
export const exposureUnits = ['dBA', 'dose-percent', 'mg/m3', 'ug/m3', 'ppm', 'f/cc', 'index'] as const;
export type ExposureUnit = (typeof exposureUnits)[number];
export const exposureUnitLabels: Record<ExposureUnit, string> = {
  dBA: 'dB(A)',
  'dose-percent': '% dose',
  'mg/m3': 'mg/m³',
  'ug/m3': 'µg/m³',
  ppm: 'ppm',
  'f/cc': 'fibres/cm³',
  // The mixture index Σ Cᵢ/OELᵢ: dimensionless, judged against 1 (docs/decisions/023-hearing-protectors-and-mixtures.md).
  index: '× limit (mixture index)',
};

/** Which units fit which kind of agent (noise in dB(A) or % dose; chemicals as concentrations; a mixture as its index). */
export const unitsForAgentKind: Record<AgentKind, readonly ExposureUnit[]> = {
  noise: ['dBA', 'dose-percent'],
  chemical: ['mg/m3', 'ug/m3', 'ppm', 'f/cc'],
  mixture: ['index'],
};

/** Averaging times of a limit: full-shift TWA, short-term (15 min) and ceiling. */
export const averagingTimes = ['8h-twa', '15min-stel', 'ceiling'] as const;
export type AveragingTime = (typeof averagingTimes)[number];
export const averagingTimeLabels: Record<AveragingTime, string> = {
  '8h-twa': '8-hour TWA',
  '15min-stel': '15-minute short-term limit',
  ceiling: 'Ceiling',
};

/**
 * Whether a CAS Registry Number is well formed and its check digit is right.
 * Method: CAS check digit — the last digit equals the sum of every other digit times its
 * position counted from the right (1, 2, 3 …), modulo 10 (CAS, "CAS Registry Number"
 * verification rule). isValidCasNumber('14808-60-7') → true (quartz).
 */
export function isValidCasNumber(value: string): boolean {
  const match = /^(\d{2,7})-(\d{2})-(\d)$/.exec(value);
  if (!match) return false;
  const digits = (match[1] + match[2]).split('').reverse();
  const sum = digits.reduce((total, digit, index) => total + Number(digit) * (index + 1), 0);
  return sum % 10 === Number(match[3]);
}

/** Something people are exposed to: noise, or a chemical (with CAS number and molecular weight for ppm ↔ mg/m³). */
export const agents = sqliteTable(
  'agents',
  {
    id: id(),
    organizationId: organizationReference(),
    name: text('name').notNull(),
    kind: text('kind', { enum: agentKinds }).notNull(),
    casNumber: text('cas_number'),
    /** g/mol; needed to convert ppm ↔ mg/m³. */
    molecularWeight: real('molecular_weight'),
    notes: text('notes').notNull().default(''),
    archived: archived(),
    ...timestamps(),
  },
  (table) => [
    uniqueIndex('agents_organization_name_idx').on(table.organizationId, table.name),
    uniqueIndex('agents_id_organization_idx').on(table.id, table.organizationId),
    check('agents_molecular_weight_positive', sql`${table.molecularWeight} IS NULL OR ${table.molecularWeight} > 0`),
    check('agents_noise_has_no_chemistry', sql`${table.kind} = 'chemical' OR (${table.casNumber} IS NULL AND ${table.molecularWeight} IS NULL)`),
  ],
);

/**
 * One line of an organization's OEL list: agent × source × value × unit × averaging time.
 * `source` names where the limit comes from (a regulation, a recommended limit, an in-house limit).
 */
export const oelEntries = sqliteTable(
  'oel_entries',
  {
    id: id(),
    organizationId: organizationReference(),
    agentId: integer('agent_id').notNull(),
    source: text('source').notNull(),
    value: real('value').notNull(),
    unit: text('unit', { enum: exposureUnits }).notNull(),
    averagingTime: text('averaging_time', { enum: averagingTimes }).notNull(),
    notes: text('notes').notNull().default(''),
    /** Archived entries stay (groups keep a link to them) and drop out of pick lists. */
    archived: archived(),
    createdAt: timestamp('created_at').notNull(),
    updatedAt: timestamp('updated_at').notNull(),
  },
  (table) => [
    foreignKey({ columns: [table.agentId, table.organizationId], foreignColumns: [agents.id, agents.organizationId] }),
    uniqueIndex('oel_entries_id_organization_idx').on(table.id, table.organizationId),
    check('oel_entries_value_positive', sql`${table.value} > 0`),
  ],
);

const casNumber = z.string().trim().refine(isValidCasNumber, 'Write the CAS number as digits-digits-check digit, e.g. 14808-60-7, with a correct check digit');

export const agentSelect = createSelectSchema(agents);
const agentFields = createInsertSchema(agents, {
  name: (schema) => schema.trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  casNumber: casNumber.nullable().optional(),
  molecularWeight: (schema) => schema.positive('Use a molecular weight above 0 g/mol').max(100_000),
  notes: (schema) => schema.trim().max(2000),
}).pick({ name: true, kind: true, casNumber: true, molecularWeight: true, notes: true });

/** Create an agent; noise carries no CAS number or molecular weight. */
export const agentCreate = agentFields.superRefine((agent, context) => {
  if (agent.kind === 'mixture')
    context.addIssue({ code: 'custom', path: ['kind'], message: 'Define a mixture on the mixtures list (it needs its component agents)' });
  if (agent.kind === 'noise') {
    if (agent.casNumber != null) context.addIssue({ code: 'custom', path: ['casNumber'], message: 'Noise has no CAS number' });
    if (agent.molecularWeight != null) context.addIssue({ code: 'custom', path: ['molecularWeight'], message: 'Noise has no molecular weight' });
  }
});
/** Edit an agent; the service checks the noise/chemical rule against the stored row. */
export const agentUpdate = agentFields
  .partial()
  .extend({ archived: z.boolean().optional() })
  .refine((agent) => agent.kind !== 'mixture', { path: ['kind'], message: 'Define a mixture on the mixtures list (it needs its component agents)' });

export const oelEntrySelect = createSelectSchema(oelEntries);
export const oelEntryCreate = createInsertSchema(oelEntries, {
  source: (schema) => schema.trim().min(1, 'Name the source of the limit').max(200),
  value: (schema) => schema.positive('Use a limit above 0'),
  notes: (schema) => schema.trim().max(2000),
}).pick({ agentId: true, source: true, value: true, unit: true, averagingTime: true, notes: true });
export const oelEntryUpdate = oelEntryCreate.partial().extend({ archived: z.boolean().optional() });

export type Agent = z.infer<typeof agentSelect>;
export type AgentCreate = z.infer<typeof agentCreate>;
export type AgentUpdate = z.infer<typeof agentUpdate>;
export type OelEntry = z.infer<typeof oelEntrySelect>;
export type OelEntryCreate = z.infer<typeof oelEntryCreate>;
export type OelEntryUpdate = z.infer<typeof oelEntryUpdate>;
