import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readZip } from '../helpers/read-zip';
import { demoUsers, screenshot, signIn, useE2eApp } from './harness';

// Evidence packs in the browser (issue: "done when a consultant can download a pack for each approved demo
// decision"): the consultant, a member of both demo organizations, finds every approved record from each
// organization's overview, opens it and downloads the pack; each zip holds the PDF, data.csv and record.json.

const app = useE2eApp();

describe('evidence packs', () => {
  it('a consultant downloads the evidence pack of every approved demo decision in both organizations', async () => {
    const { page, context, assertClean } = await app.open();
    await signIn(page, demoUsers.consultant);
    const me = (await (await page.request.get('/api/me')).json()) as { memberships: Array<{ organizationId: number }> };
    expect(me.memberships.length).toBe(2);
    const downloaded: string[] = [];
    for (const membership of me.memberships) {
      await page.goto(`/orgs/${membership.organizationId}`);
      const recent = page.getByRole('table', { name: 'Recent decision records' });
      await recent.waitFor();
      const approvedRows = recent.locator('tbody tr').filter({ hasText: 'Approved' });
      const links = await approvedRows.getByRole('link', { name: /^Record \d+$/ }).allTextContents();
      expect(links.length).toBeGreaterThan(0);
      for (const link of links) {
        await page.goto(`/orgs/${membership.organizationId}`);
        await page.getByRole('table', { name: 'Recent decision records' }).getByRole('link', { name: link, exact: true }).click();
        await page.getByRole('heading', { level: 2, name: 'Evidence pack' }).waitFor();
        const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download evidence pack' }).click()]);
        expect(download.suggestedFilename()).toMatch(/^evidence-pack-record-\d+-[a-z0-9-]+\.zip$/);
        const path = await download.path();
        const files = await readZip(readFileSync(path));
        expect([...files.keys()]).toEqual(expect.arrayContaining(['evidence-pack.pdf', 'data.csv', 'record.json']));
        expect(files.get('evidence-pack.pdf')!.subarray(0, 5).toString('latin1')).toBe('%PDF-');
        const record = JSON.parse(files.get('record.json')!.toString('utf8')) as { record: { id: number; status: string } };
        expect(`Record ${record.record.id}`).toBe(link);
        expect(record.record.status).toBe('approved');
        downloaded.push(link);
        if (downloaded.length === 1) await screenshot(page, 'evidence-pack-consultant');
      }
    }
    // Two approved records at Ridgeback Timber and one at Slate Harbor in the demo (backend/src/db/seed-demo-decisions.ts).
    expect(downloaded.length).toBe(3);
    assertClean();
    await context.close();
  });

  it('shows no download to a hygienist, whose role does not hold evidence:export', async () => {
    const { page, context, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await page.waitForURL(/\/orgs\/\d+$/);
    const recent = page.getByRole('table', { name: 'Recent decision records' });
    await recent
      .locator('tbody tr')
      .filter({ hasText: 'Approved' })
      .first()
      .getByRole('link', { name: /^Record \d+$/ })
      .click();
    await page.getByText('Figures frozen at approval').waitFor();
    expect(await page.getByRole('link', { name: 'Download evidence pack' }).count()).toBe(0);
    assertClean();
    await context.close();
  });
});
