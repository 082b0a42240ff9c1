import { count } from 'drizzle-orm';
import { agents, oelEntries, type AveragingTime, type ExposureUnit } from '@schema/agents';
import { exposureGroups, type NoiseCriteriaSet } from '@schema/exposure-groups';
import { memberships, organizations } from '@schema/organizations';
import type { Role } from '@schema/permissions';
import { sites } from '@schema/sites';
import { users } from '@schema/users';
import { groupMemberships, workers } from '@schema/workers';
import type { Clock } from '../clock';
import { recordAudit } from '../services/audit';
import { hashPassword } from '../services/passwords';
import type { Db } from './client';
import { seedDemoDecisions } from './seed-demo-decisions';
import { demoWorkerEmail, seedDemoWorkerLetters } from './seed-demo-letters';
import { seedDemoNoiseLogs } from './seed-demo-noise';
import { seedDemoProtectors } from './seed-demo-protectors';
import { seedDemoPlansAndResults } from './seed-demo-results';

/*
 * The invented demo scenario of PRODUCT.md: Ridgeback Timber Co. (sawmill and planing mill;
 * noise and inhalable wood dust) and Slate Harbor Stoneworks (stone countertops; respirable
 * crystalline silica and noise), served by one consultant. Every name and number is invented.
 * The limits are generic examples, labelled as such in their source: real work takes its limits
 * from the regulations that apply locally.
 */

export const defaultDemoPassword = 'bellwether-demo';

interface DemoPerson {
  email: string;
  name: string;
  roles: Partial<Record<OrganizationKey, Role>>;
}
type OrganizationKey = 'ridgeback' | 'slateHarbor';

const people: DemoPerson[] = [
  { email: 'admin@ridgeback.example', name: 'Morgan Pike', roles: { ridgeback: 'admin' } },
  { email: 'hygienist@ridgeback.example', name: 'Dana Whitlock', roles: { ridgeback: 'hygienist' } },
  { email: 'analyst@ridgeback.example', name: 'Jordan Ames', roles: { ridgeback: 'analyst' } },
  { email: 'manager@ridgeback.example', name: 'Casey Brandt', roles: { ridgeback: 'manager' } },
  { email: 'admin@slateharbor.example', name: 'Quinn Halloway', roles: { slateHarbor: 'admin' } },
  { email: 'hygienist@slateharbor.example', name: 'Sasha Marr', roles: { slateHarbor: 'hygienist' } },
  { email: 'analyst@slateharbor.example', name: 'Emery Voss', roles: { slateHarbor: 'analyst' } },
  { email: 'manager@slateharbor.example', name: 'Harper Lane', roles: { slateHarbor: 'manager' } },
  { email: 'consultant@fieldwise.example', name: 'Taylor Fenwick', roles: { ridgeback: 'consultant', slateHarbor: 'consultant' } },
];

interface DemoLimit {
  source: string;
  value: number;
  unit: ExposureUnit;
  averagingTime: AveragingTime;
}
interface DemoAgent {
  key: string;
  name: string;
  kind: 'noise' | 'chemical';
  casNumber?: string;
  molecularWeight?: number;
  notes: string;
  limits: DemoLimit[];
}
interface DemoGroup {
  site: string;
  name: string;
  processArea: string;
  jobTitles: string[];
  tasks: string;
  agent: string;
  /** Index into the agent's limits. */
  limit: number;
  actionLevel: number;
  shiftHours: number;
  noiseCriteriaSet?: NoiseCriteriaSet;
  exposureProfile: string;
}
interface DemoWorker {
  code: string;
  name: string | null;
  jobTitle: string;
  /** Group name → [from, to | null]. */
  groups: Array<[string, string, string | null]>;
}
interface DemoOrganization {
  key: OrganizationKey;
  name: string;
  slug: string;
  sites: Array<{ name: string; description: string }>;
  agents: DemoAgent[];
  groups: DemoGroup[];
  workers: DemoWorker[];
}

const noise = (note: string): DemoAgent => ({
  key: 'noise',
  name: 'Noise',
  kind: 'noise',
  notes: note,
  // Groups take the first entry: a daily dose in % (linear, so judged with the lognormal statistics).
  limits: [
    {
      source: 'Example daily noise dose, 85 dBA criterion, 3 dB exchange rate (demo data; use the regulation that applies to you)',
      value: 100,
      unit: 'dose-percent',
      averagingTime: '8h-twa',
    },
    { source: 'Example criterion level (demo data; use the regulation that applies to you)', value: 85, unit: 'dBA', averagingTime: '8h-twa' },
  ],
});

const since = '2023-01-09';

const ridgeback: DemoOrganization = {
  key: 'ridgeback',
  name: 'Ridgeback Timber Co.',
  slug: 'ridgeback-timber',
  sites: [
    { name: 'Ridgeback sawmill', description: 'Log yard, headrig, edger and trimmer lines, saw filing room.' },
    { name: 'Ridgeback planing mill', description: 'Planer line, grading and packaging, lumber yard and sheds.' },
  ],
  agents: [
    noise('Continuous and impact noise from saws, planers, chippers and mobile plant.'),
    {
      key: 'woodDust',
      name: 'Inhalable wood dust',
      kind: 'chemical',
      notes: 'Mostly softwood. A mixture: no CAS number or molecular weight.',
      limits: [
        { source: 'Example regulatory limit (demo data)', value: 5, unit: 'mg/m3', averagingTime: '8h-twa' },
        { source: 'Example recommended limit (demo data)', value: 1, unit: 'mg/m3', averagingTime: '8h-twa' },
      ],
    },
  ],
  groups: [
    {
      site: 'Ridgeback sawmill',
      name: 'Head sawyer – noise',
      processArea: 'Headrig',
      jobTitles: ['Head sawyer'],
      tasks: 'Runs the headrig carriage and band saw from the booth; walks the deck at log changes.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 10,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Booth with closed windows most of the shift; short spells on the open deck near the saw.',
    },
    {
      site: 'Ridgeback sawmill',
      name: 'Edger operator – noise',
      processArea: 'Edger line',
      jobTitles: ['Edger operator'],
      tasks: 'Feeds and sets cants at the edger; clears jams.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 10,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Open workstation beside the edger saws for most of the shift.',
    },
    {
      site: 'Ridgeback sawmill',
      name: 'Saw filer – noise',
      processArea: 'Filing room',
      jobTitles: ['Saw filer'],
      tasks: 'Grinds, levels and tensions band saws and circular saws.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 8,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Grinders and the hammering bench; separated from the mill by a wall.',
    },
    {
      site: 'Ridgeback sawmill',
      name: 'Maintenance fitter – noise',
      processArea: 'Whole mill',
      jobTitles: ['Maintenance fitter'],
      tasks: 'Breakdown repairs, planned maintenance, welding and grinding across both mills.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 10,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Varies from day to day with the jobs on the board.',
    },
    {
      site: 'Ridgeback sawmill',
      name: 'Head sawyer – wood dust',
      processArea: 'Headrig',
      jobTitles: ['Head sawyer'],
      tasks: 'As for noise: booth work with spells on the deck.',
      agent: 'woodDust',
      limit: 0,
      actionLevel: 2.5,
      shiftHours: 10,
      exposureProfile: 'Dust mainly during deck spells and clean-up at shift end.',
    },
    {
      site: 'Ridgeback planing mill',
      name: 'Planer feeder – noise',
      processArea: 'Planer infeed',
      jobTitles: ['Planer feeder'],
      tasks: 'Feeds rough lumber into the planer; clears jams at the infeed.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 8,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Beside the planer enclosure door for most of the shift.',
    },
    {
      site: 'Ridgeback planing mill',
      name: 'Planer feeder – wood dust',
      processArea: 'Planer infeed',
      jobTitles: ['Planer feeder'],
      tasks: 'Feeds rough lumber; blows down the infeed at breaks.',
      agent: 'woodDust',
      limit: 0,
      actionLevel: 2.5,
      shiftHours: 8,
      exposureProfile: 'Fine dust at the infeed; compressed-air clean-down at breaks.',
    },
    {
      site: 'Ridgeback planing mill',
      name: 'Forklift driver – noise',
      processArea: 'Yard and sheds',
      jobTitles: ['Forklift driver'],
      tasks: 'Moves packs between the mills, sheds and trucks.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 8,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Open-cab machines; passes the planer and the chipper many times a shift.',
    },
  ],
  workers: [
    {
      code: 'RT-001',
      name: 'Alex Corran',
      jobTitle: 'Head sawyer',
      groups: [
        ['Head sawyer – noise', since, null],
        ['Head sawyer – wood dust', since, null],
      ],
    },
    {
      code: 'RT-002',
      name: null,
      jobTitle: 'Head sawyer',
      groups: [
        ['Head sawyer – noise', since, null],
        ['Head sawyer – wood dust', since, null],
      ],
    },
    { code: 'RT-003', name: 'Billie Tarrant', jobTitle: 'Edger operator', groups: [['Edger operator – noise', since, null]] },
    { code: 'RT-004', name: null, jobTitle: 'Edger operator', groups: [['Edger operator – noise', since, null]] },
    {
      code: 'RT-005',
      name: 'Sam Okafor-Reid',
      jobTitle: 'Planer feeder',
      groups: [
        ['Edger operator – noise', since, '2024-03-01'],
        ['Planer feeder – noise', '2024-03-04', null],
        ['Planer feeder – wood dust', '2024-03-04', null],
      ],
    },
    { code: 'RT-006', name: 'Kit Lindqvist', jobTitle: 'Saw filer', groups: [['Saw filer – noise', since, null]] },
    { code: 'RT-007', name: null, jobTitle: 'Saw filer', groups: [['Saw filer – noise', since, null]] },
    { code: 'RT-008', name: 'Robin Achterberg', jobTitle: 'Maintenance fitter', groups: [['Maintenance fitter – noise', since, null]] },
    { code: 'RT-009', name: null, jobTitle: 'Maintenance fitter', groups: [['Maintenance fitter – noise', since, null]] },
    { code: 'RT-010', name: 'Jesse Maranta', jobTitle: 'Maintenance fitter', groups: [['Maintenance fitter – noise', '2023-06-05', null]] },
    {
      code: 'RT-011',
      name: null,
      jobTitle: 'Planer feeder',
      groups: [
        ['Planer feeder – noise', since, null],
        ['Planer feeder – wood dust', since, null],
      ],
    },
    {
      code: 'RT-012',
      name: 'Noor Haddley',
      jobTitle: 'Planer feeder',
      groups: [
        ['Planer feeder – noise', since, null],
        ['Planer feeder – wood dust', since, null],
      ],
    },
    {
      code: 'RT-013',
      name: null,
      jobTitle: 'Planer feeder',
      groups: [
        ['Planer feeder – noise', since, null],
        ['Planer feeder – wood dust', since, null],
      ],
    },
    { code: 'RT-014', name: 'Frankie Dunmore', jobTitle: 'Forklift driver', groups: [['Forklift driver – noise', since, null]] },
    { code: 'RT-015', name: null, jobTitle: 'Forklift driver', groups: [['Forklift driver – noise', since, null]] },
    { code: 'RT-016', name: 'Lee Varga', jobTitle: 'Forklift driver', groups: [['Forklift driver – noise', since, '2024-09-30']] },
  ],
};

const silica: DemoAgent = {
  key: 'silica',
  name: 'Respirable crystalline silica (quartz)',
  kind: 'chemical',
  casNumber: '14808-60-7',
  molecularWeight: 60.08,
  notes: 'Engineered stone and granite; respirable fraction.',
  limits: [
    { source: 'Example regulatory limit (demo data)', value: 0.05, unit: 'mg/m3', averagingTime: '8h-twa' },
    { source: 'Example recommended limit (demo data)', value: 0.025, unit: 'mg/m3', averagingTime: '8h-twa' },
  ],
};

const slateHarbor: DemoOrganization = {
  key: 'slateHarbor',
  name: 'Slate Harbor Stoneworks',
  slug: 'slate-harbor',
  sites: [{ name: 'Fabrication shop', description: 'Bridge saw, waterjet, edge polishing and finishing bays; installation crews leave from here.' }],
  agents: [noise('Bridge saw, hand grinders and polishers, compressed air.'), silica],
  groups: [
    {
      site: 'Fabrication shop',
      name: 'Cutter – respirable crystalline silica',
      processArea: 'Saw and waterjet bay',
      jobTitles: ['Cutter'],
      tasks: 'Loads slabs, runs the bridge saw and waterjet, makes hand cuts with wet grinders.',
      agent: 'silica',
      limit: 0,
      actionLevel: 0.025,
      shiftHours: 8,
      exposureProfile: 'Wet cutting on the machines; dry hand cuts are the main source when they happen.',
    },
    {
      site: 'Fabrication shop',
      name: 'Cutter – noise',
      processArea: 'Saw and waterjet bay',
      jobTitles: ['Cutter'],
      tasks: 'As for silica.',
      agent: 'noise',
      limit: 0,
      actionLevel: 50,
      shiftHours: 8,
      noiseCriteriaSet: 'nioshRel',
      exposureProfile: 'Bridge saw and grinders for most of the shift.',
    },
    {
      site: 'Fabrication shop',
      name: 'Polisher – respirable crystalline silica',
      processArea: 'Edge polishing bay',
      jobTitles: ['Polisher'],
      tasks: 'Edge profiles and polishes with wet hand tools; finishes sink cut-outs.',
      agent: 'silica',
      limit: 0,
      actionLevel: 0.025,
      shiftHours: 8,
      exposureProfile: 'Wet hand polishing; spray and slurry dry out on the floor during the shift.',
    },
    {
      site: 'Fabrication shop',
      name: 'Installer – respirable crystalline silica',
      processArea: 'Customer sites',
      jobTitles: ['Installer'],
      tasks: 'Fits countertops at customer sites; small cuts and cut-outs on site.',
      agent: 'silica',
      limit: 0,
      actionLevel: 0.025,
      shiftHours: 8,
      exposureProfile: 'Short, intense tasks on site, often without water; varies widely between jobs.',
    },
  ],
  workers: [
    {
      code: 'SH-001',
      name: 'Marin Estevan',
      jobTitle: 'Cutter',
      groups: [
        ['Cutter – respirable crystalline silica', since, null],
        ['Cutter – noise', since, null],
      ],
    },
    {
      code: 'SH-002',
      name: null,
      jobTitle: 'Cutter',
      groups: [
        ['Cutter – respirable crystalline silica', since, null],
        ['Cutter – noise', since, null],
      ],
    },
    {
      code: 'SH-003',
      name: 'Ari Kowalczyk-Dunn',
      jobTitle: 'Cutter',
      groups: [
        ['Cutter – respirable crystalline silica', since, null],
        ['Cutter – noise', since, null],
      ],
    },
    { code: 'SH-004', name: null, jobTitle: 'Polisher', groups: [['Polisher – respirable crystalline silica', since, null]] },
    { code: 'SH-005', name: 'Remy Aldana', jobTitle: 'Polisher', groups: [['Polisher – respirable crystalline silica', since, null]] },
    {
      code: 'SH-006',
      name: null,
      jobTitle: 'Cutter',
      groups: [
        ['Polisher – respirable crystalline silica', since, '2024-05-31'],
        ['Cutter – respirable crystalline silica', '2024-06-03', null],
        ['Cutter – noise', '2024-06-03', null],
      ],
    },
    { code: 'SH-007', name: 'Drew Pellham', jobTitle: 'Installer', groups: [['Installer – respirable crystalline silica', since, null]] },
    { code: 'SH-008', name: null, jobTitle: 'Installer', groups: [['Installer – respirable crystalline silica', since, null]] },
    { code: 'SH-009', name: 'Tam Oyelaran', jobTitle: 'Installer', groups: [['Installer – respirable crystalline silica', '2023-09-04', null]] },
  ],
};

const demoOrganizations = [ridgeback, slateHarbor];

export interface DemoSignIn {
  email: string;
  name: string;
  /** e.g. "admin at Ridgeback Timber Co." */
  access: string;
}

/** The demo sign-ins, for the start-up message. */
export const demoSignIns: DemoSignIn[] = people.map((person) => ({
  email: person.email,
  name: person.name,
  access: demoOrganizations
    .filter((organization) => person.roles[organization.key])
    .map((organization) => `${person.roles[organization.key]} at ${organization.name}`)
    .join(', '),
}));

/** Whether the database holds no users and no organizations yet (a new database). */
export function databaseIsEmpty(db: Db): boolean {
  const userCount = db.select({ total: count() }).from(users).get()?.total ?? 0;
  const organizationCount = db.select({ total: count() }).from(organizations).get()?.total ?? 0;
  return userCount === 0 && organizationCount === 0;
}

/**
 * Seeds the demo scenario into a new database, all in one transaction. Does nothing (and says
 * so) when the database already has users or organizations, so it is safe to call at every start.
 */
/**
 * Seeds the demo into an empty database. `decisions` (default true) adds the demo decision records
 * (seed-demo-decisions.ts), which run the statistics engine; tests that do not need them pass false.
 */
export async function seedDemo(db: Db, options: { password: string; clock: Clock; decisions?: boolean }): Promise<{ seeded: boolean }> {
  if (!databaseIsEmpty(db)) return { seeded: false };
  // Hash before the transaction: better-sqlite3 transactions are synchronous.
  const hashes = await Promise.all(people.map(() => hashPassword(options.password)));
  const now = options.clock.now();
  const stamp = now.toISOString();
  const times = { createdAt: stamp, updatedAt: stamp };

  const outcome = db.transaction((tx) => {
    if (tx.select({ total: count() }).from(users).get()!.total > 0) return { seeded: false };
    const userIds = people.map(
      (person, index) =>
        tx
          .insert(users)
          .values({ email: person.email, name: person.name, passwordHash: hashes[index], ...times })
          .returning({ id: users.id })
          .get().id,
    );

    for (const demo of demoOrganizations) {
      const organization = tx
        .insert(organizations)
        .values({ name: demo.name, slug: demo.slug, settings: {}, ...times })
        .returning()
        .get();
      const organizationId = organization.id;

      people.forEach((person, index) => {
        const role = person.roles[demo.key];
        if (role)
          tx.insert(memberships)
            .values({ organizationId, userId: userIds[index], role, ...times })
            .run();
      });

      const siteIds = new Map<string, number>();
      for (const site of demo.sites) {
        siteIds.set(
          site.name,
          tx
            .insert(sites)
            .values({ organizationId, ...site, ...times })
            .returning()
            .get().id,
        );
      }

      const agentRows = new Map<string, { id: number; limits: Array<DemoLimit & { id: number }> }>();
      for (const agent of demo.agents) {
        const row = tx
          .insert(agents)
          .values({
            organizationId,
            name: agent.name,
            kind: agent.kind,
            casNumber: agent.casNumber ?? null,
            molecularWeight: agent.molecularWeight ?? null,
            notes: agent.notes,
            ...times,
          })
          .returning()
          .get();
        const limits = agent.limits.map((limit) => ({
          ...limit,
          id: tx
            .insert(oelEntries)
            .values({ organizationId, agentId: row.id, ...limit, ...times })
            .returning()
            .get().id,
        }));
        agentRows.set(agent.key, { id: row.id, limits });
      }

      const groupIds = new Map<string, number>();
      for (const group of demo.groups) {
        const agent = agentRows.get(group.agent)!;
        const limit = agent.limits[group.limit];
        const row = tx
          .insert(exposureGroups)
          .values({
            organizationId,
            siteId: siteIds.get(group.site)!,
            name: group.name,
            processArea: group.processArea,
            jobTitles: group.jobTitles,
            tasks: group.tasks,
            agentId: agent.id,
            oelEntryId: limit.id,
            oelValue: limit.value,
            oelUnit: limit.unit,
            oelSource: limit.source,
            oelAveragingTime: limit.averagingTime,
            actionLevel: group.actionLevel,
            shiftHours: group.shiftHours,
            noiseCriteriaSet: group.noiseCriteriaSet ?? null,
            exposureProfile: group.exposureProfile,
            ...times,
          })
          .returning()
          .get();
        groupIds.set(group.name, row.id);
      }

      for (const worker of demo.workers) {
        const workerId = tx
          .insert(workers)
          .values({ organizationId, code: worker.code, name: worker.name, jobTitle: worker.jobTitle, email: demoWorkerEmail(worker.name, demo.slug), ...times })
          .returning()
          .get().id;
        for (const [groupName, fromDate, toDate] of worker.groups) {
          const exposureGroupId = groupIds.get(groupName);
          if (exposureGroupId === undefined) throw new Error(`Demo worker ${worker.code}: no group "${groupName}"`);
          tx.insert(groupMemberships)
            .values({ organizationId, workerId, exposureGroupId, fromDate, toDate, ...times })
            .run();
        }
      }

      seedDemoPlansAndResults(tx, { organizationId, slug: demo.slug, now });

      recordAudit(tx, {
        organizationId,
        actorUserId: null,
        entityType: 'organization',
        entityId: String(organizationId),
        action: 'demo_seeded',
        reason: 'Demo scenario seeded into a new database',
        before: null,
        after: { name: demo.name, sites: demo.sites.length, exposureGroups: demo.groups.length, workers: demo.workers.length },
        at: now,
      });
    }
    return { seeded: true };
  });
  // Noise logs go in before the decision records, so those are made from the groups' current data.
  if (outcome.seeded) seedDemoNoiseLogs(db, options.clock);
  if (outcome.seeded) seedDemoProtectors(db, options.clock);
  if (outcome.seeded) seedDemoWorkerLetters(db, options.clock);
  if (outcome.seeded && options.decisions !== false) await seedDemoDecisions(db, options.clock);
  return outcome;
}
