import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, organizationNames, screenshot, severe, signIn, useE2eApp } from './harness';

// The organization's register of decision records in the browser, on the demo: at Ridgeback Timber the saw
// filer's and the edger operator's records are approved, the head sawyer's noise record waits for review and
// the planer feeder's wood-dust record was returned (backend/src/db/seed-demo-decisions.ts).

const app = useE2eApp();

describe('the decision-record register', () => {
  it('a manager opens it from the sidebar, filters to approved records, sees the demo’s and opens one', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.manager);
    await page.waitForURL(/\/orgs\/\d+$/);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    // The overview's recent decisions link to the whole register.
    await page.getByRole('link', { name: 'All decision records' }).waitFor();
    await screenshot(page, 'decision-record-register-overview');

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Decision records' }).click();
    await page.getByRole('heading', { level: 1, name: 'Decision records' }).waitFor();
    const table = page.getByRole('table', { name: 'Decision records' });
    // Unfiltered: every demo record of Ridgeback, whatever its status.
    for (const group of ['Saw filer – noise', 'Edger operator – noise', 'Head sawyer – noise', 'Planer feeder – wood dust']) {
      await table.getByRole('link', { name: group }).waitFor();
    }
    await table.getByRole('row').filter({ hasText: 'Planer feeder – wood dust' }).getByText('Returned').waitFor();

    await page.getByLabel('Status').selectOption('approved');
    await page.waitForURL((url) => url.searchParams.get('status') === 'approved');
    await table.getByRole('link', { name: 'Head sawyer – noise' }).waitFor({ state: 'detached' });
    const rows = table.locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(2);
    const groups = await rows.locator('td:first-child a').allInnerTexts();
    expect(groups.sort()).toEqual(['Edger operator – noise', 'Saw filer – noise']);
    const sawFiler = rows.filter({ hasText: 'Saw filer – noise' });
    expect(await sawFiler.getByText('Approved', { exact: true }).count()).toBe(1);
    expect(await sawFiler.textContent()).toContain('Ridgeback sawmill');
    await page.getByText('Records 1–2 of 2').waitFor();
    await screenshot(page, 'decision-record-register-manager');

    const scan = await axeScan(page);
    expect(scan.passedRules).toBeGreaterThan(0);
    expect(severe(scan.violations)).toEqual([]);

    // The out-of-date filter: no demo record is out of date, and the empty table says the filters hid them.
    // The box follows the address (?outOfDate=true), which the router updates just after the click.
    const outOfDateOnly = page.getByLabel('Out of date only');
    await outOfDateOnly.click();
    await page.waitForURL((url) => url.searchParams.get('outOfDate') === 'true');
    await expect.poll(() => outOfDateOnly.isChecked()).toBe(true);
    await page.getByText('No decision record matches').waitFor();
    await outOfDateOnly.click();
    await page.waitForURL((url) => !url.searchParams.has('outOfDate'));
    await expect.poll(() => outOfDateOnly.isChecked()).toBe(false);
    await rows.filter({ hasText: 'Saw filer – noise' }).waitFor();

    // Review due by the edger's review date: the edger's record (reviewed first, category 4) and not the saw filer's.
    const organizationPath = /^(.*\/orgs\/[^/]+)/.exec(new URL(page.url()).pathname)![1];
    const register = (await page.evaluate(async (path) => (await fetch(path)).json(), `/api${organizationPath}/decision-records?status=approved`)) as {
      items: Array<{ exposureGroupName: string; reviewDate: string }>;
    };
    const edgerReview = register.items.find((item) => item.exposureGroupName === 'Edger operator – noise')!.reviewDate;
    await page.getByLabel('Review due by').fill(edgerReview);
    await page.waitForURL((url) => url.searchParams.get('reviewBy') === edgerReview);
    await expect.poll(() => rows.count()).toBe(1);
    expect(await rows.first().textContent()).toContain('Edger operator – noise');
    await page.getByLabel('Review due by').fill('');
    await page.waitForURL((url) => !url.searchParams.has('reviewBy'));
    await expect.poll(() => rows.count()).toBe(2);

    await sawFiler.getByRole('link', { name: 'Saw filer – noise' }).click();
    await page.waitForURL(/\/decision-records\/\d+$/);
    await page.getByRole('heading', { level: 1, name: 'Saw filer – noise' }).waitFor();
    await page.getByTestId('record-summary').getByText('Approved').waitFor();
    assertClean();
    await context.close();
  });
});
