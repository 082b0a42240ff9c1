import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoPassword, demoUsers, linkFromOutbox, navigationItems, organizationNames, screenshot, signIn, useE2eApp } from './harness';

// The admin's people page (members table, invitations) and the invitation journey through
// the Outbox page, against the real server and its local e-mail capture.

const app = useE2eApp();

const membersTable = (page: Page) => page.getByRole('table').filter({ has: page.getByRole('columnheader', { name: /Member since/ }) });
const invitationsTable = (page: Page) => page.getByRole('table').filter({ has: page.getByRole('columnheader', { name: 'Expires' }) });

/** The e-mail column of the members table, in the order shown. */
async function shownEmails(page: Page): Promise<string[]> {
  return membersTable(page).locator('tbody tr td:nth-child(2)').allInnerTexts();
}

async function openPeoplePage(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'People' }).click();
  await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
  await membersTable(page).locator('tbody tr').first().waitFor();
}

/** Sends an invitation from the people page and waits for the confirmation. */
async function invite(page: Page, email: string, role: string): Promise<void> {
  const form = page.getByRole('form', { name: 'Invite someone' });
  await form.getByLabel('E-mail').fill(email);
  await form.getByLabel('Role').selectOption({ label: role });
  await form.getByRole('button', { name: 'Send invitation' }).click();
  await page.getByText(`Invitation sent to ${email}`).waitFor();
}

/** The accept-invitation link of the newest e-mail to `email`, read on the Outbox page. */
const invitationLinkFromOutbox = (page: Page, email: string) => linkFromOutbox(page, email, '/accept-invitation/');

describe('the members table', () => {
  it("lists the organization's members and searches, filters and sorts them", async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await openPeoplePage(page);

    const all = await shownEmails(page);
    expect(all).toEqual(expect.arrayContaining([demoUsers.admin, demoUsers.hygienist, demoUsers.analyst, demoUsers.manager, demoUsers.consultant]));
    await screenshot(page, 'people-admin');

    await page.getByRole('searchbox', { name: 'Search name or e-mail' }).fill('manager@');
    await expect.poll(() => shownEmails(page)).toEqual([demoUsers.manager]);
    await page.getByRole('searchbox', { name: 'Search name or e-mail' }).fill('');

    const filters = page.getByRole('search', { name: 'Filter members' });
    await filters.getByLabel('Role').selectOption({ label: 'Consultant' });
    await expect.poll(() => shownEmails(page)).toEqual([demoUsers.consultant]);
    await filters.getByLabel('Role').selectOption({ label: 'All roles' });

    // Sorting by e-mail: ascending, then descending, with aria-sort on the header.
    const emailHeader = membersTable(page).getByRole('columnheader', { name: /E-mail/ });
    await emailHeader.getByRole('button').click();
    await expect.poll(() => emailHeader.getAttribute('aria-sort')).toBe('ascending');
    const ascending = await shownEmails(page);
    expect(ascending).toEqual([...ascending].sort((a, b) => a.localeCompare(b)));
    await emailHeader.getByRole('button').click();
    await expect.poll(() => emailHeader.getAttribute('aria-sort')).toBe('descending');
    expect(await shownEmails(page)).toEqual([...ascending].reverse());
    assertClean();
    await context.close();
  });

  it("refuses to demote the last active admin and shows the server's reason", async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await openPeoplePage(page);
    const ownRole = membersTable(page).locator('tbody tr', { hasText: demoUsers.admin }).getByRole('combobox');
    await ownRole.selectOption('analyst');
    await page.getByRole('status').or(page.getByRole('alert')).filter({ hasText: 'last active admin' }).waitFor();
    // The list is read again from the server: the role did not change.
    await page.reload();
    await membersTable(page).locator('tbody tr').first().waitFor();
    expect(await membersTable(page).locator('tbody tr', { hasText: demoUsers.admin }).getByRole('combobox').inputValue()).toBe('admin');
    assertClean();
    await context.close();
  });

  it("links a wrong e-mail's message to its field before anything is sent", async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await openPeoplePage(page);
    const form = page.getByRole('form', { name: 'Invite someone' });
    const email = form.getByLabel('E-mail');
    await email.fill('not-an-address');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    const message = page.getByText('Enter a valid e-mail address');
    await message.waitFor();
    expect(await email.getAttribute('aria-invalid')).toBe('true');
    const messageId = await message.getAttribute('id');
    expect(messageId).toBeTruthy();
    expect((await email.getAttribute('aria-describedby'))?.split(' ')).toContain(messageId);
    assertClean();
    await context.close();
  });
});

describe('inviting someone', () => {
  it('an admin invites, the e-mail appears in the Outbox, and the invitee sets a password and lands signed in', async () => {
    const admin = await app.open();
    await signIn(admin.page, demoUsers.admin);
    await openPeoplePage(admin.page);
    const newcomer = 'edger.lead@ridgeback.example';
    await invite(admin.page, newcomer, 'Hygienist');
    await invitationsTable(admin.page)
      .getByRole('row', { name: new RegExp(newcomer) })
      .waitFor();

    const link = await invitationLinkFromOutbox(admin.page, newcomer);
    expect(new URL(link).origin).toBe(app.server.url);
    await admin.page.getByRole('heading', { name: 'Text version' }).waitFor();
    // The HTML version renders in a frame that may run nothing.
    const frame = admin.page.locator('iframe[title^="HTML version"]');
    expect(await frame.getAttribute('sandbox')).toBe('');
    expect(await frame.contentFrame().locator('body').innerText()).toContain(organizationNames.ridgeback);
    await screenshot(admin.page, 'outbox-invitation');

    const invitee = await app.open();
    await invitee.page.goto(link);
    await invitee.page.getByRole('heading', { name: 'Join Bellwether' }).waitFor();
    await invitee.page.getByText(`You are invited to ${organizationNames.ridgeback} as Hygienist`).waitFor();
    expect(await invitee.page.getByLabel('E-mail').inputValue()).toBe(newcomer);
    await invitee.page.getByLabel('Your name').fill('Rowan Tallis');
    await invitee.page.getByLabel('Password', { exact: true }).fill('sawdust-and-sunlight');
    await invitee.page.getByLabel('Password, again').fill('sawdust-and-sunlight');
    await screenshot(invitee.page, 'accept-invitation');
    await invitee.page.getByRole('button', { name: 'Accept and sign in' }).click();

    await invitee.page.waitForURL(/\/orgs\/\d+$/);
    await invitee.page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    await invitee.page.getByText('You work here as Hygienist.').waitFor();
    await invitee.page.getByText('Rowan Tallis').waitFor();
    // A hygienist's sidebar: the pages to read and the import, no People (roles.test.ts lists every role's).
    expect(await navigationItems(invitee.page)).toEqual([
      'Overview',
      'Exposure groups',
      'Decision records',
      'Workers',
      'Sites',
      'Agents & OELs',
      'Hearing protectors',
      'Import results',
      'Noise logs',
    ]);

    // The admin sees the newcomer as a member and the invitation no longer open.
    await openPeoplePage(admin.page);
    await membersTable(admin.page).locator('tbody tr', { hasText: newcomer }).waitFor();
    expect(
      await invitationsTable(admin.page)
        .getByRole('row', { name: new RegExp(newcomer) })
        .count(),
    ).toBe(0);

    // The link works once.
    const again = await app.open();
    await again.page.goto(link);
    await again.page.getByText('This invitation link no longer works').waitFor();

    admin.assertClean();
    invitee.assertClean();
    again.assertClean();
    await Promise.all([admin.context.close(), invitee.context.close(), again.context.close()]);
  });

  it('someone who already has an account joins with their existing password; a wrong one is marked on the field', async () => {
    const admin = await app.open();
    await signIn(admin.page, demoUsers.admin);
    await openPeoplePage(admin.page);
    await invite(admin.page, demoUsers.slateAdmin, 'Consultant');
    const link = await invitationLinkFromOutbox(admin.page, demoUsers.slateAdmin);

    const invitee = await app.open();
    await invitee.page.goto(link);
    await invitee.page.getByLabel('Your name').fill('Slate Harbor admin');
    await invitee.page.getByLabel('Password', { exact: true }).fill('not-my-password');
    await invitee.page.getByLabel('Password, again').fill('not-my-password');
    await invitee.page.getByRole('button', { name: 'Accept and sign in' }).click();
    const fieldMessage = invitee.page.getByText('Enter the password of your existing Bellwether account');
    await fieldMessage.waitFor();
    const passwordField = invitee.page.getByLabel('Password', { exact: true });
    expect(await passwordField.getAttribute('aria-invalid')).toBe('true');
    expect((await passwordField.getAttribute('aria-describedby'))?.split(' ')).toContain(await fieldMessage.getAttribute('id'));

    await passwordField.fill(demoPassword);
    await invitee.page.getByLabel('Password, again').fill(demoPassword);
    await invitee.page.getByRole('button', { name: 'Accept and sign in' }).click();
    await invitee.page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    await invitee.page.getByText('You work here as Consultant.').waitFor();
    const switcher = invitee.page.getByLabel('Organization', { exact: true });
    expect(await switcher.locator('option').allInnerTexts()).toEqual(expect.arrayContaining([organizationNames.ridgeback, organizationNames.slateHarbor]));
    await switcher.selectOption({ label: organizationNames.slateHarbor });
    await invitee.page.getByText('You work here as Admin.').waitFor();

    admin.assertClean();
    invitee.assertClean();
    await Promise.all([admin.context.close(), invitee.context.close()]);
  });

  it('a revoked invitation leaves the list and its link stops working', async () => {
    const admin = await app.open();
    await signIn(admin.page, demoUsers.admin);
    await openPeoplePage(admin.page);
    const email = 'planer.feeder@ridgeback.example';
    await invite(admin.page, email, 'Analyst');
    const link = await invitationLinkFromOutbox(admin.page, email);

    await openPeoplePage(admin.page);
    await admin.page.getByRole('button', { name: `Revoke the invitation for ${email}` }).click();
    await admin.page.getByText(`The invitation for ${email} is revoked`).waitFor();
    await expect
      .poll(() =>
        invitationsTable(admin.page)
          .getByRole('row', { name: new RegExp(email) })
          .count(),
      )
      .toBe(0);

    const invitee = await app.open();
    await invitee.page.goto(link);
    await invitee.page.getByText('This invitation link no longer works').waitFor();
    admin.assertClean();
    invitee.assertClean();
    await Promise.all([admin.context.close(), invitee.context.close()]);
  });

  it('a deactivated member cannot sign in to the organization until reactivated', async () => {
    const admin = await app.open();
    await signIn(admin.page, demoUsers.admin);
    await openPeoplePage(admin.page);
    const row = membersTable(admin.page).locator('tbody tr', { hasText: demoUsers.analyst });
    await row.getByRole('button', { name: /^Deactivate/ }).click();
    await row.getByText('Deactivated').waitFor();

    const analyst = await app.open();
    await signIn(analyst.page, demoUsers.analyst);
    await analyst.page.getByText('You are not a member of any organization yet').waitFor();

    await row.getByRole('button', { name: /^Reactivate/ }).click();
    await row.getByText('Active', { exact: true }).waitFor();
    await analyst.page.goto('/');
    await analyst.page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    admin.assertClean();
    analyst.assertClean();
    await Promise.all([admin.context.close(), analyst.context.close()]);
  });
});
