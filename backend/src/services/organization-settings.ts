import { eq } from 'drizzle-orm';
import { organizations, organizationSettings, type OrganizationSettings } from '@schema/organizations';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { audit, type Actor, type Tx } from './changes';

/*
 * Reading and saving keys of the organization settings JSON (schema/organizations.ts). A feature's
 * settings page reads the full set (defaults filled in) and saves its own keys, audited, leaving the
 * other keys as they are.
 */

/** The organization's settings with every default filled in (a stored document that no longer parses falls back to the defaults). */
export function organizationSettingsOf(db: Tx, organizationId: number): OrganizationSettings {
  const row = db.select({ settings: organizations.settings }).from(organizations).where(eq(organizations.id, organizationId)).get();
  const parsed = organizationSettings.safeParse(row?.settings ?? {});
  return parsed.success ? parsed.data : organizationSettings.parse({});
}

/**
 * Saves some keys of the settings in one transaction with an audit event `action` holding the
 * `before` and `after` values of those keys.
 */
export function saveOrganizationSettings<Values extends Partial<OrganizationSettings>>(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; values: Values; action: string; before: (tx: Tx) => Values },
): void {
  const now = clock.now();
  db.transaction((tx) => {
    const row = tx.select({ settings: organizations.settings }).from(organizations).where(eq(organizations.id, input.organizationId)).get();
    const before = input.before(tx);
    tx.update(organizations)
      .set({ settings: { ...(row?.settings ?? {}), ...input.values }, updatedAt: now.toISOString() })
      .where(eq(organizations.id, input.organizationId))
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'organization',
      entityId: input.organizationId,
      action: input.action,
      before: { ...before },
      after: { ...input.values },
      at: now,
    });
  });
}
