import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { organizations } from '@schema/organizations';
import type { Role } from '@schema/permissions';
import { createApp, type BellwetherApp } from '../../backend/src/app';
import { createFakeClock, type FakeClock } from '../../backend/src/clock';
import { defaultRateLimits, loadSettings, type AppConfig } from '../../backend/src/config';
import { openMigratedDatabase, type Db } from '../../backend/src/db/client';
import { defaultDemoPassword, seedDemo } from '../../backend/src/db/seed-demo';
import { startCaptureServer, type Outbox } from '../../backend/src/email/capture-server';
import { createSmtpMailer } from '../../backend/src/email/mailer';
import type { AssessmentEngine } from '../../backend/src/services/assessment';

/*
 * A whole Bellwether app for tests: a temporary SQLite file (migrated, demo seeded), a local
 * e-mail capture, a clock that stands still until moved, and helpers to sign in as a demo role.
 * API tests use `createTestContext()` with supertest; browser tests use `startTestServer()`.
 */

export const demoPassword = defaultDemoPassword;
export type DemoOrganization = 'ridgeback' | 'slateHarbor';

const demoDomains: Record<DemoOrganization, string> = { ridgeback: 'ridgeback.example', slateHarbor: 'slateharbor.example' };
const demoSlugs: Record<DemoOrganization, string> = { ridgeback: 'ridgeback-timber', slateHarbor: 'slate-harbor' };

/** The demo e-mail address for a role (the consultant is the same person in both organizations). */
export function demoEmail(role: Role, organization: DemoOrganization = 'ridgeback'): string {
  return role === 'consultant' ? 'consultant@fieldwise.example' : `${role}@${demoDomains[organization]}`;
}

export interface TestContextOptions {
  /** Seed the demo scenario (default true). */
  seed?: boolean;
  /** Also seed the demo decision records (default false: they run the statistics engine, which takes seconds). */
  decisions?: boolean;
  /** Replace parts of the test configuration (e.g. small rate limits, nodeEnv). */
  config?: Partial<AppConfig>;
  /** Start the e-mail capture and the Outbox endpoints (default true). */
  capture?: boolean;
  clock?: FakeClock;
  /** The app's statistics threads and cache, to watch or share them (the test closes it); by default the app's own. */
  assessmentEngine?: AssessmentEngine;
}

/** A migrated database in a temporary folder, without an app (for schema and service tests). */
export function createTemporaryDatabase(): { db: Db; close(): void } {
  const folder = mkdtempSync(join(tmpdir(), 'bellwether-db-'));
  const db = openMigratedDatabase(join(folder, 'bellwether.db'));
  return {
    db,
    close() {
      db.$client.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** A configuration for tests: silent logs, a fixed secret, generous rate limits unless overridden. */
export function testConfig(databasePath: string, overrides: Partial<AppConfig> = {}): AppConfig {
  const base = loadSettings({ NODE_ENV: 'test', DATABASE_PATH: databasePath }).config;
  return {
    ...base,
    appUrl: 'http://bellwether.test',
    sessionSecret: 'test-secret-for-bellwether-tests-0123456789',
    logLevel: process.env.LOG_LEVEL ?? 'silent',
    rateLimits: {
      ...defaultRateLimits,
      signIn: { limit: 1000, windowMs: 60_000 },
      signInPerAddress: { limit: 1000, windowMs: 60_000 },
      forgotPassword: { limit: 1000, windowMs: 60_000 },
      resetPassword: { limit: 1000, windowMs: 60_000 },
    },
    ...overrides,
  };
}

/** A supertest agent (keeps cookies) that sends the session's CSRF token with every change. */
export class Client {
  constructor(
    readonly agent: InstanceType<typeof request.agent>,
    public csrfToken: string,
  ) {}

  get(path: string) {
    return this.agent.get(path);
  }
  post(path: string, body?: object) {
    return this.agent
      .post(path)
      .set('X-CSRF-Token', this.csrfToken)
      .send(body ?? {});
  }
  patch(path: string, body?: object) {
    return this.agent
      .patch(path)
      .set('X-CSRF-Token', this.csrfToken)
      .send(body ?? {});
  }
  put(path: string, body?: object) {
    return this.agent
      .put(path)
      .set('X-CSRF-Token', this.csrfToken)
      .send(body ?? {});
  }
  delete(path: string) {
    return this.agent.delete(path).set('X-CSRF-Token', this.csrfToken);
  }
}

export interface SignedIn extends Client {
  user: { id: number; email: string; name: string };
  memberships: Array<{ id: number; organizationId: number; organizationSlug: string; role: Role; permissions: string[] }>;
}

export interface TestContext {
  app: BellwetherApp;
  db: Db;
  config: AppConfig;
  clock: FakeClock;
  /** The capture's mailbox (undefined with `capture: false`). */
  mailbox: Outbox;
  /** A new anonymous client that already holds a CSRF token. */
  client(): Promise<Client>;
  /** Signs in (throws with the answer if sign-in fails). */
  signIn(email: string, password?: string): Promise<SignedIn>;
  /** Signs in as a demo role. */
  signInAs(role: Role, organization?: DemoOrganization): Promise<SignedIn>;
  /** Id of a demo organization. */
  organizationId(organization: DemoOrganization): number;
  close(): Promise<void>;
}

/** Builds a fresh app on its own temporary database file. Call `close()` in afterAll/afterEach. */
export async function createTestContext(options: TestContextOptions = {}): Promise<TestContext> {
  const folder = mkdtempSync(join(tmpdir(), 'bellwether-test-'));
  const config = testConfig(join(folder, 'bellwether.db'), options.config);
  const db = openMigratedDatabase(config.databasePath);
  const clock = options.clock ?? createFakeClock();
  if (options.seed ?? true) await seedDemo(db, { password: demoPassword, clock, decisions: options.decisions ?? false });
  const capture = options.capture === false ? undefined : await startCaptureServer({ now: clock.now });
  const mailer = capture
    ? createSmtpMailer(capture.smtpUrl, config.mailFrom)
    : { send: () => Promise.reject(new Error('No e-mail capture in this test context')), close: () => undefined };
  const app = createApp({ db, mailer, config, clock, outbox: capture?.outbox, assessmentEngine: options.assessmentEngine });

  const client = async () => {
    const agent = request.agent(app);
    const answer = await agent.get('/api/auth/csrf');
    if (answer.status !== 200) throw new Error(`GET /api/auth/csrf answered ${answer.status}`);
    return new Client(agent, answer.body.csrfToken as string);
  };

  const signIn = async (email: string, password = demoPassword): Promise<SignedIn> => {
    const anonymous = await client();
    const answer = await anonymous.post('/api/auth/sign-in', { email, password });
    if (answer.status !== 200) throw new Error(`Sign-in as ${email} answered ${answer.status}: ${JSON.stringify(answer.body)}`);
    return Object.assign(new Client(anonymous.agent, answer.body.csrfToken as string), {
      user: answer.body.user,
      memberships: answer.body.memberships,
    });
  };

  return {
    app,
    db,
    config,
    clock,
    mailbox: capture?.outbox as Outbox,
    client,
    signIn,
    signInAs: (role, organization = 'ridgeback') => signIn(demoEmail(role, organization)),
    organizationId(organization) {
      const row = db.select().from(organizations).where(eq(organizations.slug, demoSlugs[organization])).get();
      if (!row) throw new Error(`The demo organization ${organization} is not seeded in this context`);
      return row.id;
    },
    async close() {
      app.dispose();
      mailer.close();
      await capture?.close();
      db.$client.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/**
 * The same app listening on a free loopback port, for browser tests (serves dist/client; run
 * `npm run build` first). `url` has no trailing slash.
 */
export async function startTestServer(options: TestContextOptions = {}): Promise<TestContext & { url: string }> {
  const context = await createTestContext(options);
  const server: Server = await new Promise((resolve) => {
    const listening = context.app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const url = `http://127.0.0.1:${port}`;
  // Links in e-mails point at this server (the app reads config.appUrl per request).
  context.config.appUrl = url;
  return {
    ...context,
    url,
    async close() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await context.close();
    },
  };
}
