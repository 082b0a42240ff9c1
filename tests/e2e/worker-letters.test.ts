import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, openPage, screenshot, severe, signIn, useE2eApp } from './harness';

// Worker letters in the browser (issue: "done when a hygienist can … send notification letters, all in
// the browser"): from a group page the hygienist opens the letters, drafts them, previews a PDF, sends one
// by e-mail, marks one handed over (the worker has no address) and cancels one with a reason. The demo
// drafts the edger operators' letters (backend/src/db/seed-demo-letters.ts): RT-003 has an address, RT-004 none.

const app = useE2eApp();

async function openLetters(page: import('playwright-core').Page, organizationPath: string, groupName: string) {
  await page.goto(`${organizationPath}/exposure-groups`);
  await page.getByRole('link', { name: groupName, exact: true }).first().click();
  await page.getByRole('heading', { level: 1, name: groupName }).waitFor();
  await page.getByRole('link', { name: 'Worker letters' }).click();
  await page.getByRole('heading', { level: 1, name: 'Worker letters' }).waitFor();
}

describe('worker letters', () => {
  it('a hygienist drafts, previews, e-mails, hands over and cancels worker letters', async () => {
    const { page, context, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await page.waitForURL(/\/orgs\/\d+$/);
    const organizationPath = new URL(page.url()).pathname;

    // Draft: the maintenance fitters have results at or above the action level without a letter.
    await openLetters(page, organizationPath, 'Maintenance fitter – noise');
    const pending = page.getByRole('region', { name: 'Results at or above the action level without a letter' });
    await pending.getByText(/^Action level: 50 % dose\. The action level set on this exposure group, from the rule that applies\./).waitFor();
    await pending.getByRole('table').waitFor();
    expect(await pending.locator('tbody tr').count()).toBeGreaterThan(0);
    await page.getByRole('button', { name: /^Draft letters \(\d+\)$/ }).click();
    await page.getByText(/^Drafted \d+ letters?: preview each PDF/).waitFor();
    const letters = page.getByRole('region', { name: 'Letters' });
    const drafted = letters.locator('tbody tr').filter({ hasText: 'Drafted' });
    expect(await drafted.count()).toBeGreaterThan(0);
    expect(await page.getByText('No result is waiting for a letter').count()).toBe(1);

    // Preview: the link serves the draft's PDF.
    const href = await drafted.first().getByRole('link', { name: 'Preview PDF' }).getAttribute('href');
    const pdf = await page.request.get(href!);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    // Cancel with a reason: the results wait for a letter again.
    await drafted.first().getByRole('button', { name: 'Cancel letter' }).click();
    const dialog = page.getByRole('dialog', { name: 'Cancel the letter' });
    await dialog.getByLabel('Reason').fill('Drafted before the results were checked');
    await dialog.getByRole('button', { name: 'Cancel letter' }).click();
    await letters.locator('tbody tr').filter({ hasText: 'Cancelled' }).first().waitFor();
    await letters.getByText('Drafted before the results were checked').waitFor();
    await pending.getByRole('table').waitFor();

    // Send by e-mail and hand over: the edger operators' demo letters.
    await openLetters(page, organizationPath, 'Edger operator – noise');
    const edgerLetters = page.getByRole('region', { name: 'Letters' });
    const withAddress = edgerLetters.locator('tbody tr').filter({ hasText: 'RT-003' });
    await withAddress.getByRole('button', { name: 'Send by e-mail' }).click();
    await page.getByText('sent to billie.tarrant@crew.ridgeback.example.').waitFor();
    await withAddress.getByText('Sent by e-mail').waitFor();
    await withAddress.getByText(/Sent .* to billie\.tarrant@crew\.ridgeback\.example by Dana Whitlock/).waitFor();
    expect(await withAddress.getByRole('link', { name: 'PDF as sent' }).count()).toBe(1);

    const noAddress = edgerLetters.locator('tbody tr').filter({ hasText: 'RT-004' });
    expect(await noAddress.getByRole('button', { name: 'Send by e-mail' }).count()).toBe(0);
    await noAddress.getByRole('button', { name: 'Mark handed over' }).click();
    const handOver = page.getByRole('dialog', { name: 'Mark the letter handed over' });
    await handOver.getByRole('button', { name: 'Mark handed over' }).click();
    await noAddress.getByText('Handed over', { exact: true }).waitFor();
    await screenshot(page, 'worker-letters-hygienist');
    const scan = await axeScan(page);
    expect(scan.passedRules).toBeGreaterThan(10);
    expect(severe(scan.violations)).toEqual([]);
    assertClean();
    await context.close();

    // The e-mail reached the local capture with the PDF attached (the admin reads the Outbox).
    const admin = await openPage(app.browser, app.server.url);
    await signIn(admin.page, demoUsers.admin);
    const outbox = (await (await admin.page.request.get('/api/outbox')).json()) as Array<{ id: number; to: string; subject: string }>;
    const letter = outbox.find((message) => message.to === 'billie.tarrant@crew.ridgeback.example');
    expect(letter?.subject).toBe('Your noise exposure results from Ridgeback Timber Co.');
    const message = (await (await admin.page.request.get(`/api/outbox/${letter!.id}`)).json()) as {
      text: string;
      attachments: Array<{ filename: string; contentType: string }>;
    };
    expect(message.text).toContain('Dear Billie Tarrant,');
    expect(message.attachments).toEqual([
      expect.objectContaining({ filename: expect.stringMatching(/^exposure-letter-RT-003-\d{4}-\d{2}-\d{2}\.pdf$/), contentType: 'application/pdf' }),
    ]);
    // The Outbox page lists the attachment.
    await admin.page.goto(`/outbox/${letter!.id}`);
    await admin.page
      .getByRole('region', { name: 'Attachments' })
      .getByText(/^exposure-letter-RT-003-.*\.pdf \(application\/pdf, \d+ KB\)$/)
      .waitFor();
    admin.assertClean();
    await admin.context.close();
  });

  it('a hygienist records a worker’s e-mail address for letters on the worker form', async () => {
    const { page, context, assertClean } = await app.open();
    await signIn(page, demoUsers.hygienist);
    await page.waitForURL(/\/orgs\/\d+$/);
    await page.goto(`${new URL(page.url()).pathname}/workers`);
    await page.getByRole('link', { name: 'RT-009', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'RT-009' }).waitFor();
    await page.getByText('None recorded').waitFor();
    await page.getByRole('button', { name: 'Edit', exact: true }).click();
    const address = page.getByLabel('E-mail address (optional)');
    await address.fill('not an address');
    await page.getByRole('button', { name: 'Save worker' }).click();
    await page.getByText('Enter an e-mail address such as name@example.com').waitFor();
    await address.fill('rt009@crew.ridgeback.example');
    await page.getByRole('button', { name: 'Save worker' }).click();
    await page.getByText('rt009@crew.ridgeback.example', { exact: true }).waitFor();
    assertClean();
    await context.close();
  });
});
