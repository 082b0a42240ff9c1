import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, navigationItems, screenshot, severe, signIn, useE2eApp } from './harness';

// The hygienist's daily work on an exposure group, in the browser against the real server:
// set up a group, add a member, draw a sampling plan (same picks after a reload), print its
// field sheet, enter a result (with the server's field errors inline), void and restore it.
// Then the same pages as a manager: read-only. The demo data is PRODUCT.md's invented scenario.

const app = useE2eApp();

/** A person's browser; waits up to 30 s per step, as the machine is shared with other test runs. */
async function open() {
  const opened = await app.open();
  opened.context.setDefaultTimeout(30_000);
  return opened;
}

/** "/orgs/7" from the address the app landed on after signing in. */
function organizationBase(page: Page): string {
  const match = /^\/orgs\/\d+/.exec(new URL(page.url()).pathname);
  if (!match) throw new Error(`Not on an organization page: ${page.url()}`);
  return match[0];
}

const dialog = (page: Page, name: string | RegExp): Locator => page.getByRole('dialog', { name });
const table = (page: Page, caption: string | RegExp): Locator => page.getByRole('table', { name: caption });

/** The picked worker-shifts as "date worker" lines, in the order shown. */
async function picksShown(page: Page): Promise<string[]> {
  const rows = table(page, /Picked worker-shifts/).locator('tbody tr');
  return rows.evaluateAll((trs) =>
    trs.map((tr) =>
      [...tr.querySelectorAll('td')]
        .slice(0, 2)
        .map((td) => td.textContent?.trim())
        .join(' | '),
    ),
  );
}

describe('an exposure group, from set-up to results', () => {
  it('a hygienist sets up a group, adds a member, draws a plan that a reload keeps, enters a result, voids and restores it', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    organizationBase(page); // signed in on an organization page (throws otherwise)
    expect(await navigationItems(page)).toEqual(expect.arrayContaining(['Exposure groups', 'Workers', 'Sites', 'Agents & OELs', 'Import results']));

    // Set up the group from the list page.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exposure groups' }).click();
    await page.waitForURL(/\/exposure-groups$/);
    await page.getByRole('heading', { level: 1, name: 'Exposure groups' }).waitFor();
    await table(page, /^Exposure groups/)
      .locator('tbody tr')
      .first()
      .waitFor();
    await page.getByRole('link', { name: 'New exposure group' }).click();
    await page.getByRole('heading', { level: 1, name: 'New exposure group' }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill('Trimmer operator – noise');
    await page.getByLabel('Site').selectOption({ label: 'Ridgeback sawmill' });
    await page.getByLabel('Process or area').fill('Trimmer line');
    await page.getByLabel('Job titles').fill('Trimmer operator\nTrimmer relief');
    await page.getByLabel('Tasks').fill('Runs the trimmer saws from the console; clears jams on the deck.');
    await page.getByLabel('Agent', { exact: true }).selectOption({ label: 'Noise (noise)' });
    await page.getByLabel('Noise criteria set').selectOption('nioshRel');
    // The OEL comes from the organization's list: the first noise entry is chosen once it loads.
    const entry = page.getByLabel('Limit from the OEL list');
    await expect.poll(() => entry.inputValue()).not.toBe('');
    const doseEntry = await entry.locator('option', { hasText: '100 % dose' }).getAttribute('value');
    await entry.selectOption(doseEntry ?? '');
    await page.getByLabel(/^Action level/).fill('50');
    await page.getByLabel('Shift length (hours)').fill('8');
    await page.getByRole('button', { name: 'Create group' }).click();
    await page.getByRole('heading', { level: 1, name: 'Trimmer operator – noise' }).waitFor();
    await page.getByText('Group created. Add its members next.').waitFor();
    const groupPath = new URL(page.url()).pathname;
    const definition = page.getByRole('region', { name: 'Definition' });
    await definition.getByText('Trimmer operator, Trimmer relief').waitFor();
    await definition.getByText('100 % dose').first().waitFor();
    // Noise groups show the hearing conservation trigger with the cautions.
    await page.getByText('Hearing conservation trigger (action level): 50 % dose.').waitFor();
    expect(await page.getByRole('link', { name: 'Assessment' }).getAttribute('href')).toBe(`${groupPath}/assessment`);

    // Escape closes a dialog and gives focus back to the button that opened it.
    const addMember = page.getByRole('button', { name: 'Add member' });
    await addMember.click();
    await dialog(page, 'Add a member').waitFor();
    await page.keyboard.press('Escape');
    await dialog(page, 'Add a member').waitFor({ state: 'hidden' });
    expect(await addMember.evaluate((button) => button === document.activeElement)).toBe(true);

    // Add a member, submitting with Enter from the date field.
    await addMember.click();
    const memberDialog = dialog(page, 'Add a member');
    await memberDialog.getByLabel('Worker').selectOption({ label: 'RT-003 · Billie Tarrant · Edger operator' });
    await memberDialog.getByLabel('From').fill('2024-01-08');
    await memberDialog.getByLabel('From').press('Enter');
    await page.getByText('RT-003 is a member from 8 Jan 2024.').waitFor();
    const members = table(page, /Members of Trimmer operator – noise/);
    await members.getByRole('link', { name: 'RT-003' }).waitFor();
    await members.getByText('still a member').waitFor();

    // Draw a plan with a chosen seed; the picks come back the same after a reload.
    await page.getByRole('button', { name: 'Plan sampling' }).click();
    const planDialog = dialog(page, 'Plan sampling');
    await planDialog.getByText(/EN 689:2018 applies its statistical test from 6 results/).waitFor();
    expect(await planDialog.getByLabel('Shifts to measure').inputValue()).toBe('6');
    await planDialog.getByLabel('Title (optional)').fill('Trimmer autumn campaign');
    await planDialog.getByLabel('From').fill('2024-09-02');
    await planDialog.getByLabel('To', { exact: true }).fill('2024-10-31');
    await planDialog.getByLabel('Seed (optional)').fill('20240902');
    await planDialog.getByRole('button', { name: 'Draw the plan' }).click();
    await page.getByText('Plan drawn: 6 worker-shifts picked with seed 20240902.').waitFor();
    await table(page, /Picked worker-shifts/)
      .locator('tbody tr')
      .nth(5)
      .waitFor();
    const picks = await picksShown(page);
    expect(picks).toHaveLength(6);
    expect(picks.every((pick) => pick.endsWith('| RT-003'))).toBe(true);
    await page.getByText('0 of 6 shifts measured').waitFor();

    await page.reload();
    await table(page, /Picked worker-shifts/)
      .locator('tbody tr')
      .nth(5)
      .waitFor();
    expect(await picksShown(page)).toEqual(picks);
    expect(await page.getByTestId('plan-seed').innerText()).toContain('20240902');

    // The field sheet lists the same picks, with a Print button; printing hides the navigation.
    await page.getByRole('link', { name: 'Field sheet' }).click();
    await page.getByRole('heading', { level: 1, name: 'Trimmer operator – noise' }).waitFor();
    await page.getByRole('button', { name: 'Print' }).waitFor();
    const sheetRows = page.getByRole('table', { name: /Picked worker-shifts, page 1/ }).locator('tbody tr');
    expect(await sheetRows.count()).toBe(6);
    await screenshot(page, 'field-sheet-screen');
    await page.emulateMedia({ media: 'print' });
    expect(
      await page
        .getByRole('complementary')
        .filter({ has: page.getByRole('navigation', { name: 'Main' }) })
        .isVisible(),
    ).toBe(false);
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    await screenshot(page, 'field-sheet-print');
    await page.emulateMedia({ media: 'screen' });
    await page.goto(groupPath);

    // Enter a result: first on a day before the membership — the server's answer shows under the worker.
    // The first pick's date as the API stores it (the page shows "2 Sep 2024").
    const overview = await page.evaluate(async (path) => (await fetch(`/api${path}/overview`)).json(), groupPath);
    const pickDate: string = overview.currentPlan.picks[0].date;
    await page.getByRole('button', { name: 'Enter a result' }).click();
    const resultDialog = dialog(page, 'Enter a shift result');
    await resultDialog.getByLabel('Worker').selectOption({ label: 'RT-003 · Billie Tarrant · Edger operator' });
    await resultDialog.getByLabel('Shift date').fill('2023-06-01');
    await resultDialog.getByLabel('Shift result (TWA)').fill('62.5');
    await resultDialog.getByRole('button', { name: 'Save result' }).click();
    await resultDialog.getByText(/RT-003 is not a member of "Trimmer operator – noise" on 2023-06-01/).waitFor();
    expect(await resultDialog.getByLabel('Worker').getAttribute('aria-invalid')).toBe('true');
    // An empty value is refused in the browser with the schema's words.
    await resultDialog.getByLabel('Shift date').fill(pickDate);
    await resultDialog.getByLabel('Shift result (TWA)').fill('');
    await resultDialog.getByRole('button', { name: 'Save result' }).click();
    await resultDialog.getByText('Enter the value (above 0), or mark the result as a non-detect').waitFor();
    await resultDialog.getByLabel('Shift result (TWA)').fill('62.5');
    await resultDialog.getByLabel('Sample id').fill('TR-0001');
    await resultDialog.getByLabel('Shift result (TWA)').press('Enter');
    await page.getByText(/^Result saved: RT-003 on .*, 62\.5 % dose\.$/).waitFor();
    const results = table(page, /Shift results/);
    await results.getByText('62.5 % dose').waitFor();
    await page.getByText('1 of 6 shifts measured').waitFor();

    // Void it: the reason is required; the row stays, marked void with its reason.
    const what = `result of RT-003 on ${pickDate}`;
    await results.getByRole('button', { name: `Void the ${what}` }).click();
    const voidDialog = dialog(page, 'Void this result?');
    await voidDialog.getByRole('button', { name: 'Void result' }).click();
    await voidDialog.getByText(/Give a reason/).waitFor();
    await voidDialog.getByLabel('Why is it void?').fill('Dosimeter found switched off at lunch');
    await voidDialog.getByRole('button', { name: 'Void result' }).click();
    await voidDialog.waitFor({ state: 'hidden' });
    await results.getByText('Dosimeter found switched off at lunch').waitFor();
    await results.getByText('Void', { exact: true }).waitFor();
    await page.getByText('0 of 6 shifts measured').waitFor();

    // Restore it with a reason (Ctrl+Enter confirms from the reason box).
    await results.getByRole('button', { name: `Restore the ${what}` }).click();
    const restoreDialog = dialog(page, 'Restore this result?');
    await restoreDialog.getByLabel('Why restore it?').fill('Lunch was outside the shift; log is complete');
    await restoreDialog.getByLabel('Why restore it?').press('Control+Enter');
    await restoreDialog.waitFor({ state: 'hidden' });
    await results.getByText('Valid', { exact: true }).waitFor();
    await page.getByText('1 of 6 shifts measured').waitFor();

    // The results table sorts from the keyboard: Enter on a header button.
    const valueHeader = results.getByRole('columnheader', { name: /Result/ });
    await results.getByRole('button', { name: /Result/ }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => valueHeader.getAttribute('aria-sort')).toBe('ascending');
    expect(new URL(page.url()).searchParams.get('results.sort')).toBe('value');

    await screenshot(page, 'exposure-group-hygienist');
    assertClean();
    await context.close();
  }, 300_000); // a long journey on a shared machine

  it('a field sheet of 30 picks prints as two A4 pages of at most 25 rows, each with its heading', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await page.goto(`${organizationBase(page)}/exposure-groups`);
    await page.getByRole('link', { name: 'Maintenance fitter – noise' }).click();
    await page.getByRole('heading', { level: 1, name: 'Maintenance fitter – noise' }).waitFor();
    await page.getByRole('button', { name: /^(New plan|Plan sampling)$/ }).click();
    const planDialog = dialog(page, 'Plan sampling');
    await planDialog.getByLabel('Shifts to measure').fill('30');
    await planDialog.getByLabel('From').fill('2024-09-02');
    await planDialog.getByLabel('To', { exact: true }).fill('2024-12-20');
    await planDialog.getByRole('button', { name: 'Draw the plan' }).click();
    await page.getByText(/^Plan drawn: 30 worker-shifts picked with seed \d+\.$/).waitFor();

    await page.getByRole('link', { name: 'Field sheet' }).first().click();
    await page.getByText('30 worker-shifts on 2 printed pages (25 rows each, A4 landscape).').waitFor();
    expect(
      await page
        .getByRole('table', { name: /Picked worker-shifts, page 1/ })
        .locator('tbody tr')
        .count(),
    ).toBe(25);
    expect(
      await page
        .getByRole('table', { name: /Picked worker-shifts, page 2/ })
        .locator('tbody tr')
        .count(),
    ).toBe(5);
    // Chromium's own print layout: the PDF's page tree counts two pages (not three: nothing spills over).
    const pdf = (await page.pdf({ preferCSSPageSize: true })).toString('latin1');
    expect(/\/Count (\d+)/.exec(pdf)?.[1]).toBe('2');
    await screenshot(page, 'field-sheet-two-pages');
    assertClean();
    await context.close();
  });

  it('the group page has no serious or critical accessibility violations', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await page.goto(`${organizationBase(page)}/exposure-groups`);
    await page.getByRole('link', { name: 'Planer feeder – wood dust' }).click();
    await page.getByRole('heading', { level: 1, name: 'Planer feeder – wood dust' }).waitFor();
    await table(page, /Shift results/)
      .locator('tbody tr')
      .first()
      .waitFor();
    const scan = await axeScan(page);
    expect(scan.passedRules).toBeGreaterThan(10);
    expect(severe(scan.violations)).toEqual([]);
    await screenshot(page, 'exposure-group-demo');
    assertClean();
    await context.close();
  });
});

describe('the same pages for a manager', () => {
  it('a manager reads groups, workers, sites and agents without any edit control, and cannot open the import', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.manager);
    const base = organizationBase(page);
    const items = await navigationItems(page);
    expect(items).toEqual(expect.arrayContaining(['Exposure groups', 'Workers', 'Sites', 'Agents & OELs']));
    expect(items).not.toContain('Import results');

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exposure groups' }).click();
    await page.waitForURL(/\/exposure-groups$/);
    await table(page, /^Exposure groups/)
      .locator('tbody tr')
      .first()
      .waitFor();
    expect(await page.getByRole('link', { name: 'New exposure group' }).count()).toBe(0);
    await page.getByRole('link', { name: 'Head sawyer – noise' }).click();
    await page.getByRole('heading', { level: 1, name: 'Head sawyer – noise' }).waitFor();
    await table(page, /Shift results/)
      .locator('tbody tr')
      .first()
      .waitFor();
    await table(page, /Picked worker-shifts/)
      .locator('tbody tr')
      .first()
      .waitFor();
    for (const name of ['Edit group', 'Add member', 'Plan sampling', 'New plan', 'Change plan', 'Redraw', 'Enter a result']) {
      expect(await page.getByRole('button', { name }).or(page.getByRole('link', { name })).count(), name).toBe(0);
    }
    expect(await page.getByRole('button', { name: /^(Void|Restore|Archive|End|Dates)\b/ }).count()).toBe(0);
    // Reading is allowed: details of a result, the field sheet, the assessment link.
    await page
      .getByRole('button', { name: /^Details of the result/ })
      .first()
      .click();
    await dialog(page, 'How this result was reached').waitFor();
    await page.keyboard.press('Escape');
    await page.getByRole('link', { name: 'Field sheet' }).first().waitFor();
    await page.getByRole('link', { name: 'Assessment' }).waitFor();
    await screenshot(page, 'exposure-group-manager');

    for (const [path, heading, button] of [
      ['/workers', 'Workers', 'Add worker'],
      ['/sites', 'Sites', 'Add site'],
      ['/agents', 'Agents & OELs', 'Add agent'],
    ] as const) {
      await page.goto(`${base}${path}`);
      await page.getByRole('heading', { level: 1, name: heading }).waitFor();
      await page.getByRole('table').first().locator('tbody tr').first().waitFor();
      expect(await page.getByRole('button', { name: button }).count(), button).toBe(0);
      expect(await page.getByRole('button', { name: /^(Edit|Archive)\b/ }).count(), `${path} edit controls`).toBe(0);
    }

    await page.goto(`${base}/lab-imports`);
    await page.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
    await page.goto(`${base}/exposure-groups/new`);
    await page.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
    assertClean();
    await context.close();
  });

  it('a consultant sees worker codes but never names', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.consultant);
    await page.goto(`${organizationBase(page)}/workers`);
    const workers = table(page, 'Workers');
    await workers.getByRole('link', { name: 'RT-001' }).waitFor();
    expect(await workers.getByRole('columnheader', { name: 'Name' }).count()).toBe(0);
    expect(await page.getByText('Alex Corran').count()).toBe(0);
    assertClean();
    await context.close();
  });
});

describe('sites, agents and workers', () => {
  it('a hygienist adds, edits, searches, archives and brings back a site', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await page.goto(`${organizationBase(page)}/sites`);
    const sites = table(page, /Sites/);
    await sites.getByText('Ridgeback sawmill').waitFor();

    await page.getByRole('button', { name: 'Add site' }).click();
    const add = dialog(page, 'Add a site');
    // The name is required: the browser says so with the schema's words.
    await add.getByRole('button', { name: 'Add site' }).click();
    await add.getByText('Enter a name').waitFor();
    await add.getByLabel('Name').fill('Ridgeback kiln yard');
    await add.getByLabel('Description').fill('Drying kilns and the stacker.');
    await add.getByLabel('Name').press('Enter');
    await page.getByText('Site “Ridgeback kiln yard” added.').waitFor();

    // A taken name comes back from the server (409) in the dialog.
    await page.getByRole('button', { name: 'Add site' }).click();
    await dialog(page, 'Add a site').getByLabel('Name').fill('Ridgeback sawmill');
    await dialog(page, 'Add a site').getByLabel('Name').press('Enter');
    await dialog(page, 'Add a site')
      .getByText(/A site named "Ridgeback sawmill" already exists/)
      .waitFor();
    await page.keyboard.press('Escape');

    await page.getByLabel('Search name or description').fill('kiln');
    await expect.poll(() => sites.locator('tbody tr').count()).toBe(1);
    await page.getByRole('button', { name: 'Edit site Ridgeback kiln yard' }).click();
    await dialog(page, 'Edit site').getByLabel('Description').fill('Drying kilns, the stacker and the sorter.');
    await dialog(page, 'Edit site').getByRole('button', { name: 'Save site' }).click();
    await sites.getByText('Drying kilns, the stacker and the sorter.').waitFor();

    await page.getByRole('button', { name: 'Archive site Ridgeback kiln yard' }).click();
    await dialog(page, /Archive site/)
      .getByLabel('Reason (optional)')
      .fill('Kilns moved to the planing mill');
    await dialog(page, /Archive site/)
      .getByRole('button', { name: 'Archive' })
      .click();
    await page.getByText('Site “Ridgeback kiln yard” archived.').waitFor();
    await expect.poll(() => sites.locator('tbody tr').count()).toBe(0);
    await page.getByLabel('Show').selectOption({ label: 'Archived' });
    await sites.getByText('Ridgeback kiln yard').waitFor();
    await page.getByRole('button', { name: 'Bring back site Ridgeback kiln yard' }).click();
    await dialog(page, /Bring back site/)
      .getByRole('button', { name: 'Bring back' })
      .click();
    await page.getByText('Site “Ridgeback kiln yard” brought back.').waitFor();
    await expect.poll(() => sites.locator('tbody tr').count()).toBe(0);
    await screenshot(page, 'sites-hygienist');
    assertClean();
    await context.close();
  });

  it('a hygienist adds a chemical with its OEL line, and a worker who then joins a group from the worker page', async () => {
    const { context, page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    const base = organizationBase(page);
    await page.goto(`${base}/agents`);
    await table(page, 'Agents').getByText('Inhalable wood dust').waitFor();

    await page.getByRole('button', { name: 'Add agent' }).click();
    const agentDialog = dialog(page, 'Add an agent');
    await agentDialog.getByLabel('Name').fill('Formaldehyde');
    await agentDialog.getByLabel('CAS number').fill('50-00-0');
    await agentDialog.getByLabel('Molecular weight (g/mol)').fill('30.03');
    await agentDialog.getByRole('button', { name: 'Add agent' }).click();
    await page.getByText('Agent “Formaldehyde” added.').waitFor();
    await table(page, 'Agents').getByText('50-00-0').waitFor();

    await page.getByRole('button', { name: 'Add limit' }).click();
    const limitDialog = dialog(page, 'Add a limit to the OEL list');
    await limitDialog.getByLabel('Agent').selectOption({ label: 'Formaldehyde' });
    await limitDialog.getByLabel('Source').fill('Example in-house limit (test data)');
    await limitDialog.getByLabel('Value').fill('0.3');
    await limitDialog.getByLabel('Unit').selectOption('ppm');
    await limitDialog.getByRole('button', { name: 'Add limit' }).click();
    await page.getByText('Limit for “Formaldehyde” added.').waitFor();
    await page.getByLabel('Agent', { exact: true }).selectOption({ label: 'Formaldehyde' });
    const oelTable = table(page, 'OEL list');
    await expect.poll(() => oelTable.locator('tbody tr').count()).toBe(1);
    await oelTable.getByText('Example in-house limit (test data)').waitFor();
    await screenshot(page, 'agents-hygienist');

    await page.goto(`${base}/workers`);
    await page.getByRole('button', { name: 'Add worker' }).click();
    const workerDialog = dialog(page, 'Add a worker');
    await workerDialog.getByLabel('Worker code').fill('RT 099');
    await workerDialog.getByRole('button', { name: 'Add worker' }).click();
    await workerDialog.getByText('Use letters, digits, dots, hyphens and underscores').waitFor();
    await workerDialog.getByLabel('Worker code').fill('RT-099');
    await workerDialog.getByLabel('Job title').fill('Kiln operator');
    await workerDialog.getByRole('button', { name: 'Add worker' }).click();
    await page.getByText('Worker RT-099 added.').waitFor();
    await page.getByRole('link', { name: 'RT-099' }).click();
    await page.getByRole('heading', { level: 1, name: 'RT-099' }).waitFor();
    await page.getByText('In no group yet').waitFor();
    await page.getByRole('button', { name: 'Add to a group' }).click();
    const join = dialog(page, 'Add to a group');
    await join.getByLabel('Exposure group').selectOption({ label: 'Forklift driver – noise (Ridgeback planing mill)' });
    await join.getByLabel('From').fill('2025-01-06');
    await join.getByLabel('To (optional)').fill('2025-01-03');
    await join.getByRole('button', { name: 'Add membership' }).click();
    await join.getByText('The end date is before the start date').waitFor();
    await join.getByLabel('To (optional)').fill('');
    await join.getByRole('button', { name: 'Add membership' }).click();
    await page.getByText('RT-099 is a member of “Forklift driver – noise” from 6 Jan 2025.').waitFor();
    // End it from the same page.
    await page.getByRole('button', { name: 'End membership of RT-099 in Forklift driver – noise' }).click();
    await dialog(page, 'End membership').getByLabel('Last day in the group').fill('2025-03-31');
    await dialog(page, 'End membership').getByRole('button', { name: 'End membership' }).click();
    await page.getByText('31 Mar 2025').waitFor();
    await screenshot(page, 'worker-hygienist');
    assertClean();
    await context.close();
  });
});
