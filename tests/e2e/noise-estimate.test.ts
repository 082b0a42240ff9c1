import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, screenshot, severe, signIn, useE2eApp } from './harness';

// A hygienist estimates a noise group's LEX,8h by the ISO 9612 task-based strategy in the browser:
// enters tasks and measurements in the editable tables, is told at the row when a task has too few
// measurements or a negative duration, then sees LEX,8h, U, the budget and the verdict line.
// The inputs are the hand-worked example of tests/reference/iso9612.test.ts (Annex D-like in
// shape, not its values): with a class 2 meter, LEX,8h 88.37 dB and U 2.39 dB.

const app = useE2eApp();

async function open() {
  const opened = await app.open();
  opened.context.setDefaultTimeout(30_000);
  return opened;
}

/** From the sidebar to the group's ISO 9612 page, waiting for each page so no link of a page being left is clicked. */
async function openEstimates(page: Page, groupName: string) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exposure groups' }).click();
  await page.waitForURL(/\/exposure-groups$/);
  await page.getByRole('heading', { level: 1, name: 'Exposure groups' }).waitFor();
  await page.getByRole('link', { name: groupName }).first().click();
  await page.getByRole('heading', { level: 1, name: groupName }).waitFor();
  await page.getByRole('link', { name: 'Noise estimate (ISO 9612)' }).click();
  await page.getByRole('heading', { level: 1, name: 'Noise estimate (ISO 9612)' }).waitFor();
}

async function fillTask(page: Page, index: number, name: string, hours: string, durationUncertainty: string, levels: string[]) {
  await page.getByLabel(`Task ${index} name`).fill(name);
  await page.getByLabel(`Task ${index} duration (hours)`).fill(hours);
  await page.getByLabel(`Task ${index} duration uncertainty (hours, optional)`).fill(durationUncertainty);
  for (const [row, level] of levels.entries()) await page.getByLabel(`Task ${index} measurement ${row + 1} LAeq (dB)`).fill(level);
}

describe('noise estimate (ISO 9612) in the browser', () => {
  it('a hygienist enters a task-based estimate, is stopped at the faulty rows, then sees LEX,8h, U, the budget and the verdict', async () => {
    const { page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await openEstimates(page, 'Edger operator – noise');
    await expect.poll(() => page.getByTestId('hearing-conservation').innerText()).toMatch(/85 dB\(A\)/);

    await page.getByRole('button', { name: 'New estimate' }).click();
    await page.getByLabel('Title (optional)').fill('Edger line, winter survey');
    await page.getByLabel('Strategy').selectOption('task-based');
    await page.getByLabel('Instrument').selectOption('class2-meter');
    // First a task with a negative duration and only two measurements.
    await fillTask(page, 1, 'Edging', '-4', '0.5', ['88.0', '89.5']);
    await page.getByRole('button', { name: 'Remove task 1 measurement 3' }).click();
    await page.getByRole('button', { name: 'Compute and save' }).click();
    await page.getByText("Task 'Edging': use a duration above 0 hours").waitFor();
    await page.getByText("Task 'Edging' has 2 measurements; ISO 9612 task-based needs at least 3").waitFor();

    // Correct it and add the other two tasks.
    await page.getByRole('button', { name: 'Add measurement' }).first().click();
    await fillTask(page, 1, 'Edging', '4', '0.5', ['88.0', '89.5', '87.1']);
    await page.getByRole('button', { name: 'Add a task' }).click();
    await fillTask(page, 2, 'Clearing jams', '1.5', '0.25', ['92.3', '94.0', '91.2']);
    await page.getByRole('button', { name: 'Add a task' }).click();
    await fillTask(page, 3, 'Break room', '2', '', ['70.2', '71.0', '69.5']);
    await page.getByRole('button', { name: 'Compute and save' }).click();

    const card = page.getByTestId('noise-estimate').first();
    await card.getByRole('heading', { name: 'Edger line, winter survey' }).waitFor();
    expect(await card.getByTestId('lex8h').innerText()).toBe('88.4 dB(A)');
    expect(await card.getByTestId('expanded-uncertainty').innerText()).toBe('2.4 dB');
    const verdict = await card.getByTestId('verdict').innerText();
    expect(verdict).toContain('LEX,8h + U = 90.8 dB(A) is above the NIOSH recommended exposure limit (hearing conservation trigger) 85 dB(A)');
    const budget = card.getByTestId('uncertainty-budget');
    await budget.getByRole('rowheader', { name: "Task 'Edging': spread of the measurements (u1a)" }).waitFor();
    await budget.getByRole('rowheader', { name: "Task 'Clearing jams': duration (u1b, hours)" }).waitFor();
    expect(await page.getByRole('table', { name: 'Tasks' }).locator('tbody tr').count()).toBe(3);

    const { violations, passedRules } = await axeScan(page);
    expect(passedRules).toBeGreaterThan(10);
    expect(severe(violations)).toEqual([]);
    await screenshot(page, 'noise-estimate-task-based');

    // A reload shows the stored estimate with the same figures.
    await page.reload();
    expect(await page.getByTestId('noise-estimate').first().getByTestId('lex8h').innerText()).toBe('88.4 dB(A)');

    // Changing the inputs recomputes: Edging for 5 h instead of 4 gives 88.877 dB (same equations, Python).
    await page.getByTestId('noise-estimate').first().getByRole('button', { name: 'Change inputs' }).click();
    await page.getByLabel('Task 1 duration (hours)').fill('5');
    await page.getByRole('button', { name: 'Save and recompute' }).click();
    await expect.poll(() => page.getByTestId('noise-estimate').first().getByTestId('lex8h').innerText()).toBe('88.9 dB(A)');
    expect(await page.getByTestId('noise-estimate').count()).toBe(1);
    assertClean();
  });

  it('a hygienist enters a full-day estimate (ISO 9612 Annex F inputs) and sees 90.1 dB(A) with U 3.4 dB', async () => {
    const { page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await openEstimates(page, 'Head sawyer – noise');
    await page.getByRole('button', { name: 'New estimate' }).click();
    await page.getByLabel('Title (optional)').fill('Full days, Annex F values');
    await page.getByLabel('Strategy').selectOption('full-day');
    await page.getByLabel('Instrument').selectOption('dosimeter');
    await page.getByLabel('Effective day Te (hours)').fill('9.25');
    const levels = ['88.0', '91.9', '87.6', '90.4', '89.0', '88.4'];
    await page.getByRole('button', { name: 'Add day' }).click();
    for (const [row, level] of levels.entries()) await page.getByLabel(`Day ${row + 1} LAeq (dB)`).fill(level);
    await page.getByRole('button', { name: 'Compute and save' }).click();
    const card = page.getByTestId('noise-estimate').first();
    await card.getByRole('heading', { name: 'Full days, Annex F values' }).waitFor();
    expect(await card.getByTestId('lex8h').innerText()).toBe('90.1 dB(A)');
    expect(await card.getByTestId('expanded-uncertainty').innerText()).toBe('3.4 dB');
    await screenshot(page, 'noise-estimate-full-day');
    assertClean();
  });

  it('a hygienist enters a job-based estimate (ISO 9612 Annex E inputs), sees 88.2 dB(A) with U 3.8 dB and the Table 1 warning', async () => {
    const { page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await openEstimates(page, 'Saw filer – noise');
    await page.getByRole('button', { name: 'New estimate' }).click();
    await page.getByLabel('Title (optional)').fill('Random samples, Annex E values');
    await page.getByLabel('Strategy').selectOption('job-based');
    await page.getByLabel('Instrument').selectOption('dosimeter');
    await page.getByLabel('Effective day Te (hours)').fill('7.5');
    await page.getByLabel('Workers in the group (nG)').fill('8');
    await page.getByRole('button', { name: 'Add sample' }).click();
    for (const [row, level] of ['88.1', '86.1', '89.7', '86.5', '91.1', '86.7'].entries()) {
      await page.getByLabel(`Sample ${row + 1} LAeq (dB)`).fill(level);
      await page.getByLabel(`Sample ${row + 1} duration (minutes)`).fill('60');
    }
    await page.getByRole('button', { name: 'Compute and save' }).click();
    const card = page.getByTestId('noise-estimate').first();
    await card.getByRole('heading', { name: 'Random samples, Annex E values' }).waitFor();
    // 88.16 unrounded (the annex prints 88.1 after rounding LAeq,Te first); U 3.75 → 3.8.
    expect(await card.getByTestId('lex8h').innerText()).toBe('88.2 dB(A)');
    expect(await card.getByTestId('expanded-uncertainty').innerText()).toBe('3.8 dB');
    await card.getByText('The samples add up to 6.00 h, below the ISO 9612 Table 1 minimum of 6.5 h for a group of 8: take more samples').waitFor();
    assertClean();
  });

  it('a hygienist starts a full-day estimate from the group’s accepted noise logs and adds a third day by hand', async () => {
    const { page, assertClean } = await open();
    await signIn(page, demoUsers.hygienist);
    await openEstimates(page, 'Maintenance fitter – noise');
    await page.getByRole('button', { name: 'New estimate' }).click();
    await page.getByLabel('Strategy').selectOption('full-day');
    await page.getByLabel('Effective day Te (hours)').fill('8');
    await page.getByRole('button', { name: 'Fill with the 2 accepted noise-log days' }).click();
    expect(await page.getByLabel('Day 1 date').inputValue()).toBe('2025-02-05');
    expect(await page.getByLabel('Day 2 date').inputValue()).toBe('2025-02-06');
    expect(await page.getByLabel('Day 3 LAeq (dB)').count()).toBe(0);
    await page.getByRole('button', { name: 'Add day' }).click();
    await page.getByLabel('Day 3 LAeq (dB)').fill('86');
    await page.getByRole('button', { name: 'Compute and save' }).click();
    const card = page.getByTestId('noise-estimate').first();
    await card.getByTestId('lex8h').waitFor();
    expect(await card.getByTestId('lex8h').innerText()).toMatch(/^\d{2,3}\.\d dB\(A\)$/);
    assertClean();
  });

  it('a manager reads the estimates but gets no button to enter one', async () => {
    const { page, assertClean } = await open();
    await signIn(page, demoUsers.manager);
    await openEstimates(page, 'Edger operator – noise');
    await page.getByTestId('noise-estimate').first().waitFor();
    expect(await page.getByRole('button', { name: 'New estimate' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Change inputs' }).count()).toBe(0);
    assertClean();
  });
});
