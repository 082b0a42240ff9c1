/*
 * `npm run seed:large -- [--database FILE] [--seed N]`: adds a large invented organization for load
 * tests and benchmarks (issue "Security, reliability and performance"): Ridgeback Timber Co.'s
 * regional mills, a test organization with 2,000 exposure groups over 10 sites and 4 agents,
 * 40,000 shift results (lognormal, non-detects below a detection limit, a few voided), 500 noise logs
 * (synthesized by stats/noise-demo.ts and stored through the upload service, 40 of them accepted into
 * their groups), sampling plans for a quarter of the groups and approved decision records for most.
 * Every name and number is invented (PRODUCT.md "Demo scenario"); addresses are .example.
 *
 * Speed: everything but the noise logs goes in through multi-row INSERTs inside one transaction;
 * the noise logs go through the same service as a real upload (one transaction each). The same seed
 * gives the same rows.
 */
import { parseArgs } from 'node:util';
import { eq, sql } from 'drizzle-orm';
import { agents, oelEntries, type ExposureUnit } from '@schema/agents';
import { decisionRecords } from '@schema/decision-records';
import { exposureGroups } from '@schema/exposure-groups';
import { memberships, organizations } from '@schema/organizations';
import type { Role } from '@schema/permissions';
import { plannedPicks, samplingPlans } from '@schema/sampling-plans';
import { shiftResults } from '@schema/shift-results';
import { sites } from '@schema/sites';
import { users } from '@schema/users';
import { groupMemberships, workers } from '@schema/workers';
import { exposureCategory } from '@stats/exposure-category';
import { createRandom } from '@stats/random';
import type { ExposureCategory, Judgement } from '@stats/types';
import { isInvokedDirectly } from '../cli/cli-support';
import { systemClock, type Clock } from '../clock';
import { recordAudit } from '../services/audit';
import { addDays } from '../services/dates';
import { hashPassword } from '../services/passwords';
import { openMigratedDatabase, type Db } from './client';
import { storeDemoNoiseLog } from './seed-demo-noise';

export const largeOrganizationSlug = 'ridgeback-regional';
export const largeOrganizationName = 'Ridgeback Timber Co. — regional mills (large test organization)';
/** Sign-ins of the large organization: `<role>@regional.ridgeback.example`. */
export const largeDomain = 'regional.ridgeback.example';

/** Sizes (the issue: 2,000 groups, 40,000 shift results, 500 noise logs). */
export const largeSizes = Object.freeze({
  sites: 10,
  groups: 2_000,
  shiftResults: 40_000,
  noiseLogs: 500,
  acceptedNoiseLogs: 40,
  workersPerSite: 240,
  membersPerGroup: 4,
});

const roles: Role[] = ['admin', 'hygienist', 'analyst', 'manager'];
const roleNames: Record<string, string> = { admin: 'Avery Stroud', hygienist: 'Rowan Kettle', analyst: 'Sky Marlow', manager: 'Parker Dunlin' };

const siteNames = [
  'North Fork',
  'Cedar Flats',
  'Miller Creek',
  'Stony Bend',
  'Alder Ridge',
  'Fern Hollow',
  'Hatchet Lake',
  'Birch Crossing',
  'Redbank',
  'Long Reach',
];
const stations = [
  { processArea: 'Log yard', job: 'Log loader' },
  { processArea: 'Headrig', job: 'Head sawyer' },
  { processArea: 'Edger line', job: 'Edger operator' },
  { processArea: 'Trimmer line', job: 'Trimmer operator' },
  { processArea: 'Filing room', job: 'Saw filer' },
  { processArea: 'Planer infeed', job: 'Planer feeder' },
  { processArea: 'Grading', job: 'Lumber grader' },
  { processArea: 'Glue line', job: 'Glue spreader' },
  { processArea: 'Yard and sheds', job: 'Forklift driver' },
  { processArea: 'Whole mill', job: 'Maintenance fitter' },
];

interface LargeAgent {
  name: string;
  kind: 'noise' | 'chemical';
  casNumber: string | null;
  molecularWeight: number | null;
  oel: number;
  unit: ExposureUnit;
  source: string;
  actionLevel: number;
  /** Range of the groups' geometric means, as a share of the OEL (log-uniform between the two). */
  gmShare: [number, number];
  /** Detection limit as a share of the OEL (chemicals only). */
  detectionShare: number | null;
}

const largeAgents: LargeAgent[] = [
  {
    name: 'Noise',
    kind: 'noise',
    casNumber: null,
    molecularWeight: null,
    oel: 100,
    unit: 'dose-percent',
    source: 'Example daily noise dose, 85 dBA criterion, 3 dB exchange rate (test data)',
    actionLevel: 50,
    gmShare: [0.05, 1.4],
    detectionShare: null,
  },
  {
    name: 'Inhalable wood dust',
    kind: 'chemical',
    casNumber: null,
    molecularWeight: null,
    oel: 1,
    unit: 'mg/m3',
    source: 'Example recommended limit (test data)',
    actionLevel: 0.5,
    gmShare: [0.02, 1],
    detectionShare: 0.05,
  },
  {
    name: 'Formaldehyde',
    kind: 'chemical',
    casNumber: '50-00-0',
    molecularWeight: 30.03,
    oel: 0.3,
    unit: 'ppm',
    source: 'Example limit (test data)',
    actionLevel: 0.15,
    gmShare: [0.01, 0.6],
    detectionShare: 0.03,
  },
  {
    name: 'Diesel particulate (as elemental carbon)',
    kind: 'chemical',
    casNumber: null,
    molecularWeight: null,
    oel: 0.05,
    unit: 'mg/m3',
    source: 'Example limit (test data)',
    actionLevel: 0.025,
    gmShare: [0.01, 0.8],
    detectionShare: 0.04,
  },
];

/** Weekdays of 2024 (the results' dates). */
function weekdays(year: number): string[] {
  const days: string[] = [];
  for (let time = Date.UTC(year, 0, 1); time < Date.UTC(year + 1, 0, 1); time += 86_400_000) {
    const day = new Date(time);
    if (day.getUTCDay() !== 0 && day.getUTCDay() !== 6) days.push(day.toISOString().slice(0, 10));
  }
  return days;
}

/** Inserts rows in chunks (SQLite caps the variables of one statement). */
function insertChunks<Row>(rows: Row[], size: number, insert: (chunk: Row[]) => void): void {
  for (let start = 0; start < rows.length; start += size) insert(rows.slice(start, start + size));
}

export interface LargeSeedSummary {
  organizationId: number;
  sites: number;
  groups: number;
  workers: number;
  shiftResults: number;
  nonDetects: number;
  voided: number;
  noiseLogs: number;
  approvedRecords: number;
  samplingPlans: number;
  seconds: number;
  /** Of which everything but the noise logs (one transaction). */
  bulkSeconds: number;
}

/**
 * Seeds the large organization into a migrated database (which may hold the demo too). Refuses when
 * the organization is already there. `seed` fixes every random choice; `clock` stamps the rows.
 */
export async function seedLargeOrganization(
  db: Db,
  options: { seed?: number; password: string; clock?: Clock; noiseLogs?: number },
): Promise<LargeSeedSummary> {
  const started = performance.now();
  const clock = options.clock ?? systemClock;
  const random = createRandom(options.seed ?? 20_260_101);
  if (db.select({ id: organizations.id }).from(organizations).where(eq(organizations.slug, largeOrganizationSlug)).get()) {
    throw new Error(`The large test organization (${largeOrganizationSlug}) is already in this database`);
  }
  // One hash for the four test sign-ins (argon2 is slow on purpose; they share the test password).
  const passwordHash = await hashPassword(options.password);
  const now = clock.now();
  const stamp = now.toISOString();
  const times = { createdAt: stamp, updatedAt: stamp };
  const days = weekdays(2024);
  const noiseLogCount = options.noiseLogs ?? largeSizes.noiseLogs;

  const built = db.transaction((tx) => {
    const organizationId = tx
      .insert(organizations)
      .values({ name: largeOrganizationName, slug: largeOrganizationSlug, settings: {}, ...times })
      .returning()
      .get().id;
    const userIds = roles.map((role) => {
      const email = `${role}@${largeDomain}`;
      const existing = tx.select({ id: users.id }).from(users).where(eq(users.email, email)).get();
      const id =
        existing?.id ??
        tx
          .insert(users)
          .values({ email, name: roleNames[role], passwordHash, ...times })
          .returning({ id: users.id })
          .get().id;
      tx.insert(memberships)
        .values({ organizationId, userId: id, role, ...times })
        .run();
      return id;
    });
    const [, hygienistId, analystId] = userIds;

    const siteIds = siteNames.map(
      (name) =>
        tx
          .insert(sites)
          .values({ organizationId, name: `${name} mill`, description: 'Invented mill of the large test organization.', ...times })
          .returning()
          .get().id,
    );
    const agentRows = largeAgents.map((agent) => {
      const id = tx
        .insert(agents)
        .values({
          organizationId,
          name: agent.name,
          kind: agent.kind,
          casNumber: agent.casNumber,
          molecularWeight: agent.molecularWeight,
          notes: 'Test data.',
          ...times,
        })
        .returning()
        .get().id;
      const entryId = tx
        .insert(oelEntries)
        .values({ organizationId, agentId: id, source: agent.source, value: agent.oel, unit: agent.unit, averagingTime: '8h-twa', ...times })
        .returning()
        .get().id;
      return { ...agent, id, entryId };
    });

    // Workers: a pool per site; each group takes `membersPerGroup` consecutive workers of its site's pool.
    const workerRows = siteIds.flatMap((_, siteIndex) =>
      Array.from({ length: largeSizes.workersPerSite }, (__, index) => ({
        organizationId,
        code: `RR-${String(siteIndex + 1).padStart(2, '0')}-${String(index + 1).padStart(3, '0')}`,
        name: null,
        jobTitle: stations[index % stations.length].job,
        ...times,
      })),
    );
    const workerIds: number[] = [];
    insertChunks(workerRows, 500, (chunk) =>
      workerIds.push(
        ...tx
          .insert(workers)
          .values(chunk)
          .returning({ id: workers.id })
          .all()
          .map((row) => row.id),
      ),
    );

    // Groups: round-robin over sites; within a site, station × agent × line number.
    const groupsPerSite = largeSizes.groups / siteIds.length;
    const groupSpecs = Array.from({ length: largeSizes.groups }, (_, index) => {
      const siteIndex = index % siteIds.length;
      const local = Math.floor(index / siteIds.length);
      const station = stations[local % stations.length];
      const agent = agentRows[Math.floor(local / stations.length) % agentRows.length];
      const line = Math.floor(local / (stations.length * agentRows.length)) + 1;
      const [low, high] = agent.gmShare;
      const geometricMean = agent.oel * Math.exp(Math.log(low) + (Math.log(high) - Math.log(low)) * random.uniform());
      const geometricStandardDeviation = 1.5 + 1.5 * random.uniform();
      return { siteIndex, local, station, agent, line, geometricMean, geometricStandardDeviation };
    });
    if (groupsPerSite * siteIds.length !== largeSizes.groups) throw new Error('seed-large: groups must divide evenly over the sites');
    const groupIds: number[] = [];
    insertChunks(groupSpecs, 200, (chunk) =>
      groupIds.push(
        ...tx
          .insert(exposureGroups)
          .values(
            chunk.map((spec) => ({
              organizationId,
              siteId: siteIds[spec.siteIndex],
              name: `${spec.station.job}, line ${spec.line} – ${spec.agent.name.toLowerCase()}`,
              processArea: `${spec.station.processArea}, line ${spec.line}`,
              jobTitles: [spec.station.job],
              tasks: `Invented test group: ${spec.station.job.toLowerCase()} work at the ${spec.station.processArea.toLowerCase()}.`,
              agentId: spec.agent.id,
              oelEntryId: spec.agent.entryId,
              oelValue: spec.agent.oel,
              oelUnit: spec.agent.unit,
              oelSource: spec.agent.source,
              oelAveragingTime: '8h-twa' as const,
              actionLevel: spec.agent.actionLevel,
              shiftHours: 8,
              noiseCriteriaSet: spec.agent.kind === 'noise' ? ('nioshRel' as const) : null,
              exposureProfile: 'Test data.',
              ...times,
            })),
          )
          .returning({ id: exposureGroups.id })
          .all()
          .map((row) => row.id),
      ),
    );
    const membersOf = (groupIndex: number) => {
      const spec = groupSpecs[groupIndex];
      const base = spec.siteIndex * largeSizes.workersPerSite;
      return Array.from(
        { length: largeSizes.membersPerGroup },
        (_, k) => workerIds[base + ((spec.local * largeSizes.membersPerGroup + k) % largeSizes.workersPerSite)],
      );
    };
    insertChunks(
      groupIds.flatMap((groupId, groupIndex) =>
        membersOf(groupIndex).map((workerId) => ({ organizationId, workerId, exposureGroupId: groupId, fromDate: '2023-01-02', toDate: null, ...times })),
      ),
      1000,
      (chunk) => tx.insert(groupMemberships).values(chunk).run(),
    );

    // Noise logs: one per noise group until the count is reached; the first `acceptedNoiseLogs` go into
    // their group as a shift result, so those groups get one entered result fewer (the total stays 40,000).
    const noiseGroupIndexes = groupSpecs.flatMap((spec, index) => (spec.agent.kind === 'noise' ? [index] : [])).slice(0, noiseLogCount);
    const accepted = new Set(noiseGroupIndexes.slice(0, Math.min(largeSizes.acceptedNoiseLogs, noiseLogCount)));
    const perGroup = largeSizes.shiftResults / largeSizes.groups;

    let nonDetects = 0;
    let voided = 0;
    const resultRows: Array<typeof shiftResults.$inferInsert> = [];
    const planRows: Array<{ groupIndex: number; picks: Array<{ workerId: number; date: string }> }> = [];
    groupSpecs.forEach((spec, groupIndex) => {
      const members = membersOf(groupIndex);
      const count = perGroup - (accepted.has(groupIndex) ? 1 : 0);
      const first = Math.floor(random.uniform() * (days.length - count * 12));
      const logGsd = Math.log(spec.geometricStandardDeviation);
      const limit = spec.agent.detectionShare === null ? null : Number((spec.agent.oel * spec.agent.detectionShare).toPrecision(2));
      const picks: Array<{ workerId: number; date: string }> = [];
      for (let index = 0; index < count; index += 1) {
        const date = days[first + index * 12];
        const workerId = members[index % members.length];
        picks.push({ workerId, date });
        const drawn = spec.geometricMean * Math.exp(logGsd * random.normal());
        const nonDetect = limit !== null && drawn < limit;
        const value = nonDetect ? limit! : Number(drawn.toPrecision(3));
        const isVoid = random.uniform() < 0.005;
        if (nonDetect) nonDetects += 1;
        if (isVoid) voided += 1;
        resultRows.push({
          organizationId,
          exposureGroupId: groupIds[groupIndex],
          workerId,
          agentId: spec.agent.id,
          date,
          value,
          unit: spec.agent.unit,
          nonDetect,
          detectionLimit: nonDetect ? value : null,
          source: 'entered',
          sampleId: spec.agent.kind === 'noise' ? null : `RR-${groupIds[groupIndex]}-${date.replaceAll('-', '')}`,
          lab: spec.agent.kind === 'noise' ? null : 'Test laboratory (invented)',
          details: { statement: 'Test data: an invented shift result.', flags: [] },
          notes: '',
          status: isVoid ? 'void' : 'valid',
          voidReason: isVoid ? 'Test data: pump fault found at post-calibration' : null,
          voidedAt: isVoid ? stamp : null,
          ...times,
        });
      }
      if (groupIndex % 4 === 0) planRows.push({ groupIndex, picks });
    });
    insertChunks(resultRows, 400, (chunk) => tx.insert(shiftResults).values(chunk).run());
    // Each entered result moved the group's data version by one, as the services do.
    tx.run(sql`UPDATE exposure_groups SET results_changed_at = ${stamp},
      data_version = (SELECT COUNT(*) FROM shift_results r WHERE r.exposure_group_id = exposure_groups.id)
      WHERE organization_id = ${organizationId}`);

    // Sampling plans for a quarter of the groups: the entered results' shifts are the picks, plus 4 not yet measured.
    planRows.forEach((plan, planIndex) => {
      const groupId = groupIds[plan.groupIndex];
      const extra = Array.from({ length: 4 }, (_, k) => ({ workerId: plan.picks[k % plan.picks.length].workerId, date: `2025-0${1 + (k % 6)}-1${k}` }));
      const picks = [...plan.picks, ...extra];
      const planId = tx
        .insert(samplingPlans)
        .values({
          organizationId,
          exposureGroupId: groupId,
          title: '2024 campaign',
          targetCount: picks.length,
          startDate: '2024-01-01',
          endDate: '2025-06-30',
          seed: planIndex + 1,
          availableShifts: days.length * largeSizes.membersPerGroup,
          notes: 'Test plan (invented).',
          ...times,
        })
        .returning({ id: samplingPlans.id })
        .get().id;
      tx.insert(plannedPicks)
        .values(
          picks.map((pick, position) => ({
            organizationId,
            samplingPlanId: planId,
            draw: 1,
            workerId: pick.workerId,
            date: pick.date,
            position: position + 1,
          })),
        )
        .run();
    });

    // Approved decision records for 70 % of the groups, 5 % more as drafts; a tenth of the approved ones are
    // out of date (approved at an earlier data version). The category follows the seeded distribution's
    // 95th percentile (GM · GSD^1.645) against the OEL: invented records, not a computation.
    const recordRows: Array<typeof decisionRecords.$inferInsert> = [];
    groupSpecs.forEach((spec, groupIndex) => {
      const draw = random.uniform();
      if (draw >= 0.75) return;
      const approved = draw < 0.7;
      const p95 = spec.geometricMean * spec.geometricStandardDeviation ** 1.645;
      const category: ExposureCategory = exposureCategory(p95, spec.agent.oel);
      const judgement: Judgement = category === 4 ? 'unacceptable' : category === 3 ? 'uncertain' : 'acceptable';
      // Review dates from half a year ago to two years ahead of the seeding day: some overdue, most later.
      const reviewDate = addDays(now.toISOString().slice(0, 10), Math.floor(random.uniform() * 910) - 180);
      const version = perGroup - (accepted.has(groupIndex) ? 1 : 0);
      recordRows.push({
        organizationId,
        exposureGroupId: groupIds[groupIndex],
        status: approved ? 'approved' : 'draft',
        category,
        judgement,
        rationale: 'Test record (invented): the category follows the seeded 95th percentile.',
        reviewDate,
        reviewDateSource: 'Test data',
        draftedByUserId: hygienistId,
        submittedAt: stamp,
        approvedByUserId: approved ? analystId : null,
        approvedAt: approved ? stamp : null,
        dataVersionAtDraft: version,
        dataVersionAtApproval: approved ? (random.uniform() < 0.1 ? version - 1 : version) : null,
        ...times,
      });
    });
    insertChunks(recordRows, 300, (chunk) => tx.insert(decisionRecords).values(chunk).run());

    recordAudit(tx, {
      organizationId,
      actorUserId: null,
      entityType: 'organization',
      entityId: String(organizationId),
      action: 'large_test_seeded',
      reason: 'Large invented test organization seeded (seed-large.ts)',
      before: null,
      after: { groups: groupIds.length, shiftResults: resultRows.length, workers: workerIds.length },
      at: now,
    });
    return {
      organizationId,
      hygienistId,
      groupIds,
      noiseGroupIndexes,
      accepted,
      membersOf,
      nonDetects,
      voided,
      results: resultRows.length,
      workers: workerRows.length,
      plans: planRows.length,
      approved: recordRows.filter((row) => row.status === 'approved').length,
    };
  });

  const bulkSeconds = (performance.now() - started) / 1000;
  // Noise logs through the upload service: 8-h sawmill shifts at 60 s (compact), on 2025 dates so an
  // accepted log never meets an entered 2024 result of the same shift.
  const workerCodes = new Map(
    db
      .select({ id: workers.id, code: workers.code })
      .from(workers)
      .where(eq(workers.organizationId, built.organizationId))
      .all()
      .map((row) => [row.id, row.code]),
  );
  built.noiseGroupIndexes.forEach((groupIndex, logIndex) => {
    const workerId = built.membersOf(groupIndex)[logIndex % largeSizes.membersPerGroup];
    storeDemoNoiseLog(db, clock, {
      organizationId: built.organizationId,
      actor: { id: built.hygienistId },
      groupId: built.groupIds[groupIndex],
      worker: { id: workerId, code: workerCodes.get(workerId)! },
      date: `2025-02-${String(3 + (logIndex % 20)).padStart(2, '0')}`,
      accept: built.accepted.has(groupIndex),
      options: { seed: 700_000 + logIndex, hours: 8, intervalSeconds: 60, knockCount: logIndex % 3, levelOffsetDb: (logIndex % 9) - 4 },
    });
  });

  return {
    organizationId: built.organizationId,
    sites: siteNames.length,
    groups: built.groupIds.length,
    workers: built.workers,
    shiftResults: built.results + built.accepted.size,
    nonDetects: built.nonDetects,
    voided: built.voided,
    noiseLogs: built.noiseGroupIndexes.length,
    approvedRecords: built.approved,
    samplingPlans: built.plans,
    seconds: (performance.now() - started) / 1000,
    bulkSeconds,
  };
}

const usage = 'Usage: npm run seed:large -- [--database FILE] [--seed N] [--password TEXT]';

async function main(): Promise<number> {
  let values;
  try {
    ({ values } = parseArgs({ options: { database: { type: 'string' }, seed: { type: 'string' }, password: { type: 'string' } } }));
  } catch (error) {
    console.error(`seed:large: ${(error as Error).message}\n${usage}`);
    return 2;
  }
  const seed = values.seed === undefined ? undefined : Number(values.seed);
  if (seed !== undefined && !(Number.isInteger(seed) && seed >= 1 && seed <= 4_294_967_295)) {
    console.error(`seed:large: --seed must be an integer from 1 to 4294967295, got "${values.seed}"\n${usage}`);
    return 2;
  }
  const path = values.database ?? process.env.DATABASE_PATH ?? 'data/bellwether.db';
  const password = values.password ?? process.env.DEMO_PASSWORD ?? 'bellwether-demo';
  const db = openMigratedDatabase(path);
  try {
    const summary = await seedLargeOrganization(db, { seed, password });
    console.log(
      `Seeded "${largeOrganizationName}" into ${path} in ${summary.seconds.toFixed(1)} s (noise logs ${(summary.seconds - summary.bulkSeconds).toFixed(1)} s): ${summary.sites} sites, ${summary.groups} groups, ${summary.workers} workers, ` +
        `${summary.shiftResults} shift results (${summary.nonDetects} non-detects, ${summary.voided} void), ${summary.noiseLogs} noise logs, ` +
        `${summary.samplingPlans} sampling plans, ${summary.approvedRecords} approved decision records.\n` +
        `Sign in as ${roles.map((role) => `${role}@${largeDomain}`).join(', ')} with the password "${password}".`,
    );
    return 0;
  } catch (error) {
    console.error(`seed:large: ${error instanceof Error ? error.message : String(error)}`);
    return 1;
  } finally {
    db.$client.close();
  }
}

if (isInvokedDirectly(import.meta.url)) process.exitCode = await main();
