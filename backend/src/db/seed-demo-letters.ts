import { and, eq } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { users } from '@schema/users';
import type { Clock } from '../clock';
import { draftWorkerLetters } from '../services/worker-letters';
import type { Db } from './client';

/** Invented worker addresses for the demo: named workers only, at `crew.<organization domain>`. */
const crewDomains: Record<string, string> = { 'ridgeback-timber': 'crew.ridgeback.example', 'slate-harbor': 'crew.slateharbor.example' };

/** `Alex Corran` → `alex.corran@crew.ridgeback.example`; null for a worker without a name. */
export function demoWorkerEmail(name: string | null, organizationSlug: string): string | null {
  const domain = crewDomains[organizationSlug];
  if (!name || !domain) return null;
  const local = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '.')
    .replace(/^\.|\.$/g, '');
  return `${local}@${domain}`;
}

/**
 * Drafts the demo's worker letters for one Ridgeback noise group (edger operators), as the
 * Ridgeback hygienist, so the letters page has something to show and send.
 */
export function seedDemoWorkerLetters(db: Db, clock: Clock): void {
  const organization = db.select().from(organizations).where(eq(organizations.slug, 'ridgeback-timber')).get();
  const hygienist = db.select().from(users).where(eq(users.email, 'hygienist@ridgeback.example')).get();
  if (!organization || !hygienist) return;
  const group = db
    .select()
    .from(exposureGroups)
    .where(and(eq(exposureGroups.organizationId, organization.id), eq(exposureGroups.name, 'Edger operator – noise')))
    .get();
  if (!group) return;
  draftWorkerLetters(db, clock, {
    organizationId: organization.id,
    organizationName: organization.name,
    groupId: group.id,
    actor: { id: hygienist.id, name: hygienist.name, email: hygienist.email },
    draft: {},
  });
}
