/**
 * Dashboards (issue 7, PRODUCT.md capability 7): GET /api/orgs/:orgId/dashboard and GET /api/me/overview
 * on the demo with its decision records (backend/src/db/seed-demo-decisions.ts): a group's category is
 * its current approved record's; review windows count from the server's date.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DecisionRecordView } from '@schema/decision-records';
import type { OrganizationDashboard, OverviewOrganization } from '@schema/dashboard';
import { groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

/** Group names for a list of group ids, looked up in the answer's `groups`; an unknown id fails the test. */
function namesOf(dashboard: OrganizationDashboard) {
  const byId = new Map(dashboard.groups.map((group) => [group.id, group.name]));
  return (ids: readonly number[]) =>
    ids.map((id) => {
      const name = byId.get(id);
      if (name === undefined) throw new Error(`group ${id} is listed but not in the dashboard's groups`);
      return name;
    });
}

describe('dashboards', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let manager: SignedIn;

  beforeAll(async () => {
    context = await createTestContext({ decisions: true });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    manager = await context.signInAs('manager');
  });
  afterAll(() => context.close());

  it('places each group with an approved record in its site × category cell, and the rest as undecided', async () => {
    const answer = await manager.get(`/api/orgs/${ridgeback}/dashboard`);
    expect(answer.status).toBe(200);
    const dashboard = answer.body as OrganizationDashboard;
    const names = namesOf(dashboard);
    expect(dashboard.organization.name).toBe('Ridgeback Timber Co.');
    const sawmill = dashboard.matrix.find((row) => row.siteName === 'Ridgeback sawmill')!;
    const edger = dashboard.groups.find((group) => group.name === 'Edger operator – noise')!;
    const filer = dashboard.groups.find((group) => group.name === 'Saw filer – noise')!;
    expect(edger.judgement).toBe('unacceptable');
    expect(filer.judgement).toBe('acceptable');
    expect(names(sawmill.cells[edger.category!])).toContain('Edger operator – noise');
    expect(names(sawmill.cells[filer.category!])).toContain('Saw filer – noise');
    expect(names(sawmill.undecided)).toContain('Head sawyer – noise');
    // Each group sits in exactly one cell; the lists refer to `groups` by id and repeat nothing else.
    const placed = dashboard.matrix.flatMap((row) => [...row.cells.flat(), ...row.undecided]);
    expect(placed.toSorted((a, b) => a - b)).toEqual(dashboard.groups.map((group) => group.id).toSorted((a, b) => a - b));
    expect(dashboard.counts).toMatchObject({
      groups: dashboard.groups.length,
      decided: 2,
      undecided: dashboard.groups.length - 2,
      openDrafts: 2,
      outOfDate: 0,
    });
  });

  it('lists unacceptable groups, recent decisions with their status, and the sampling progress of each plan', async () => {
    const dashboard = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(namesOf(dashboard)(dashboard.unacceptable)).toEqual(['Edger operator – noise']);
    expect(dashboard.recentDecisions.map((record) => [record.exposureGroupName, record.status]).sort()).toEqual(
      [
        ['Edger operator – noise', 'approved'],
        ['Head sawyer – noise', 'draft'],
        ['Planer feeder – wood dust', 'returned'],
        ['Saw filer – noise', 'approved'],
      ].sort(),
    );
    // Head sawyer – noise: plan of 10 with 8 measured (seed-demo-results.ts).
    const sawyer = dashboard.groups.find((group) => group.name === 'Head sawyer – noise')!;
    expect(sawyer.plan).toMatchObject({ targetCount: 10, done: 8 });
    expect(sawyer.openDraft).toBe('draft');
  });

  it('sorts review dates into overdue, within 30 and within 90 days as the clock moves', async () => {
    const dashboard = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    const edger = dashboard.groups.find((group) => group.name === 'Edger operator – noise')!;
    expect(dashboard.reviews.overdue).toEqual([]);
    // Move to 20 days before the edger's review date, then past it.
    const due = Date.parse(`${edger.reviewDate}T08:00:00Z`);
    context.clock.set(new Date(due - 20 * 86_400_000));
    const soon = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(namesOf(soon)(soon.reviews.within30)).toContain('Edger operator – noise');
    context.clock.set(new Date(due - 60 * 86_400_000));
    const later = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(namesOf(later)(later.reviews.within90)).toContain('Edger operator – noise');
    context.clock.set(new Date(due + 86_400_000));
    const late = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(namesOf(late)(late.reviews.overdue)).toContain('Edger operator – noise');
    context.clock.set('2025-03-03T08:00:00.000Z');
  });

  it('a new result marks the group out of date on the dashboard', async () => {
    const hygienist = await context.signInAs('hygienist');
    const edgerId = groupId(context.db, ridgeback, 'Edger operator – noise');
    const added = await hygienist.post(`/api/orgs/${ridgeback}/shift-results`, {
      exposureGroupId: edgerId,
      workerId: workerId(context.db, ridgeback, 'RT-003'),
      date: '2025-02-12',
      value: 150,
    });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    const dashboard = (await manager.get(`/api/orgs/${ridgeback}/dashboard`)).body as OrganizationDashboard;
    expect(dashboard.groups.find((group) => group.id === edgerId)!.outOfDate).toBe(true);
    expect(dashboard.counts.outOfDate).toBe(1);
    const record = (await manager.get(`/api/orgs/${ridgeback}/decision-records/${dashboard.groups.find((group) => group.id === edgerId)!.recordId}`))
      .body as DecisionRecordView;
    expect(record.outOfDate).toBe(true);
  });

  it('the consultant’s overview covers both organizations they serve; a manager’s only their own', async () => {
    const consultant = await context.signInAs('consultant');
    const overview = (await consultant.get('/api/me/overview')).body as { organizations: OverviewOrganization[] };
    expect(overview.organizations.map((entry) => [entry.organization.name, entry.role])).toEqual([
      ['Ridgeback Timber Co.', 'consultant'],
      ['Slate Harbor Stoneworks', 'consultant'],
    ]);
    const slate = overview.organizations.find((entry) => entry.organization.id === slateHarbor)!;
    expect(slate.unacceptable.map((group) => group.name)).toEqual(['Installer – respirable crystalline silica']);
    expect(slate.categories.reduce((sum, count) => sum + count, 0)).toBe(1);
    const mine = (await manager.get('/api/me/overview')).body as { organizations: OverviewOrganization[] };
    expect(mine.organizations.map((entry) => entry.organization.name)).toEqual(['Ridgeback Timber Co.']);
  });

  it('another organization’s dashboard is not found (404); signed out is 401', async () => {
    expect((await manager.get(`/api/orgs/${slateHarbor}/dashboard`)).status).toBe(404);
    const anonymous = await context.client();
    expect((await anonymous.get('/api/me/overview')).status).toBe(401);
  });
});
