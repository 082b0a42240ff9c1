import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, screenshot, severe, signIn, useE2eApp } from './harness';

// The group assessment page (issue 7) against the real server and the built client: category and
// sentence, charts in the lazily loaded Plotly chunk, a what-if exclusion, and an axe-core scan.
// Demo data are invented (PRODUCT.md "Demo scenario").

const app = useE2eApp();

interface AssessmentAnswer {
  group: { id: number; name: string };
  data: { results: Array<{ id: number; workerCode: string; value: number }> };
  classical: { p95: number; managerSentence: string; categoryByP95: number; judgement: string };
}

/** The signed-in person's first organization and the id of its group `name`, read through the API as the page would. */
async function groupAddress(page: Page, name: string): Promise<{ organizationId: number; groupId: number }> {
  return page.evaluate(async (groupName) => {
    const me = (await (await fetch('/api/me')).json()) as { memberships: Array<{ organizationId: number }> };
    const organizationId = me.memberships[0].organizationId;
    const list = (await (await fetch(`/api/orgs/${organizationId}/exposure-groups?q=${encodeURIComponent(groupName)}`)).json()) as {
      items: Array<{ id: number; name: string }>;
    };
    const group = list.items.find((item) => item.name === groupName);
    if (!group) throw new Error(`No group ${groupName}`);
    return { organizationId, groupId: group.id };
  }, name);
}

async function assessmentAnswer(page: Page, organizationId: number, groupId: number, query = ''): Promise<AssessmentAnswer> {
  return page.evaluate(async ([path]) => (await (await fetch(path)).json()) as AssessmentAnswer, [
    `/api/orgs/${organizationId}/exposure-groups/${groupId}/assessment${query}`,
  ] as const);
}

describe('group assessment page', () => {
  it('an analyst sees the category and sentence, the charts, leaves a result out and sees the figures change', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.analyst);
    const { organizationId, groupId } = await groupAddress(page, 'Head sawyer – noise');
    const expected = await assessmentAnswer(page, organizationId, groupId);

    await page.goto(`/orgs/${organizationId}/exposure-groups/${groupId}/assessment`);
    await page.getByRole('heading', { level: 1, name: 'Head sawyer – noise' }).waitFor();
    const words = ['Very low', 'Low', 'Moderate', 'High', 'Above the limit'];
    await page.getByTestId('summary-category').getByText(`${expected.classical.categoryByP95} · ${words[expected.classical.categoryByP95]}`).waitFor();
    expect(await page.getByTestId('summary-sentence').innerText()).toBe(expected.classical.managerSentence);
    expect((await page.getByTestId('summary-judgement').innerText()).toLowerCase()).toContain(expected.classical.judgement);
    // The classical and Bayesian views side by side, the planner labelled a forecast, the cautions and the hearing conservation trigger.
    await page.getByRole('heading', { level: 2, name: 'Classical view' }).waitFor();
    await page.getByRole('heading', { level: 2, name: 'Bayesian view' }).waitFor();
    await page.getByText('How likely more shift results are to settle the judgement. A forecast from the current data, not a promise.').waitFor();
    await page.getByText('Statistics support and never replace the judgement of a qualified hygienist.').first().waitFor();
    expect(await page.getByTestId('hearing-conservation').innerText()).toMatch(/action level\): 50 % dose/);
    const classicalBox = await page.getByRole('heading', { level: 2, name: 'Classical view' }).boundingBox();
    const bayesianBox = await page.getByRole('heading', { level: 2, name: 'Bayesian view' }).boundingBox();
    expect(Math.abs(classicalBox!.y - bayesianBox!.y)).toBeLessThan(4);
    expect(bayesianBox!.x).toBeGreaterThan(classicalBox!.x + 200);

    // Charts come from the lazily loaded chunk: an SVG appears in each figure, and each figure has its caption.
    for (const kind of ['probability', 'histogram', 'categories', 'time', 'workers']) {
      const figure = page.locator(`figure[data-chart="${kind}"]`);
      await figure.locator('svg.main-svg').first().waitFor({ timeout: 30_000 });
      expect((await figure.locator('figcaption').innerText()).length).toBeGreaterThan(40);
    }
    const p95Before = await page.getByTestId('classical-p95').innerText();
    await screenshot(page, 'assessment-head-sawyer-noise');

    // Leave out the highest result: the address keeps the choice, the figures and the what-if summary change.
    const highest = expected.data.results.reduce((a, b) => (b.value > a.value ? b : a));
    const whatIf = await assessmentAnswer(page, organizationId, groupId, `?exclude=${highest.id}`);
    await page.locator(`tr[data-result-id="${highest.id}"]`).getByRole('checkbox').check();
    await page.waitForURL((url) => url.searchParams.get('exclude') === String(highest.id));
    await page.getByRole('heading', { level: 2, name: 'What-if: 1 result left out' }).waitFor();
    await page.getByRole('table', { name: 'What changed when results were left out' }).getByText('95th percentile').waitFor();
    await page.waitForFunction((before) => document.querySelector('[data-testid="classical-p95"]')?.textContent !== before, p95Before);
    const p95After = await page.getByTestId('classical-p95').innerText();
    expect(p95After).not.toBe(p95Before);
    const shown = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: 3 }).format(whatIf.classical.p95);
    expect(p95After).toContain(shown);
    await page.locator('figure[data-chart="time"] svg.main-svg').first().waitFor();
    await screenshot(page, 'assessment-head-sawyer-noise-what-if');

    // The stored results are untouched: without the exclusion the server still has every result.
    const again = await assessmentAnswer(page, organizationId, groupId);
    expect(again.data.results.map((result) => result.id)).toEqual(expected.data.results.map((result) => result.id));

    const { violations, passedRules } = await axeScan(page);
    expect(passedRules).toBeGreaterThan(10);
    expect(severe(violations)).toEqual([]);
    assertClean();
    await context.close();
  });

  it('a group with non-detects explains the method and draws the non-detects with their own open marker', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    const { organizationId, groupId } = await groupAddress(page, 'Head sawyer – wood dust');
    await page.goto(`/orgs/${organizationId}/exposure-groups/${groupId}/assessment`);
    await page.getByRole('heading', { level: 1, name: 'Head sawyer – wood dust' }).waitFor();
    expect(await page.getByTestId('nondetect-note').innerText()).toMatch(/Charts draw non-detects as open circles/);
    const probability = page.locator('figure[data-chart="probability"]');
    await probability.locator('svg.main-svg').first().waitFor({ timeout: 30_000 });
    // Plotly's legend names the trace; the caption says how non-detects are drawn.
    await probability.getByText('Non-detect (at its fitted value)').waitFor();
    expect(await probability.locator('figcaption').innerText()).toMatch(/non-detects?, drawn as open circles/);
    await page.locator('figure[data-chart="workers"] svg.main-svg').first().waitFor();
    await screenshot(page, 'assessment-wood-dust-non-detects');
    assertClean();
    await context.close();
  });

  it('a group with too few results says which rule stops the assessment and still lists its results', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.manager);
    const { organizationId, groupId } = await groupAddress(page, 'Forklift driver – noise');
    await page.goto(`/orgs/${organizationId}/exposure-groups/${groupId}/assessment`);
    await page.getByRole('heading', { level: 2, name: 'This group cannot be assessed yet' }).waitFor();
    expect(await page.getByTestId('refusal-rule').innerText()).toMatch(/at least 3 results are needed \(rule: fewer than 3 results\), got 2/i);
    expect(await page.getByRole('table', { name: 'Valid shift results of this group' }).locator('tbody tr').count()).toBe(2);
    // A manager reads; the what-if boxes are for roles that run statistics.
    expect(await page.getByRole('checkbox').count()).toBe(0);
    await page.getByTestId('hearing-conservation').waitFor();
    await screenshot(page, 'assessment-too-few-results');
    const { violations } = await axeScan(page);
    expect(severe(violations)).toEqual([]);
    assertClean();
    await context.close();
  });
});
