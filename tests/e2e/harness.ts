/**
 * Browser-test harness: the real server (backend/src/server.ts, as `npm start` runs it) on a
 * free port with a fresh temporary SQLite file (demo seeded, local e-mail capture on), serving
 * the built client from dist/client, driven by Debian's Chromium through playwright-core.
 *
 * The e2e project runs after `npm run build`; without a build the harness stops with that advice.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';

const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
export const screenshotDir = join(projectRoot, 'tests/e2e/screenshots');

/** The demo password the harness seeds with (DEMO_PASSWORD), so tests do not rely on the default. */
export const demoPassword = 'bellwether-e2e-demo';

/** Demo sign-ins (PRODUCT.md "Demo scenario"). */
export const demoUsers = {
  admin: 'admin@ridgeback.example',
  hygienist: 'hygienist@ridgeback.example',
  analyst: 'analyst@ridgeback.example',
  manager: 'manager@ridgeback.example',
  consultant: 'consultant@fieldwise.example',
  slateAdmin: 'admin@slateharbor.example',
} as const;

export const organizationNames = { ridgeback: 'Ridgeback Timber Co.', slateHarbor: 'Slate Harbor Stoneworks' } as const;

export interface TestServer {
  /** "http://127.0.0.1:PORT", no trailing slash. */
  url: string;
  /** Stops the server and deletes its temporary database (unless `keepData`). */
  stop(): Promise<void>;
  /** The server process (crash and shutdown tests signal it themselves). */
  child: ChildProcess;
  /** The SQLite file the server uses. */
  databasePath: string;
  /** Everything the process printed so far. */
  output(): string;
  /** Resolves when the process has exited. */
  exited(): Promise<void>;
}

export interface StartServerOptions {
  /** Use this folder for the database instead of a new temporary one (restart on the same file). */
  dataDir?: string;
  /** Leave the database folder in place at stop (the test removes it). */
  keepData?: boolean;
  /** Extra environment (e.g. SEED_DEMO: 'false'). */
  env?: Record<string, string>;
  /** Whether the built client must exist (default true; API-only process tests say false). */
  requireClient?: boolean;
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolvePort(port));
    });
  });
}

function exited(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((done) => child.once('exit', () => done()));
}

/**
 * Starts backend/src/server.ts as a child process and waits until GET /api/health answers
 * `{ ok: true }`. The child's output is kept and included in the error if it never gets there.
 */
export async function startServer(options: StartServerOptions = {}): Promise<TestServer> {
  const clientDir = process.env.CLIENT_DIR ?? join(projectRoot, 'dist/client');
  if ((options.requireClient ?? true) && !existsSync(join(clientDir, 'index.html'))) {
    throw new Error(`${clientDir}/index.html is missing: run \`npm run build\` before the e2e tests (\`npm run test:e2e\` does both).`);
  }
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const dataDir = options.dataDir ?? mkdtempSync(join(tmpdir(), 'bellwether-e2e-'));
  const databasePath = join(dataDir, 'bellwether.db');
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'test',
    PORT: String(port),
    APP_URL: url,
    DATABASE_PATH: databasePath,
    SESSION_SECRET: 'e2e-session-secret-0123456789abcdef0123456789',
    DEMO_PASSWORD: demoPassword,
    SEED_DEMO: 'true',
    LOG_LEVEL: 'warn',
    ...options.env,
  };
  delete env.SMTP_URL; // no relay: the server starts its local e-mail capture and the Outbox page

  // Node itself with tsx as a loader (not the tsx command, which runs the server in a second
  // process): the child is the server, so a signal sent to it (SIGKILL in the crash tests) reaches it.
  const child = spawn(process.execPath, ['--import', 'tsx', 'backend/src/server.ts'], {
    cwd: projectRoot,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));

  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited(child);
      clearTimeout(timer);
    }
    if (!options.keepData) rmSync(dataDir, { recursive: true, force: true });
  };
  const started = { url, stop, child, databasePath, output: () => output, exited: () => exited(child) };

  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) {
      await stop();
      throw new Error(`The server exited with code ${child.exitCode} before answering /api/health:\n${output}`);
    }
    try {
      const response = await fetch(`${url}/api/health`);
      if (response.ok && ((await response.json()) as { ok?: boolean }).ok === true) return started;
    } catch {
      // not listening yet
    }
    await new Promise((wait) => setTimeout(wait, 250));
  }
  await stop();
  throw new Error(`The server did not answer /api/health within 90 s:\n${output}`);
}

/** Debian's Chromium (or CHROMIUM_PATH), headless, with everything that phones home turned off. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/**
 * A fresh context (its own cookies and localStorage: one person) and page. Every uncaught
 * page error and console error is recorded; `assertClean()` fails the test on any of them.
 * Chromium logs each non-2xx fetch as "Failed to load resource"; those are expected answers
 * (401 for /api/me when signed out, a 401 for a wrong password) and are left out.
 */
export async function openPage(browser: Browser, baseURL: string): Promise<{ context: BrowserContext; page: Page; assertClean: () => void }> {
  const context = await browser.newContext({ baseURL, viewport: { width: 1280, height: 860 }, locale: 'en-GB', timezoneId: 'UTC' });
  context.setDefaultTimeout(15_000);
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('console', (message) => {
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) problems.push(`console error: ${message.text()}`);
  });
  return {
    context,
    page,
    assertClean: () => {
      if (problems.length > 0) throw new Error(`The page reported problems:\n${problems.join('\n')}`);
    },
  };
}

export interface E2eApp {
  readonly server: TestServer;
  readonly browser: Browser;
  /** A fresh browser context and page on this server: one person. */
  open(): ReturnType<typeof openPage>;
}

/**
 * Registers beforeAll/afterAll for a test file: one server (fresh database) and one browser
 * shared by the file's tests; each test opens its own context, so people never share cookies.
 */
export function useE2eApp(): E2eApp {
  let server: TestServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  const started = <T>(value: T | undefined, what: string): T => {
    if (value === undefined) throw new Error(`The e2e ${what} did not start (see the beforeAll error)`);
    return value;
  };
  return {
    get server() {
      return started(server, 'server');
    },
    get browser() {
      return started(browser, 'browser');
    },
    open() {
      return openPage(started(browser, 'browser'), started(server, 'server').url);
    },
  };
}

/** Signs in through the form and waits until the app has left the sign-in page. */
export async function signIn(page: Page, email: string, password = demoPassword): Promise<void> {
  if (!page.url().includes('/sign-in')) await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/**
 * Opens the newest captured e-mail to `recipient` on the Outbox page (the page must show the
 * sidebar of an admin) and returns the first link in it whose address contains `pathPart`.
 */
export async function linkFromOutbox(page: Page, recipient: string, pathPart: string): Promise<string> {
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: /Outbox/ })
    .click();
  await page.getByRole('heading', { level: 1, name: 'Outbox' }).waitFor();
  await page
    .getByRole('list', { name: 'Captured e-mails' })
    .getByRole('link')
    .filter({ hasText: `To ${recipient}` })
    .first()
    .click();
  const links = page.getByRole('region', { name: 'Links in this message' }).getByRole('link');
  await links.first().waitFor();
  const hrefs = await links.evaluateAll((anchors) => anchors.map((a) => (a as HTMLAnchorElement).href));
  const link = hrefs.find((href) => href.includes(pathPart));
  if (!link) throw new Error(`No link containing ${pathPart} in the e-mail to ${recipient}: ${hrefs.join(', ')}`);
  return link;
}

/** The sidebar's navigation links, by their visible names (the Outbox link also shows a count). */
export async function navigationItems(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.getByRole('link').first().waitFor();
  const names = await nav.getByRole('link').allInnerTexts();
  return names.map((name) => name.split('\n')[0].trim());
}

/** Saves a full-page screenshot to tests/e2e/screenshots/<name>.png (gitignored) for a human to look at. */
export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(screenshotDir, { recursive: true });
  await page.screenshot({ path: join(screenshotDir, `${name}.png`), fullPage: true });
}

/** axe-core's source, injected with `page.evaluate` (helmet's CSP blocks addScriptTag's inline script). */
export const axeSource = readFileSync(join(projectRoot, 'node_modules/axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: Array<{ target: unknown[] }>;
}

/** Runs axe-core on the page as it is now: its violations and how many rules passed (proof it ran). */
export async function axeScan(page: Page): Promise<{ violations: AxeViolation[]; passedRules: number }> {
  await page.evaluate(axeSource);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document) => Promise<{ violations: AxeViolation[]; passes: unknown[] }> } }).axe;
    const result = await axe.run(document);
    return {
      violations: result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target })) })),
      passedRules: result.passes.length,
    };
  });
}

/** The serious and critical violations, one readable line each (an empty list is the goal). */
export function severe(violations: readonly AxeViolation[]): string[] {
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${JSON.stringify(v.nodes.map((n) => n.target))}`);
}
