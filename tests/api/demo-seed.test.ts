import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { agents } from '@schema/agents';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { users } from '@schema/users';
import { groupMemberships, workers } from '@schema/workers';
import { createFakeClock } from '../../backend/src/clock';
import type { Db } from '../../backend/src/db/client';
import { seedDemo } from '../../backend/src/db/seed-demo';
import { createTemporaryDatabase } from '../helpers/test-app';

describe('demo seed', () => {
  let temporary: ReturnType<typeof createTemporaryDatabase>;
  let db: Db;
  const clock = createFakeClock();
  beforeAll(() => {
    temporary = createTemporaryDatabase();
    db = temporary.db;
  });
  afterAll(() => temporary.close());

  it('seeds a new database once; a second run changes nothing', async () => {
    expect(await seedDemo(db, { password: 'bellwether-demo', clock })).toEqual({ seeded: true });
    const counts = () => [users, organizations, workers, exposureGroups].map((table) => db.select().from(table).all().length);
    const first = counts();
    expect(first).toEqual([9, 2, 25, 12]);
    expect(await seedDemo(db, { password: 'bellwether-demo', clock })).toEqual({ seeded: false });
    expect(counts()).toEqual(first);
  });

  it('stores respirable crystalline silica with its CAS number and molecular weight', () => {
    const slate = db.select().from(organizations).where(eq(organizations.slug, 'slate-harbor')).get()!;
    const silica = db
      .select()
      .from(agents)
      .where(and(eq(agents.organizationId, slate.id), eq(agents.kind, 'chemical')))
      .get()!;
    expect(silica).toMatchObject({ casNumber: '14808-60-7', molecularWeight: 60.08 });
  });

  it('keeps group membership over time: RT-005 left the edger group before joining the planer feeders', () => {
    const worker = db.select().from(workers).where(eq(workers.code, 'RT-005')).get()!;
    const periods = db
      .select({ group: exposureGroups.name, fromDate: groupMemberships.fromDate, toDate: groupMemberships.toDate })
      .from(groupMemberships)
      .innerJoin(exposureGroups, eq(exposureGroups.id, groupMemberships.exposureGroupId))
      .where(eq(groupMemberships.workerId, worker.id))
      .all();
    expect(periods).toContainEqual({ group: 'Edger operator – noise', fromDate: '2023-01-09', toDate: '2024-03-01' });
    expect(periods).toContainEqual({ group: 'Planer feeder – noise', fromDate: '2024-03-04', toDate: null });
  });

  it('passwords are stored as argon2id hashes', () => {
    const admin = db.select().from(users).where(eq(users.email, 'admin@ridgeback.example')).get()!;
    expect(admin.passwordHash).toMatch(/^\$argon2id\$v=19\$/);
  });
});
