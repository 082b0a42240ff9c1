import { describe, expect, it } from 'vitest';
import { demoUsers, navigationItems, organizationNames, screenshot, signIn, useE2eApp } from './harness';

// What each demo role sees after signing in (PRODUCT.md "Who uses it"; the permission table
// in schema/permissions.ts). The browser only hides what a role cannot do; the server decides.

const app = useE2eApp();

// The sidebar of each role (schema/permissions.ts, app/navigation.ts): pages every member reads,
// the import for roles that change data, settings and people for admins.
const readingPages = ['Overview', 'Exposure groups', 'Decision records', 'Workers', 'Sites', 'Agents & OELs', 'Hearing protectors'];
const navigationOf = {
  admin: [...readingPages, 'Import results', 'Noise logs', 'Noise settings', 'People', 'Audit trail', 'Outbox'],
  hygienist: [...readingPages, 'Import results', 'Noise logs'],
  reader: [...readingPages, 'Noise logs'],
};

describe('signing in as each demo role', () => {
  it('an admin lands on the organization overview with its real counts and sees every page, People and Outbox included', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);

    await page.waitForURL(/\/orgs\/\d+$/);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    // The Outbox item appears once GET /api/outbox has answered that the capture runs.
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: /Outbox/ })
      .waitFor();
    expect(await navigationItems(page)).toEqual(navigationOf.admin);

    // The figures come from GET /api/orgs/:orgId/summary; the demo has sites, groups, workers and agents.
    const summary = await page.evaluate(async (path) => (await fetch(path)).json(), `/api${new URL(page.url()).pathname}/summary`);
    for (const key of ['sites', 'exposureGroups', 'workers', 'agents', 'members'] as const) {
      const shown = await page.locator(`[data-count="${key}"]`).innerText();
      expect(Number(shown.replace(/\D/g, ''))).toBe(summary.counts[key]);
    }
    expect(summary.counts.members).toBeGreaterThan(0);
    await page.getByText('Statistics support and never replace the judgement of a qualified hygienist.').first().waitFor();
    // The category legend names every band with its number and word (never colour alone).
    await page.getByText('Exposure categories', { exact: true }).waitFor();
    await page.getByText('2 · Moderate').first().waitFor();
    await screenshot(page, 'home-admin');
    assertClean();
    await context.close();
  });

  it('a hygienist sees the data pages and the import but not People, and the people page answers that the role does not include it', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    expect(await navigationItems(page)).toEqual(navigationOf.hygienist);
    await page.getByRole('heading', { name: 'What you can do as Hygienist' }).waitFor();

    await page.goto(`${new URL(page.url()).pathname}/users`);
    await page.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
    assertClean();
    await context.close();
  });

  it('an analyst sees the pages to read, without the import or People', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.analyst);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    expect(await navigationItems(page)).toEqual(navigationOf.reader);
    expect(await page.getByText('Approve or return draft decision records (never your own)').count()).toBe(1);
    assertClean();
    await context.close();
  });

  it('a manager sees no admin items: no People, no Outbox, and /users and /outbox are refused', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.manager);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    expect(await navigationItems(page)).toEqual(navigationOf.reader);
    expect(await page.getByRole('link', { name: 'Manage people' }).count()).toBe(0);
    await screenshot(page, 'home-manager');

    await page.goto('/users');
    await page.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
    await page.goto('/outbox');
    await page.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
    assertClean();
    await context.close();
  });

  it('a consultant switches between the two organizations, the URL follows, and the choice is remembered', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.consultant);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    // Consultants also read the audit trail (audit:read).
    expect(await navigationItems(page)).toEqual([...navigationOf.reader, 'Audit trail']);

    const switcher = page.getByLabel('Organization', { exact: true });
    const options = await switcher.locator('option').allInnerTexts();
    expect(options).toEqual([organizationNames.ridgeback, organizationNames.slateHarbor]);
    const ridgebackPath = new URL(page.url()).pathname;

    await switcher.selectOption({ label: organizationNames.slateHarbor });
    await page.getByRole('heading', { level: 1, name: organizationNames.slateHarbor }).waitFor();
    const slatePath = new URL(page.url()).pathname;
    expect(slatePath).toMatch(/^\/orgs\/\d+$/);
    expect(slatePath).not.toBe(ridgebackPath);
    await screenshot(page, 'home-consultant-slate-harbor');

    // `/` opens the organization chosen last, and a shared link opens the one it names.
    await page.goto('/');
    await page.waitForURL((url) => url.pathname === slatePath);
    await page.goto(ridgebackPath);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    expect(await switcher.inputValue()).toBe(ridgebackPath.split('/').pop());
    assertClean();
    await context.close();
  });

  it('an organization the person does not belong to is answered "Not found", like the server does', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.manager);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    await page.goto('/orgs/999999');
    await page.getByRole('heading', { level: 1, name: 'Not found' }).waitFor();
    assertClean();
    await context.close();
  });
});

describe('signed-out visitors', () => {
  it('are sent to sign in and brought back to the page they asked for', async () => {
    const { context, page, assertClean } = await app.open();
    await page.goto('/users');
    await page.waitForURL((url) => url.pathname === '/sign-in' && url.searchParams.get('next') === '/users');
    await signIn(page, demoUsers.admin);
    await page.waitForURL(/\/orgs\/\d+\/users$/);
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    assertClean();
    await context.close();
  });

  it('after signing out, the app pages send them back to sign in', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.analyst);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    const home = new URL(page.url()).pathname;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in' && !url.searchParams.has('next'));
    await page.goto(home);
    await page.waitForURL((url) => url.pathname === '/sign-in' && url.searchParams.get('next') === home);
    assertClean();
    await context.close();
  });
});
