import { describe, expect, it } from 'vitest';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import { axeScan, demoUsers, screenshot, severe, signIn, useE2eApp } from './harness';

// Noise logs (issue 5) as a hygienist in the browser: upload a synthesized demo log (invented data,
// PRODUCT.md "Demo scenario"), drop and re-add the mask over a knock and see the reviewed dose move,
// then accept the log into its group as the worker's shift result.

const app = useE2eApp();

interface LogAnswer {
  id: number;
  status: string;
  shiftResultId: number | null;
  knocks: Array<{ tS: number; peakMg: number }>;
  masks: Array<{ id: number; startS: number; endS: number; origin: string }>;
  figures: { reviewed: { nioshRel: { dose: number } }; asLogged: { nioshRel: { dose: number } } };
}

describe('noise log review', () => {
  it('a hygienist uploads a log, masks a knock, sees the reviewed dose change and accepts it into the group', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    const organizationId = await page.evaluate(
      async () => ((await (await fetch('/api/me')).json()) as { memberships: Array<{ organizationId: number }> }).memberships[0].organizationId,
    );

    // A 2 h log at 1 s with two knocks (stats/noise-demo.ts, fixed seed).
    const demo = generateNoiseDemoLog({ seed: 4242, hours: 2, knockCount: 2, worker: 'RT-008', start: '2025-02-10T06:30:00-08:00' });
    await page.goto(`/orgs/${organizationId}/noise-logs`);
    await page.getByRole('heading', { level: 1, name: 'Noise logs' }).waitFor();
    await page.getByRole('button', { name: 'Upload a noise log' }).click();
    const dialog = page.getByRole('dialog', { name: 'Upload a noise log' });
    await dialog
      .getByLabel('Noise log file (.csv, at most 50 MB)')
      .setInputFiles({ name: 'rt-008-bench.csv', mimeType: 'text/csv', buffer: Buffer.from(demo.text) });
    await dialog.getByLabel('Exposure group').selectOption({ label: 'Maintenance fitter – noise' });
    await dialog.getByLabel('Worker').selectOption({ label: 'RT-008 · Robin Achterberg' });
    await dialog.getByLabel('Shift date').fill('2025-02-10');
    await dialog.getByRole('button', { name: 'Upload and check' }).click();

    await page.getByRole('heading', { level: 1, name: 'RT-008 · 2025-02-10' }).waitFor();
    await page.locator('.js-plotly-plot .main-svg').first().waitFor({ timeout: 60_000 });
    const logId = Number(/noise-logs\/(\d+)/.exec(page.url())![1]);
    const read = () => page.evaluate(async (path) => (await (await fetch(path)).json()) as LogAnswer, `/api/orgs/${organizationId}/noise-logs/${logId}`);
    const uploaded = await read();
    expect(uploaded.knocks).toHaveLength(2);
    expect(uploaded.masks.filter((mask) => mask.origin === 'proposed')).toHaveLength(2);
    const reviewedCell = page.getByTestId('reviewed-dose-nioshRel');
    const withKnockMasked = await reviewedCell.innerText();
    expect(withKnockMasked).toBe(`${uploaded.figures.reviewed.nioshRel.dose.toFixed(1)} %`);
    await screenshot(page, 'noise-log-review');

    // Drop the proposed mask of the first knock: the knock counts again and the reviewed dose moves.
    const knock = uploaded.knocks[0];
    const proposed = uploaded.masks.find((mask) => mask.startS <= knock.tS && mask.endS > knock.tS)!;
    const start = Math.round(proposed.startS);
    const clock = `${Math.floor(start / 3600)}:${String(Math.floor((start % 3600) / 60)).padStart(2, '0')}:${String(start % 60).padStart(2, '0')}`;
    await page.getByRole('button', { name: `Remove the mask from ${clock}`, exact: true }).click();
    const removeDialog = page.getByRole('dialog', { name: 'Remove the mask' });
    await removeDialog.getByLabel('Reason').fill('checking the knock');
    await removeDialog.getByRole('button', { name: 'Remove mask' }).click();
    await expect.poll(() => reviewedCell.innerText()).not.toBe(withKnockMasked);
    const unmasked = await read();
    expect(unmasked.figures.reviewed.nioshRel.dose).not.toBeCloseTo(uploaded.figures.reviewed.nioshRel.dose, 6);

    // Mask the knock again by hand, with a reason: the reviewed dose returns to the masked figure.
    await page.getByRole('button', { name: 'Mask by times…' }).click();
    const maskDialog = page.getByRole('dialog', { name: 'Mask a span' });
    await maskDialog.getByLabel('Start, s from log start').fill(String(proposed.startS));
    await maskDialog.getByLabel('End, s from log start').fill(String(proposed.endS));
    await maskDialog.getByLabel('Reason').fill('knock on the meter case');
    await maskDialog.getByRole('button', { name: 'Save mask' }).click();
    await expect.poll(() => reviewedCell.innerText()).toBe(withKnockMasked);
    await page.getByRole('cell', { name: 'knock on the meter case' }).waitFor();

    // Accept into the group: the log becomes the worker's shift result.
    await page.getByRole('button', { name: 'Accept into the group' }).click();
    await page.getByTestId('accepted-note').waitFor();
    const accepted = await read();
    expect(accepted.status).toBe('accepted');
    expect(accepted.shiftResultId).toBeGreaterThan(0);
    expect(await page.getByTestId('accepted-note').innerText()).toContain(`shift result ${accepted.shiftResultId}`);
    await screenshot(page, 'noise-log-accepted');

    // The seeded bench log: the still-stretch notice, and the bench span masked as a hatched band.
    await page.goto(`/orgs/${organizationId}/noise-logs`);
    await page.getByRole('link', { name: '2025-02-04' }).filter({ hasText: '2025-02-04' }).first().waitFor();
    const list = await page.evaluate(
      async (path) => (await (await fetch(path)).json()) as { items: Array<{ id: number; workerCode: string; shiftDate: string }> },
      `/api/orgs/${organizationId}/noise-logs`,
    );
    const benchLog = list.items.find((item) => item.workerCode === 'RT-008' && item.shiftDate === '2025-02-04')!;
    await page.goto(`/orgs/${organizationId}/noise-logs/${benchLog.id}`);
    await page.getByText('The meter was still for a long time').waitFor();
    const bench = await page.evaluate(
      async (path) => (await (await fetch(path)).json()) as { stillStretches: Array<{ startS: number; endS: number }> },
      `/api/orgs/${organizationId}/noise-logs/${benchLog.id}`,
    );
    expect(bench.stillStretches.length).toBeGreaterThan(0);
    // Select a span on the chart with the mouse: the mask dialog opens with the selected times.
    await page.locator('.js-plotly-plot .main-svg').first().waitFor({ timeout: 60_000 });
    await page.getByRole('button', { name: 'Select a span to mask' }).click();
    const dragArea = await page.locator('.js-plotly-plot .nsewdrag').first().boundingBox();
    await page.mouse.move(dragArea!.x + dragArea!.width * 0.55, dragArea!.y + dragArea!.height * 0.5);
    await page.mouse.down();
    await page.mouse.move(dragArea!.x + dragArea!.width * 0.62, dragArea!.y + dragArea!.height * 0.5, { steps: 8 });
    await page.mouse.up();
    const benchDialog = page.getByRole('dialog', { name: 'Mask a span' });
    await benchDialog.waitFor();
    const selectedStart = Number(await benchDialog.getByLabel('Start, s from log start').inputValue());
    const selectedEnd = Number(await benchDialog.getByLabel('End, s from log start').inputValue());
    expect(selectedEnd).toBeGreaterThan(selectedStart);
    expect(selectedStart).toBeGreaterThan(0);
    await benchDialog.getByLabel('Start, s from log start').fill(String(bench.stillStretches[0].startS));
    await benchDialog.getByLabel('End, s from log start').fill(String(bench.stillStretches[0].endS));
    await benchDialog.getByLabel('Reason').fill('meter left on the bench');
    await benchDialog.getByRole('button', { name: 'Save mask' }).click();
    await page.getByRole('cell', { name: 'meter left on the bench' }).waitFor();
    await page.locator('.js-plotly-plot .main-svg').first().waitFor({ timeout: 60_000 });
    await screenshot(page, 'noise-log-bench');

    const scan = await axeScan(page);
    expect(scan.passedRules).toBeGreaterThan(0);
    expect(severe(scan.violations)).toEqual([]);
    assertClean();
    await context.close();
  });

  it('an admin changes the noise settings on the settings page', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Noise settings' }).click();
    await page.getByRole('heading', { level: 1, name: 'Noise log settings' }).waitFor();
    // PRODUCT.md defaults are shown first.
    expect(await page.getByLabel('Still stretch, minutes').inputValue()).toBe('15');
    expect(await page.getByLabel('Knock threshold, mg').inputValue()).toBe('3000');
    await page.getByLabel('Still stretch, minutes').fill('0');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Above 0').waitFor();
    await page.getByLabel('Still stretch, minutes').fill('20');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Saved. Logs uploaded from now on use these settings.').waitFor();
    const saved = await page.evaluate(async () => {
      const me = (await (await fetch('/api/me')).json()) as { memberships: Array<{ organizationId: number }> };
      return (await (await fetch(`/api/orgs/${me.memberships[0].organizationId}/noise-settings`)).json()) as { stillMinutes: number };
    });
    expect(saved.stillMinutes).toBe(20);
    await screenshot(page, 'noise-settings');
    assertClean();
    await context.close();
  });
});
