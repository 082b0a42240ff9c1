// Starts Bellwether: reads the configuration, migrates the database, seeds the demo into a new
// database, starts the local e-mail capture when no SMTP_URL is given, and serves the API and
// the built client. `npm start` builds the client first.
import type { Server } from 'node:http';
import { dirname } from 'node:path';
import { createApp } from './app';
import { systemClock } from './clock';
import { loadSettings, persistedSessionSecret, type AppConfig } from './config';
import { openMigratedDatabase } from './db/client';
import { databaseIsEmpty, demoSignIns, seedDemo } from './db/seed-demo';
import { startCaptureServer, type CaptureServer } from './email/capture-server';
import { createSmtpMailer } from './email/mailer';
import { scheduleReviewReminders } from './jobs/review-reminders';
import { createLogger } from './logger';

async function main() {
  const settings = loadSettings();
  const logger = createLogger(settings.config.logLevel);

  let sessionSecret = settings.sessionSecret;
  if (!sessionSecret) {
    const persisted = persistedSessionSecret(dirname(settings.config.databasePath));
    sessionSecret = persisted.secret;
    console.warn(
      `SESSION_SECRET is not set: using the random secret ${persisted.created ? 'just created' : 'kept'} in ${persisted.path}. ` +
        'Set SESSION_SECRET (32+ characters) in production.',
    );
  }
  const config: AppConfig = { ...settings.config, sessionSecret };

  const db = openMigratedDatabase(config.databasePath);
  const wasEmpty = databaseIsEmpty(db);
  const seeded = settings.seedDemo ? (await seedDemo(db, { password: settings.demoPassword, clock: systemClock })).seeded : false;

  let capture: CaptureServer | undefined;
  let smtpUrl = settings.smtpUrl;
  if (!smtpUrl) {
    capture = await startCaptureServer();
    smtpUrl = capture.smtpUrl;
  }
  const mailer = createSmtpMailer(smtpUrl, config.mailFrom);
  const app = createApp({ db, mailer, config, clock: systemClock, logger, outbox: capture?.outbox });

  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(config.port, (error?: Error) => (error ? reject(error) : resolve(listening)));
  });
  // The daily review reminders: once now, then every 24 h (jobs/review-reminders.ts).
  const reviewReminders = scheduleReviewReminders({ db, mailer, clock: systemClock, logger, config });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;

  const lines = [
    '',
    `Bellwether is running at http://localhost:${port} (${config.nodeEnv}).`,
    `Database: ${config.databasePath}`,
    capture ? `E-mail: local capture on ${capture.smtpUrl}; admins read it on the Outbox page.` : 'E-mail: sent through SMTP_URL.',
  ];
  if (seeded) {
    lines.push('', `Demo scenario seeded. Sign in with password "${settings.demoPassword}" as:`);
    for (const signIn of demoSignIns) lines.push(`  ${signIn.email.padEnd(32)} ${signIn.access}`);
  } else if (!wasEmpty && settings.seedDemo) {
    lines.push('', 'Existing database kept (the demo is seeded only into a new one). Demo sign-ins, if it was seeded:');
    lines.push(`  ${demoSignIns.map((signIn) => signIn.email).join(', ')}`);
    lines.push('  with the password printed when it was seeded (default "bellwether-demo", or DEMO_PASSWORD).');
  }
  console.log(lines.join('\n') + '\n');

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: shutting down…`);
    // In-flight requests get up to 10 s to finish; then connections are cut and the exit code says so.
    const force = setTimeout(() => {
      console.error('Shutdown took longer than 10 s; exiting anyway.');
      server.closeAllConnections();
      process.exit(1);
    }, 10_000);
    force.unref();
    // A keep-alive connection turns idle once its request is answered: close it then, so close() can finish.
    const idleSweep = setInterval(() => server.closeIdleConnections(), 100);
    idleSweep.unref();
    server.close(async () => {
      clearInterval(idleSweep);
      reviewReminders.stop();
      app.dispose();
      mailer.close();
      await capture?.close();
      db.$client.close();
      console.log('Stopped.');
      process.exit(0);
    });
    server.closeIdleConnections();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
