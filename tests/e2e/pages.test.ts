import { describe, expect, it } from 'vitest';
import { axeScan, demoUsers, linkFromOutbox, organizationNames, screenshot, severe, signIn, useE2eApp } from './harness';

// Sign-in errors, the password-reset journey, the 404 page, keyboard access and an axe-core
// scan, against the real server.

const app = useE2eApp();

describe('signing in', () => {
  it("a wrong password shows the server's message and stays on the sign-in page", async () => {
    const { context, page, assertClean } = await app.open();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(demoUsers.manager);
    await page.getByLabel('Password').fill('certainly-not-it');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'E-mail or password is wrong' });
    await alert.waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await screenshot(page, 'sign-in-wrong-password');
    assertClean();
    await context.close();
  });

  it('empty fields are refused in the browser with messages tied to their inputs', async () => {
    const { context, page, assertClean } = await app.open();
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('Enter a valid e-mail address').waitFor();
    await page.getByText('Enter your password').waitFor();
    for (const label of ['E-mail', 'Password']) {
      expect(await page.getByLabel(label).getAttribute('aria-invalid')).toBe('true');
    }
    assertClean();
    await context.close();
  });
});

describe('resetting a forgotten password', () => {
  it("the reset e-mail's link sets a new password that then signs in", async () => {
    const visitor = await app.open();
    await visitor.page.goto('/sign-in');
    await visitor.page.getByRole('link', { name: 'Forgot your password?' }).click();
    await visitor.page.getByLabel('E-mail').fill(demoUsers.hygienist);
    await visitor.page.getByRole('button', { name: 'Send the link' }).click();
    await visitor.page.getByText('Check your e-mail').waitFor();

    // The link is read from the Outbox page as an admin would (development set-up).
    const admin = await app.open();
    await signIn(admin.page, demoUsers.admin);
    const resetLink = await linkFromOutbox(admin.page, demoUsers.hygienist, '/reset-password/');
    expect(new URL(resetLink).origin).toBe(app.server.url);

    await visitor.page.goto(resetLink);
    await visitor.page.getByLabel('New password', { exact: true }).fill('short');
    await visitor.page.getByLabel('New password, again').fill('different');
    await visitor.page.getByRole('button', { name: 'Save the new password' }).click();
    await visitor.page.getByText('Use at least 10 characters').waitFor();
    await visitor.page.getByText('The two passwords are not the same').waitFor();

    await visitor.page.getByLabel('New password', { exact: true }).fill('planer-feeder-2026');
    await visitor.page.getByLabel('New password, again').fill('planer-feeder-2026');
    await visitor.page.getByRole('button', { name: 'Save the new password' }).click();
    await visitor.page.getByText('Your password is changed. Sign in with the new one.').waitFor();
    await signIn(visitor.page, demoUsers.hygienist, 'planer-feeder-2026');
    await visitor.page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();

    visitor.assertClean();
    admin.assertClean();
    await Promise.all([visitor.context.close(), admin.context.close()]);
  });
});

describe('addresses the app does not know', () => {
  it('an unknown URL shows the 404 page with a way back', async () => {
    const { context, page, assertClean } = await app.open();
    await page.goto('/no/such/page');
    await page.getByRole('heading', { level: 1, name: 'Page not found' }).waitFor();
    await page.getByText('/no/such/page').waitFor();
    await page.getByRole('link', { name: 'Go to the start page' }).waitFor();
    expect(await page.title()).toBe('Page not found · Bellwether');
    await screenshot(page, 'not-found');
    assertClean();
    await context.close();
  });
});

describe('accessibility', () => {
  it('the home page has no serious or critical axe-core violations, and the skip link is the first tab stop', async () => {
    const { context, page, assertClean } = await app.open();
    await signIn(page, demoUsers.admin);
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    await page.locator('[data-count="sites"]').waitFor();

    const scan = await axeScan(page);
    expect(scan.passedRules).toBeGreaterThan(10);
    expect(severe(scan.violations)).toEqual([]);

    // The scan can fail: a planted image without a text alternative is reported as critical.
    await page.evaluate(() => {
      const image = document.createElement('img');
      image.src = 'data:image/gif;base64,R0lGODlhAQABAAAAACw=';
      document.getElementById('main')?.append(image);
    });
    expect((await axeScan(page)).violations.map((v) => v.id)).toContain('image-alt');

    await page.reload();
    await page.getByRole('heading', { level: 1, name: organizationNames.ridgeback }).waitFor();
    await page.keyboard.press('Tab');
    const focused = page.locator(':focus');
    expect(await focused.innerText()).toBe('Skip to main content');
    expect(await focused.isVisible()).toBe(true);
    await screenshot(page, 'home-skip-link-focused');
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');
    assertClean();
    await context.close();
  });

  it('the sign-in page and the people page have no serious or critical axe-core violations', async () => {
    const { context, page, assertClean } = await app.open();
    await page.goto('/sign-in');
    await page.getByRole('heading', { level: 1, name: 'Sign in' }).waitFor();
    expect(severe((await axeScan(page)).violations)).toEqual([]);

    await signIn(page, demoUsers.admin);
    await page.goto('/users');
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    await page.getByRole('table').first().locator('tbody tr').first().waitFor();
    expect(severe((await axeScan(page)).violations)).toEqual([]);
    assertClean();
    await context.close();
  });
});
