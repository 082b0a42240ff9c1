import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createInsertSchema, createSelectSchema } from 'drizzle-zod';
import { z } from 'zod';
import { id, timestamp, timestamps } from './columns';
import { permissions, roles } from './permissions';
import { users } from './users';

/**
 * Organization settings, kept as one JSON document so later issues can add keys without a
 * migration. Every key has a default, so `organizationSettings.parse({})` gives a full set.
 * Wear-check defaults from PRODUCT.md "Noise log format, version 1".
 */
export const organizationSettings = z.object({
  /** A still stretch is a run of non-moving intervals at least this long (minutes). */
  stillMinutes: z.number().positive().max(480).default(15),
  /** An interval with apeak_mg at or above this is a knock (milli-g). */
  knockMg: z.number().positive().max(100_000).default(3000),
  /** Without a `moving` column, a change of the mean acceleration vector of at least this (milli-g) counts as motion. */
  motionChangeMg: z.number().positive().max(10_000).default(30),
  /** A knock's proposed mask starts this many seconds before the knock interval. */
  maskBeforeS: z.number().min(0).max(3600).default(2),
  /** A knock's proposed mask ends this many seconds after the knock interval. */
  maskAfterS: z.number().min(0).max(3600).default(3),
  /** Calibration drift (after − before) beyond which a noise log is flagged, dB (common practice; stats/noise-settings.ts). */
  driftLimitDb: z.number().positive().max(20).default(0.5),
  /**
   * Bayesian view: P(P95 > OEL) at or above which a group is judged unacceptable, above 0.05 and at
   * most 1. Absent: the engine's default, 0.30 (stats/bayes-summary.ts, docs/decisions/003-bayesian-view.md).
   */
  bayesUnacceptableThreshold: z.number().gt(0.05).max(1).optional(),
  /**
   * Months from approval to a decision record's review date. Absent: proposed from EN 689's reassessment
   * guidance by GM/OEL (stats/en689.ts en689ReassessmentMonths: 36, 24, 18 or 12 months, from memory).
   */
  reviewIntervalMonths: z.number().int().min(1).max(120).optional(),
  /**
   * Hearing-protector assessment (docs/decisions/023-hearing-protectors-and-mixtures.md): the action
   * level Lact the level at the ear is judged against, dB(A). Default 85: the upper exposure action
   * value of Directive 2003/10/EC Art. 3 and NIOSH's REL (1998); EN 458 takes Lact from the national rules.
   */
  protectorActionLevelDb: z.number().min(60).max(100).default(85),
  /** EN 458 band edges below Lact, dB (from memory): acceptable within 5, good within 10, over-protection beyond 15. */
  protectorAcceptableMarginDb: z.number().positive().max(30).default(5),
  protectorGoodMarginDb: z.number().positive().max(30).default(10),
  protectorOverProtectionMarginDb: z.number().positive().max(40).default(15),
});
export type OrganizationSettings = z.infer<typeof organizationSettings>;

export const organizations = sqliteTable('organizations', {
  id: id(),
  name: text('name').notNull(),
  /** URL-friendly short name, unique (`ridgeback-timber`). */
  slug: text('slug').notNull().unique(),
  settings: text('settings', { mode: 'json' })
    .$type<Partial<OrganizationSettings>>()
    .notNull()
    .default(sql`'{}'`),
  ...timestamps(),
});

/** `organization_id`, required, referencing organizations: every organization-owned table has one. */
export const organizationReference = () =>
  integer('organization_id')
    .notNull()
    .references(() => organizations.id);

/** A person's role in one organization. Deactivated memberships are kept (active = false), never deleted. */
export const memberships = sqliteTable(
  'memberships',
  {
    id: id(),
    organizationId: organizationReference(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    role: text('role', { enum: roles }).notNull(),
    active: integer('active', { mode: 'boolean' }).notNull().default(true),
    ...timestamps(),
  },
  (table) => [uniqueIndex('memberships_organization_user_idx').on(table.organizationId, table.userId), index('memberships_user_idx').on(table.userId)],
);

/**
 * An admin's invitation to join with a role. The e-mailed link carries a random token; only its
 * SHA-256 hash is stored. Single use (`accepted_at`), expiring (`expires_at`), revocable (`revoked_at`).
 */
export const invitations = sqliteTable(
  'invitations',
  {
    id: id(),
    organizationId: organizationReference(),
    email: text('email').notNull(),
    role: text('role', { enum: roles }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    invitedByUserId: integer('invited_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at').notNull(),
    expiresAt: timestamp('expires_at').notNull(),
    acceptedAt: timestamp('accepted_at'),
    acceptedByUserId: integer('accepted_by_user_id').references(() => users.id),
    revokedAt: timestamp('revoked_at'),
  },
  (table) => [index('invitations_organization_idx').on(table.organizationId, table.email)],
);

export const organizationSelect = createSelectSchema(organizations, { settings: organizationSettings.partial() });
export const organizationCreate = createInsertSchema(organizations, {
  name: (schema) => schema.trim().min(1, 'Enter a name').max(120),
  slug: (schema) => schema.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens').max(60),
  settings: organizationSettings.partial(),
}).pick({ name: true, slug: true, settings: true });
export const organizationSettingsUpdate = organizationSettings.partial();

/** The organization as members see it in lists and headers. */
export const organizationPublic = organizationSelect.pick({ id: true, name: true, slug: true });

export const membershipSelect = createSelectSchema(memberships);

/** One membership as `/api/me` and sign-in return it (API_CONTRACT.md). */
export const membershipView = z.object({
  id: z.number().int(),
  organizationId: z.number().int(),
  organizationName: z.string(),
  organizationSlug: z.string(),
  role: z.enum(roles),
  permissions: z.array(z.enum(permissions)),
});

/** A row of the members list (API_CONTRACT.md `GET /api/orgs/:orgId/members`). */
export const memberView = membershipSelect
  .pick({ id: true, userId: true, role: true, active: true, createdAt: true })
  .extend({ email: z.string(), name: z.string() });

export const invitationSelect = createSelectSchema(invitations);

/** A row of the invitations list; `invitedBy` is the inviter's name. */
export const invitationView = invitationSelect
  .pick({ id: true, email: true, role: true, createdAt: true, expiresAt: true, acceptedAt: true })
  .extend({ invitedBy: z.string(), status: z.enum(['pending', 'accepted', 'expired']) });

/** What the invitee sees before accepting (`GET /api/invitations/:token`). */
export const invitationPreview = invitationSelect.pick({ email: true, role: true, expiresAt: true }).extend({ organizationName: z.string() });

export type Organization = typeof organizations.$inferSelect;
export type OrganizationCreate = z.infer<typeof organizationCreate>;
export type OrganizationPublic = z.infer<typeof organizationPublic>;
export type Membership = typeof memberships.$inferSelect;
export type MembershipView = z.infer<typeof membershipView>;
export type MemberView = z.infer<typeof memberView>;
export type Invitation = typeof invitations.$inferSelect;
export type InvitationView = z.infer<typeof invitationView>;
export type InvitationPreview = z.infer<typeof invitationPreview>;
