import { and, eq } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { users } from '@schema/users';
import { workers } from '@schema/workers';
import { generateNoiseDemoLog, type NoiseDemoOptions } from '@stats/noise-demo';
import type { Clock } from '../clock';
import { acceptNoiseLog, uploadNoiseLog } from '../services/noise-logs';
import type { Db } from './client';

/**
 * Demo noise logs for Ridgeback Timber Co. (PRODUCT.md "Demo scenario"): synthesized by
 * stats/noise-demo.ts and stored through the same service as a real upload. One log per noise group;
 * one meter left on a bench, a few knocks, one slightly drifting calibrator. Only the maintenance
 * fitters' logs (a group with no other demo results) are accepted into their group, so the other
 * demo groups keep the results their campaigns describe. Long 1 s logs are few: seeding stays fast.
 */
const demoLogs: Array<{ group: string; worker: string; date: string; accept: boolean; options: Omit<NoiseDemoOptions, 'worker' | 'start'> }> = [
  {
    group: 'Maintenance fitter – noise',
    worker: 'RT-008',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5101, hours: 8, intervalSeconds: 1, benchMinutes: 40, knockCount: 3 },
  },
  {
    group: 'Maintenance fitter – noise',
    worker: 'RT-009',
    date: '2025-02-05',
    accept: true,
    options: { seed: 5102, hours: 8, intervalSeconds: 10, knockCount: 2, calibrationDriftDb: 0.7 },
  },
  {
    group: 'Maintenance fitter – noise',
    worker: 'RT-010',
    date: '2025-02-06',
    accept: true,
    options: { seed: 5103, hours: 9, intervalSeconds: 5, knockCount: 1, levelOffsetDb: -2 },
  },
  {
    group: 'Head sawyer – noise',
    worker: 'RT-001',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5104, hours: 8, intervalSeconds: 30, knockCount: 2, levelOffsetDb: 3 },
  },
  {
    group: 'Edger operator – noise',
    worker: 'RT-003',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5105, hours: 8, intervalSeconds: 30, knockCount: 1, levelOffsetDb: 4 },
  },
  {
    group: 'Saw filer – noise',
    worker: 'RT-006',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5106, hours: 8, intervalSeconds: 30, knockCount: 0, levelOffsetDb: -4 },
  },
  {
    group: 'Planer feeder – noise',
    worker: 'RT-012',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5107, hours: 8, intervalSeconds: 30, knockCount: 2, levelOffsetDb: 1 },
  },
  {
    group: 'Forklift driver – noise',
    worker: 'RT-014',
    date: '2025-02-04',
    accept: false,
    options: { seed: 5108, hours: 10, intervalSeconds: 30, knockCount: 4, calibrationDriftDb: 0.3 },
  },
];

/** Seeds the demo noise logs (after the organizations, groups and workers exist). */
export function seedDemoNoiseLogs(db: Db, clock: Clock): void {
  const organization = db.select().from(organizations).where(eq(organizations.slug, 'ridgeback-timber')).get();
  if (!organization) return;
  const hygienist = db.select({ id: users.id }).from(users).where(eq(users.email, 'hygienist@ridgeback.example')).get() ?? null;
  for (const entry of demoLogs) {
    const group = db
      .select()
      .from(exposureGroups)
      .where(and(eq(exposureGroups.organizationId, organization.id), eq(exposureGroups.name, entry.group)))
      .get();
    const worker = db
      .select()
      .from(workers)
      .where(and(eq(workers.organizationId, organization.id), eq(workers.code, entry.worker)))
      .get();
    if (!group || !worker) throw new Error(`Demo noise log: no group "${entry.group}" or worker ${entry.worker}`);
    storeDemoNoiseLog(db, clock, {
      organizationId: organization.id,
      actor: hygienist,
      groupId: group.id,
      worker,
      date: entry.date,
      accept: entry.accept,
      options: entry.options,
    });
  }
}

/**
 * Synthesizes one invented log (stats/noise-demo.ts) for a worker's shift and stores it through the
 * upload service, as a real upload would be; `accept` also puts it in the group as a shift result.
 * Shared with the large test organization (seed-large.ts). Returns the log's id.
 */
export function storeDemoNoiseLog(
  db: Db,
  clock: Clock,
  input: {
    organizationId: number;
    actor: { id: number } | null;
    groupId: number;
    worker: { id: number; code: string };
    date: string;
    accept: boolean;
    options: Omit<NoiseDemoOptions, 'worker' | 'start'>;
  },
): number {
  const demo = generateNoiseDemoLog({ ...input.options, worker: input.worker.code, start: `${input.date}T06:30:00-08:00` });
  const stored = uploadNoiseLog(db, clock, {
    organizationId: input.organizationId,
    actor: input.actor,
    exposureGroupId: input.groupId,
    workerId: input.worker.id,
    instrument: '',
    shiftDate: input.date,
    fileName: `${input.worker.code}-${input.date}.csv`,
    bytes: new TextEncoder().encode(demo.text),
  });
  if (input.accept) acceptNoiseLog(db, clock, { organizationId: input.organizationId, logId: stored.id, actor: input.actor });
  return stored.id;
}
