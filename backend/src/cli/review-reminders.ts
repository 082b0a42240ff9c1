// `npm run jobs:review-reminders`: runs the daily review-reminder job once against DATABASE_PATH and
// sends through SMTP_URL, for a scheduler outside the server (cron). Prints what it did as JSON.
// The server also runs the job at start and every 24 hours; both together never send twice.
import { systemClock } from '../clock';
import { loadSettings } from '../config';
import { openMigratedDatabase } from '../db/client';
import { createSmtpMailer } from '../email/mailer';
import { runReviewReminders } from '../jobs/review-reminders';
import { createLogger } from '../logger';

async function main(): Promise<number> {
  const settings = loadSettings();
  if (!settings.smtpUrl) {
    console.error(
      'SMTP_URL is not set: the review reminders need a mail server (the local capture runs only inside the server, which sends them itself every day).',
    );
    return 2;
  }
  const logger = createLogger(settings.config.logLevel);
  const db = openMigratedDatabase(settings.config.databasePath);
  const mailer = createSmtpMailer(settings.smtpUrl, settings.config.mailFrom);
  try {
    const counts = await runReviewReminders({ db, mailer, clock: systemClock, logger, config: settings.config });
    console.log(JSON.stringify(counts));
    return counts.failed > 0 ? 1 : 0;
  } finally {
    mailer.close();
    db.$client.close();
  }
}

main().then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exitCode = 1;
  },
);
