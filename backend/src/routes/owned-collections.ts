import type { RequestHandler } from 'express';
import type { Db } from '../db/client';
import { NotFound } from '../errors';

/**
 * The table behind each collection segment of an organization path (`…/sites/:siteId` → sites),
 * with the word used in "No site 12 in this organization". `mountRoutes` uses it to answer 404
 * for an id that belongs to another organization before the handler reads the body, so every
 * route answers such an id the same way whatever the body holds (tests/api/route-inventory.test.ts
 * fails for a route whose id follows a segment missing here).
 */
export const ownedCollections: Readonly<Record<string, { table: string; label: string }>> = {
  members: { table: 'memberships', label: 'member' },
  invitations: { table: 'invitations', label: 'invitation' },
  sites: { table: 'sites', label: 'site' },
  agents: { table: 'agents', label: 'agent' },
  'oel-entries': { table: 'oel_entries', label: 'OEL list entry' },
  'exposure-groups': { table: 'exposure_groups', label: 'exposure group' },
  workers: { table: 'workers', label: 'worker' },
  'group-memberships': { table: 'group_memberships', label: 'group membership' },
  'sampling-plans': { table: 'sampling_plans', label: 'sampling plan' },
  'shift-results': { table: 'shift_results', label: 'shift result' },
  'lab-imports': { table: 'import_batches', label: 'lab import' },
  'noise-logs': { table: 'noise_logs', label: 'noise log' },
  masks: { table: 'noise_masks', label: 'mask' },
  'decision-records': { table: 'decision_records', label: 'decision record' },
  'worker-letters': { table: 'worker_letters', label: 'worker letter' },
  'hearing-protectors': { table: 'hearing_protectors', label: 'hearing protector' },
  protectors: { table: 'hearing_protectors', label: 'hearing protector' },
  'noise-estimates': { table: 'noise_estimates', label: 'noise estimate' },
  // A mixture is an agent of kind `mixture`.
  mixtures: { table: 'agents', label: 'mixture' },
};

/** The id parameters of a path after :orgId, each with the collection segment before it. */
export function idParametersOf(path: string): Array<{ parameter: string; collection: string }> {
  const segments = path.split('/');
  return segments.flatMap((segment, index) =>
    segment.startsWith(':') && segment !== ':orgId' ? [{ parameter: segment.slice(1), collection: segments[index - 1] ?? '' }] : [],
  );
}

/**
 * Middleware for one organization route: each id in the path whose row belongs to another
 * organization answers 404, as if it did not exist. Ids of no row, or of a shared row without an
 * organization (a built-in catalogue entry), go on to the handler, which answers for them itself.
 * Runs after the membership and permission guards. Tables without an organization_id column are
 * left to the handler.
 */
export function requireOwnedIds(db: Db, path: string): RequestHandler | undefined {
  const checks = idParametersOf(path).flatMap(({ parameter, collection }) => {
    const owned = ownedCollections[collection];
    if (!owned) return [];
    const columns = db.$client.prepare(`select name from pragma_table_info(?)`).all(owned.table) as Array<{ name: string }>;
    if (!columns.some((column) => column.name === 'organization_id')) return [];
    const statement = db.$client.prepare(`select organization_id as organizationId from "${owned.table}" where id = ?`);
    return [{ parameter, label: owned.label, statement }];
  });
  if (checks.length === 0) return undefined;
  return (req, res, next) => {
    const organizationId = res.locals.organization?.id;
    for (const check of checks) {
      const text = req.params[check.parameter];
      if (typeof text !== 'string' || !/^\d{1,15}$/.test(text)) continue; // the handler's own parsing answers 400
      const row = check.statement.get(Number(text)) as { organizationId: number | null } | undefined;
      if (row && row.organizationId !== null && row.organizationId !== organizationId) {
        return next(new NotFound(`No ${check.label} ${text} in this organization`));
      }
    }
    next();
  };
}
