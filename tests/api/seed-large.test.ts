/**
 * The large test organization (backend/src/db/seed-large.ts, `npm run seed:large`) that the API load
 * benchmark runs on: the sizes the issue asks for, realistic mixtures (non-detects, void results,
 * approved records in several categories), data versions that match the results, and a refusal to seed twice.
 * Few noise logs here (the bench stores all 500) to keep the test short.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createFakeClock } from '../../backend/src/clock';
import { largeSizes, seedLargeOrganization, type LargeSeedSummary } from '../../backend/src/db/seed-large';
import { organizationDashboard } from '../../backend/src/services/dashboard';
import { createTemporaryDatabase } from '../helpers/test-app';

describe('large test organization seed', () => {
  const temporary = createTemporaryDatabase();
  const clock = createFakeClock('2026-06-01T08:00:00Z');
  let summary: LargeSeedSummary;

  beforeAll(async () => {
    summary = await seedLargeOrganization(temporary.db, { password: 'large-test-password', seed: 7, clock, noiseLogs: 6 });
  }, 180_000);
  afterAll(() => temporary.close());

  const scalar = (query: string) => (temporary.db.$client.prepare(query).pluck().get(summary.organizationId) as number) ?? 0;

  it('holds 2,000 groups and 40,000 shift results, some non-detect and some void', () => {
    expect(scalar('SELECT COUNT(*) FROM exposure_groups WHERE organization_id = ?')).toBe(largeSizes.groups);
    expect(scalar('SELECT COUNT(*) FROM shift_results WHERE organization_id = ?')).toBe(largeSizes.shiftResults);
    const nonDetects = scalar('SELECT COUNT(*) FROM shift_results WHERE organization_id = ? AND non_detect = 1');
    const voided = scalar(`SELECT COUNT(*) FROM shift_results WHERE organization_id = ? AND status = 'void'`);
    expect(nonDetects).toBe(summary.nonDetects);
    expect(nonDetects / largeSizes.shiftResults).toBeGreaterThan(0.02);
    expect(nonDetects / largeSizes.shiftResults).toBeLessThan(0.4);
    expect(voided).toBeGreaterThan(0);
    expect(voided / largeSizes.shiftResults).toBeLessThan(0.02);
  });

  it('stores the noise logs through the upload service and accepts some into their groups', () => {
    expect(scalar('SELECT COUNT(*) FROM noise_logs WHERE organization_id = ?')).toBe(6);
    expect(scalar(`SELECT COUNT(*) FROM noise_logs WHERE organization_id = ? AND status = 'accepted' AND shift_result_id IS NOT NULL`)).toBe(6);
    expect(scalar(`SELECT COUNT(*) FROM shift_results WHERE organization_id = ? AND source = 'noise-log'`)).toBe(6);
  });

  it("moves each group's data version with its results", () => {
    const mismatched = scalar(
      'SELECT COUNT(*) FROM exposure_groups g WHERE g.organization_id = ? AND g.data_version <> (SELECT COUNT(*) FROM shift_results r WHERE r.exposure_group_id = g.id)',
    );
    expect(mismatched).toBe(0);
  });

  it('gives the dashboard approved categories, undecided groups, out-of-date records and reviews due', () => {
    const dashboard = organizationDashboard(temporary.db, clock, summary.organizationId);
    expect(dashboard.counts.groups).toBe(largeSizes.groups);
    const categories = new Set(dashboard.groups.flatMap((group) => (group.category === null ? [] : [group.category])));
    expect(categories.size).toBeGreaterThanOrEqual(3);
    expect(dashboard.counts.decided).toBe(summary.approvedRecords);
    expect(dashboard.counts.undecided).toBeGreaterThan(0);
    expect(dashboard.counts.outOfDate).toBeGreaterThan(0);
    expect(dashboard.reviews.overdue.length).toBeGreaterThan(0);
  });

  it('refuses to seed the organization a second time', async () => {
    await expect(seedLargeOrganization(temporary.db, { password: 'large-test-password', clock })).rejects.toThrow(/already in this database/);
  });
});
