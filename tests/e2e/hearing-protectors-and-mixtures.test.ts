import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, screenshot, severe, signIn, useE2eApp } from './harness';

// A hygienist's journeys: add a hearing protector, put it in use in a noise group and read the
// verdicts per method; define a mixture of two chemicals and compute the mixture group's results.

const app = useE2eApp();

const organizationBase = (page: Page) => /^(.*\/orgs\/[^/]+)/.exec(new URL(page.url()).pathname)?.[1] ?? '';

/** Calls the API from the page with the session and a CSRF token, as the app does; fails on an error status. */
async function callApi(page: Page, method: string, path: string, body?: unknown): Promise<{ id: number }> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const token = ((await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken;
      const response = await fetch(path, {
        method,
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      if (!response.ok) throw new Error(`${method} ${path}: ${response.status} ${await response.text()}`);
      return (await response.json()) as { id: number };
    },
    { method, path, body },
  );
}

async function openGroup(page: Page, name: string): Promise<void> {
  await page.goto(`${organizationBase(page)}/exposure-groups`);
  await page.getByRole('link', { name }).first().click();
  await page.getByRole('heading', { level: 1, name }).waitFor();
}

describe('hearing protectors', () => {
  it('a hygienist adds a protector, refused first for an NRR out of range, and sees it in the list', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hearing protectors' }).click();
    await page.getByRole('heading', { level: 1, name: 'Hearing protectors' }).waitFor();
    await page.getByRole('button', { name: 'Add protector' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Test earmuff E2E');
    await dialog.getByLabel('Type').selectOption({ label: 'Earmuff' });
    await dialog.getByLabel('NRR, dB').fill('60');
    await dialog.getByLabel('SNR, dB').fill('30');
    await dialog.getByLabel('H, dB').fill('32');
    await dialog.getByLabel('M, dB').fill('24');
    await dialog.getByLabel('L, dB').fill('16');
    await dialog.getByRole('button', { name: 'Add protector' }).click();
    await dialog.getByText('The NRR must be from 0 to 45 dB').waitFor();
    await dialog.getByLabel('NRR, dB').fill('29');
    await dialog.getByRole('button', { name: 'Add protector' }).click();
    await page.getByText('Protector “Test earmuff E2E” added.').waitFor();
    const row = page.getByRole('row').filter({ hasText: 'Test earmuff E2E' });
    expect(await row.innerText()).toMatch(/Earmuff\s+29\s+30\s+32 \/ 24 \/ 16/);
    await screenshot(page, 'hearing-protectors-list');
    expect(severe((await axeScan(page)).violations)).toEqual([]);
    assertClean();
    await context.close();
  });

  it('a hygienist puts the protector in use in a noise group and reads the level at the ear and verdict by each method', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await openGroup(page, 'Edger operator – noise');
    const panel = page.getByRole('region', { name: 'Protectors in use' });
    await panel.getByLabel('Add a protector in use').selectOption({ label: 'Test earmuff E2E' });
    await panel.getByRole('button', { name: 'Add to group' }).click();
    await panel.getByRole('radio', { name: 'A level I type in' }).check();
    await panel.getByLabel('LA, dB(A)').fill('100');
    await panel.getByRole('button', { name: 'Work out' }).click();
    await panel.getByText('Level typed in: LA 100 dB(A).').waitFor();
    const table = panel.getByRole('table', { name: 'Level at the ear by protector and method' });
    // Hand-worked: OSHA App. B with 50 % derating 100 − (29 − 7)/2 = 89 (not enough); EN 458 SNR 102 − 30 = 72 (acceptable).
    const osha = table.getByRole('row').filter({ hasText: 'OSHA App. B, 50 % derated' });
    expect(await osha.innerText()).toMatch(/89\.0 dB\(A\)\s+Not enough/);
    const snr = table.getByRole('row').filter({ hasText: 'EN 458 SNR' });
    expect(await snr.innerText()).toMatch(/72\.0 dB\(A\)\s+Acceptable/);
    expect(await snr.innerText()).toMatch(/LC = LA \+ 2 dB was assumed/);
    await panel.getByText(/OSHA gives no credit for hearing protectors/).waitFor();
    await screenshot(page, 'hearing-protectors-group-verdicts');

    // A foam earplug in use as well: the pair is judged worn together (hand-worked: higher NRR 33, 100 − (33 − 7)/2 − 5 = 82, acceptable).
    const base = `/api${organizationBase(page)}`;
    const plug = (await callApi(page, 'POST', `${base}/hearing-protectors`, { name: 'Test foam plug E2E', type: 'formable-earplug', nrr: 33 })).id;
    // Made through the API: reload so the page's protector list has it, and type the level again.
    await page.reload();
    await panel.getByLabel('Add a protector in use').selectOption({ label: 'Test foam plug E2E' });
    await panel.getByRole('button', { name: 'Add to group' }).click();
    await panel.getByRole('radio', { name: 'A level I type in' }).check();
    await panel.getByLabel('LA, dB(A)').fill('100');
    await panel.getByRole('button', { name: 'Work out' }).click();
    await panel.getByText('Level typed in: LA 100 dB(A).').waitFor();
    const together = panel.getByRole('table', { name: /worn together/ });
    const dual = together.getByRole('row').filter({ hasText: 'OSHA dual, 50 % derated' });
    await expect.poll(() => dual.innerText()).toMatch(/82\.0 dB\(A\)\s+Acceptable/);
    expect(await together.getByRole('rowgroup').last().innerText()).toContain('Test foam plug E2E + Test earmuff E2E');
    expect(plug).toBeGreaterThan(0);
    await screenshot(page, 'hearing-protectors-worn-together');
    // The verdict tables and level form have no serious or critical accessibility violations (axe-core).
    expect(severe((await axeScan(page)).violations)).toEqual([]);
    assertClean();
    await context.close();
  });
});

describe('mixtures', () => {
  it('a hygienist defines a mixture on the agents page and computes the mixture group’s results from its components', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    const base = `/api${organizationBase(page)}`;
    // Set-up through the API (two chemicals with results on the same shifts); the journey itself is in the browser.
    const sites = (await page.evaluate(async (path) => (await fetch(path)).json(), `${base}/sites?pageSize=10`)) as {
      items: Array<{ id: number; name: string }>;
    };
    const siteId = sites.items[0]!.id;
    const solventA = (await callApi(page, 'POST', `${base}/agents`, { name: 'Solvent A (e2e)', kind: 'chemical' })).id;
    const solventB = (await callApi(page, 'POST', `${base}/agents`, { name: 'Solvent B (e2e)', kind: 'chemical' })).id;
    const common = { siteId, oelSource: 'Test limit', oelAveragingTime: '8h-twa', oelUnit: 'ppm' };
    const groupA = (await callApi(page, 'POST', `${base}/exposure-groups`, { ...common, name: 'Finisher – solvent A', agentId: solventA, oelValue: 1000 })).id;
    const groupB = (await callApi(page, 'POST', `${base}/exposure-groups`, { ...common, name: 'Finisher – solvent B', agentId: solventB, oelValue: 200 })).id;
    const worker = (await callApi(page, 'POST', `${base}/workers`, { code: 'RT-390', name: 'Test Finisher', jobTitle: 'Finisher' })).id;
    for (const group of [groupA, groupB])
      await callApi(page, 'POST', `${base}/group-memberships`, { workerId: worker, exposureGroupId: group, fromDate: '2025-01-01', toDate: null });
    await callApi(page, 'POST', `${base}/shift-results`, { exposureGroupId: groupA, workerId: worker, date: '2025-02-03', value: 500 });
    await callApi(page, 'POST', `${base}/shift-results`, { exposureGroupId: groupB, workerId: worker, date: '2025-02-03', value: 45 });
    await callApi(page, 'POST', `${base}/shift-results`, { exposureGroupId: groupA, workerId: worker, date: '2025-02-04', value: 300 });

    await page.goto(`${organizationBase(page)}/agents`);
    const define = page.getByRole('form', { name: 'Define a mixture' });
    await define.getByLabel('Mixture name').fill('Solvents A + B (e2e)');
    await define.getByRole('checkbox', { name: 'Solvent A (e2e)' }).check();
    await define.getByRole('button', { name: 'Define mixture' }).click();
    await define.getByText('Choose at least 2 component agents').waitFor();
    await define.getByRole('checkbox', { name: 'Solvent B (e2e)' }).check();
    await define.getByRole('button', { name: 'Define mixture' }).click();
    await page.getByText('Mixture “Solvents A + B (e2e)” defined.').waitFor();
    await page.getByRole('row').filter({ hasText: 'Solvent A (e2e) + Solvent B (e2e)' }).waitFor();
    await screenshot(page, 'mixtures-agents-page');

    const mixtures = (await page.evaluate(async (path) => (await fetch(path)).json(), `${base}/mixtures`)) as Array<{ id: number; name: string }>;
    const mixtureId = mixtures.find((mixture) => mixture.name === 'Solvents A + B (e2e)')!.id;
    const mixtureGroup = (
      await callApi(page, 'POST', `${base}/exposure-groups`, {
        siteId,
        name: 'Finisher – solvents A + B',
        agentId: mixtureId,
        oelValue: 1,
        oelUnit: 'index',
        oelSource: 'Additive index, OSHA 29 CFR 1910.1000(d)(2)(i)',
        oelAveragingTime: '8h-twa',
      })
    ).id;
    await callApi(page, 'POST', `${base}/group-memberships`, { workerId: worker, exposureGroupId: mixtureGroup, fromDate: '2025-01-01', toDate: null });

    await openGroup(page, 'Finisher – solvents A + B');
    const panel = page.getByRole('region', { name: 'Mixture index' });
    // Hand-worked: 500/1000 + 45/200 = 0.725; the 4 February shift lacks solvent B and is listed as left out.
    const row = panel.getByRole('row').filter({ hasText: 'RT-390' });
    expect(await row.innerText()).toMatch(/0\.725/);
    await panel.getByText(/no valid result for Solvent B \(e2e\) on this shift/).waitFor();
    await panel.getByRole('button', { name: 'Compute mixture results' }).click();
    await panel.getByText('1 mixture result written.').waitFor();
    await panel.getByText(/Computing replaces the 1 mixture result now in the group/).waitFor();
    await screenshot(page, 'mixtures-group-computed');
    expect(severe((await axeScan(page)).violations)).toEqual([]);

    // Back on the agents page: rename the mixture and add notes; its components are now fixed by the computed result.
    await page.goto(`${organizationBase(page)}/agents`);
    await page.getByRole('button', { name: 'Edit mixture Solvents A + B (e2e)' }).click();
    const edit = page.getByRole('form', { name: 'Edit mixture Solvents A + B (e2e)' });
    await edit.getByText('The components are fixed: 1 valid mixture result(s) were computed from them.', { exact: false }).waitFor();
    expect(await edit.getByRole('checkbox', { name: 'Solvent A (e2e)' }).isDisabled()).toBe(true);
    await edit.getByLabel('Mixture name').fill('Finishing solvents (e2e)');
    await edit.getByLabel('Notes (optional)').fill('Both act on the central nervous system.');
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await page.getByText('Mixture “Finishing solvents (e2e)” saved.').waitFor();
    await page.getByRole('row').filter({ hasText: 'Finishing solvents (e2e)' }).getByText('Both act on the central nervous system.').waitFor();
    await screenshot(page, 'mixtures-edited');
    assertClean();
    await context.close();
  });
});
