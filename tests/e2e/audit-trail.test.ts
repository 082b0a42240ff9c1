import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, navigationItems, screenshot, severe, signIn, useE2eApp } from './harness';

// The audit-trail page (PRODUCT.md capability 10) and the notification settings page, in the browser
// against the real server: an admin filters and exports, a consultant reads, a hygienist gets neither
// the link nor the page; every signed-in person can switch e-mails off.

const app = useE2eApp();

const auditTable = (page: Page) => page.getByRole('table', { name: /Audit events/ });

/** Creates a site through the API as the signed-in person (the page's own cookies and CSRF token). */
async function createSite(page: Page, name: string): Promise<void> {
  const status = await page.evaluate(async (siteName) => {
    const csrf = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string };
    const me = (await (await fetch('/api/me')).json()) as { memberships: Array<{ organizationId: number; organizationSlug: string }> };
    const ridgeback = me.memberships.find((membership) => membership.organizationSlug === 'ridgeback-timber')!;
    const answer = await fetch(`/api/orgs/${ridgeback.organizationId}/sites`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf.csrfToken },
      body: JSON.stringify({ name: siteName, description: '' }),
    });
    return answer.status;
  }, name);
  expect(status).toBe(201);
}

async function openAuditTrail(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Audit trail' }).click();
  await page.getByRole('heading', { level: 1, name: 'Audit trail' }).waitFor();
  await auditTable(page).waitFor();
}

describe('the audit trail page', () => {
  it('lets an admin filter by person, record type and date, and export the filtered events as CSV', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await createSite(page, 'Audit check yard');
    await openAuditTrail(page);

    const filters = page.getByRole('search', { name: 'Filter the audit trail' });
    await filters.getByLabel('Person').selectOption({ label: 'Morgan Pike' });
    await filters.getByLabel('Record type').selectOption({ label: 'site' });
    const today = new Date().toISOString().slice(0, 10);
    await filters.getByLabel('From').fill(today);
    await filters.getByLabel('To').fill(today);
    // The filters live in the address, so a reload or a shared link shows the same events.
    await expect.poll(() => new URL(page.url()).searchParams.get('entityType')).toBe('site');
    expect(new URL(page.url()).searchParams.get('to')).toBe(today);
    expect(await filters.getByLabel('Person').inputValue()).not.toBe('');
    const rows = auditTable(page).locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(1);
    const row = await rows.first().innerText();
    expect(row).toContain('Morgan Pike');
    expect(row).toContain('site');
    expect(row).toContain('created');
    expect(row).toContain('Audit check yard');
    await screenshot(page, 'audit-trail-admin');
    const axe = await axeScan(page);
    expect(axe.passedRules).toBeGreaterThan(0);
    expect(severe(axe.violations)).toEqual([]);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^audit-trail-ridgeback-timber-\d{4}-\d{2}-\d{2}\.csv$/);
    const parsed = Papa.parse<string[]>(readFileSync((await download.path())!, 'utf8'), { skipEmptyLines: true });
    expect(parsed.data[0]).toEqual(['at', 'person', 'personEmail', 'entityType', 'entityId', 'action', 'reason', 'before', 'after']);
    // The export respects the filters: one row, the site just created.
    expect(parsed.data.slice(1).map((cells) => [cells[1], cells[3], cells[5]])).toEqual([['Morgan Pike', 'site', 'created']]);
    assertClean();
    await context.close();
  });

  it('is open to a consultant and neither linked nor shown to a hygienist', async () => {
    const consultant = await app.open();
    await signIn(consultant.page, demoUsers.consultant);
    await consultant.page.goto('/');
    await openAuditTrail(consultant.page);
    await expect.poll(() => auditTable(consultant.page).locator('tbody tr').count()).toBeGreaterThan(0);
    consultant.assertClean();
    await consultant.context.close();

    const hygienist = await app.open();
    await signIn(hygienist.page, demoUsers.hygienist);
    expect(await navigationItems(hygienist.page)).not.toContain('Audit trail');
    const organizationPath = new URL(hygienist.page.url()).pathname.match(/^\/orgs\/[^/]+/)?.[0];
    expect(organizationPath).toBeTruthy();
    await hygienist.page.goto(`${organizationPath}/audit`);
    await hygienist.page.getByRole('heading', { name: 'Not available to your role' }).waitFor();
    expect(await hygienist.page.getByRole('heading', { level: 1, name: 'Audit trail' }).count()).toBe(0);
    hygienist.assertClean();
    await hygienist.context.close();
  });
});

describe('the notification settings page', () => {
  it('lets any signed-in person switch an e-mail off and keeps the choice', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.manager);
    await page.getByRole('link', { name: 'Notification settings' }).click();
    await page.getByRole('heading', { level: 1, name: 'Notification settings' }).waitFor();
    const ridgeback = page.getByRole('group', { name: /Ridgeback Timber Co\./ });
    const reminder = ridgeback.getByLabel('Review date within 30 days');
    expect(await reminder.isChecked()).toBe(true);
    await reminder.uncheck();
    await page.getByRole('button', { name: 'Save choices' }).click();
    await page.getByText('Saved. Your choices apply to the next e-mails.').waitFor();
    await screenshot(page, 'notification-settings');
    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Notification settings' }).waitFor();
    expect(
      await page
        .getByRole('group', { name: /Ridgeback Timber Co\./ })
        .getByLabel('Review date within 30 days')
        .isChecked(),
    ).toBe(false);
    expect(
      await page
        .getByRole('group', { name: /Ridgeback Timber Co\./ })
        .getByLabel('Decision record approved')
        .isChecked(),
    ).toBe(true);
    assertClean();
    await context.close();
  });
});
