import { asc, eq } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import { groupHearingProtectors, hearingProtectors, type HearingProtectorType } from '@schema/hearing-protectors';
import { organizations } from '@schema/organizations';
import type { Clock } from '../clock';
import type { Db } from './client';

/*
 * Demo hearing protectors (invented names and ratings, PRODUCT.md demo scenario): a foam plug and an
 * earmuff in each organization, both in use in the first noise group, so the group page shows verdicts.
 */
const demoProtectors: Array<{
  name: string;
  type: HearingProtectorType;
  nrr: number | null;
  snr: number | null;
  h: number | null;
  m: number | null;
  l: number | null;
  notes: string;
}> = [
  { name: 'Yard foam plug', type: 'formable-earplug', nrr: 32, snr: 36, h: 34, m: 33, l: 31, notes: 'Issued from the dispensers at each line (demo data).' },
  { name: 'Line earmuff', type: 'earmuff', nrr: 25, snr: 30, h: 32, m: 27, l: 19, notes: 'Headband earmuff kept at the workstations (demo data).' },
];

/** Adds the demo protectors to every demo organization and puts them in use in its first noise group. */
export function seedDemoProtectors(db: Db, clock: Clock): void {
  const stamp = clock.now().toISOString();
  db.transaction((tx) => {
    for (const organization of tx.select({ id: organizations.id }).from(organizations).all()) {
      const ids = demoProtectors.map(
        (protector) =>
          tx
            .insert(hearingProtectors)
            .values({ organizationId: organization.id, ...protector, createdAt: stamp, updatedAt: stamp })
            .returning()
            .get().id,
      );
      const noiseGroup = tx
        .select({ id: exposureGroups.id, unit: exposureGroups.oelUnit })
        .from(exposureGroups)
        .where(eq(exposureGroups.organizationId, organization.id))
        .orderBy(asc(exposureGroups.id))
        .all()
        .find((group) => group.unit === 'dose-percent');
      if (!noiseGroup) continue;
      for (const protectorId of ids) {
        tx.insert(groupHearingProtectors)
          .values({ organizationId: organization.id, exposureGroupId: noiseGroup.id, protectorId, addedByUserId: null, createdAt: stamp })
          .run();
      }
    }
  });
}
