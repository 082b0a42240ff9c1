/**
 * Stored script payloads are shown as inert text (OWASP XSS Prevention Cheat Sheet, output
 * encoding; common practice). Records are created through the API as the hygienist with script
 * payloads in their names and descriptions; the pages that list and show them are opened in
 * Chromium. No dialog may open, no injected element may exist, no payload may run (it would set
 * window.__bellwetherInjected), and the payload text must be visible as text. The API half is
 * tests/api/hostile-input.test.ts.
 */
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { openHttpSession } from '../helpers/http-session';
import { demoPassword, demoUsers, screenshot, signIn, useE2eApp } from './harness';

const app = useE2eApp();

const scriptTag = '<script>window.__bellwetherInjected = 1; alert("script tag")</script>';
const imageTag = '<img src=x onerror="window.__bellwetherInjected = 1; alert(\'image\')">';
const javascriptUrl = 'javascript:window.__bellwetherInjected=1';
const sqlText = "'; DROP TABLE shift_results; --";

/** What the page did with the payloads: dialogs opened, injected elements, and whether any payload ran. */
async function injectionTraces(page: Page, dialogs: string[]) {
  const traces = await page.evaluate(() => ({
    ran: (window as unknown as { __bellwetherInjected?: number }).__bellwetherInjected !== undefined,
    injectedImages: document.querySelectorAll('img[src="x"]').length,
    injectedScripts: [...document.querySelectorAll('script')].filter((script) => script.textContent?.includes('__bellwetherInjected')).length,
    javascriptLinks: [...document.querySelectorAll('a[href]')].filter((link) => link.getAttribute('href')!.trim().toLowerCase().startsWith('javascript:'))
      .length,
  }));
  return { ...traces, dialogs: [...dialogs] };
}

const clean = { ran: false, injectedImages: 0, injectedScripts: 0, javascriptLinks: 0, dialogs: [] };

describe('stored script payloads in the browser', () => {
  let base: string;
  let groupId: number;
  let workerId: number;

  beforeAll(async () => {
    const hygienist = await openHttpSession(app.server.url, demoUsers.hygienist, demoPassword);
    const me = (await (await hygienist.get('/api/me')).json()) as { memberships: Array<{ organizationId: number; organizationSlug: string }> };
    const organizationId = me.memberships.find((membership) => membership.organizationSlug === 'ridgeback-timber')!.organizationId;
    base = `/orgs/${organizationId}`;
    const api = `/api${base}`;
    const created = async (path: string, body: object) => {
      const answer = await hygienist.post(`${api}/${path}`, body);
      const json = (await answer.json()) as { id: number };
      if (answer.status !== 201) throw new Error(`POST ${path} answered ${answer.status}: ${JSON.stringify(json)}`);
      return json.id;
    };
    const siteId = await created('sites', { name: scriptTag, description: imageTag });
    const agentId = await created('agents', { name: imageTag, kind: 'chemical', notes: javascriptUrl });
    groupId = await created('exposure-groups', {
      siteId,
      agentId,
      name: `${scriptTag} group`,
      processArea: imageTag,
      tasks: javascriptUrl,
      exposureProfile: sqlText,
      jobTitles: [imageTag],
      oelValue: 1,
      oelUnit: 'mg/m3',
      oelSource: javascriptUrl,
      oelAveragingTime: '8h-twa',
    });
    workerId = await created('workers', { code: 'HX-1', name: imageTag, jobTitle: scriptTag });
  });

  it.each([
    { page: 'sites', path: () => `${base}/sites`, shows: scriptTag },
    { page: 'agents', path: () => `${base}/agents`, shows: imageTag },
    { page: 'exposure-groups', path: () => `${base}/exposure-groups`, shows: `${scriptTag} group` },
    { page: 'exposure-group', path: () => `${base}/exposure-groups/${groupId}`, shows: `${scriptTag} group` },
    { page: 'workers', path: () => `${base}/workers`, shows: imageTag },
    { page: 'worker', path: () => `${base}/workers/${workerId}`, shows: imageTag },
  ])('the $page page shows the payload as text and runs nothing', async ({ page: name, path, shows }) => {
    const { context, page, assertClean } = await app.open();
    const dialogs: string[] = [];
    page.on('dialog', (dialog) => {
      dialogs.push(dialog.message());
      void dialog.dismiss();
    });
    try {
      await signIn(page, demoUsers.hygienist);
      await page.goto(path());
      await page.getByText(shows, { exact: false }).first().waitFor();
      expect(await page.getByText(shows, { exact: false }).first().isVisible()).toBe(true);
      expect(await injectionTraces(page, dialogs)).toEqual(clean);
      await screenshot(page, `hostile-input-${name}`);
      assertClean();
    } finally {
      await context.close();
    }
  });
});
