import { sendReviewReminders, type DeliveryCounts, type NotifierDeps } from '../services/notifications';

/*
 * The daily review-reminder job (docs/decisions/021-notifications.md): e-mails about approved
 * decision records whose review date is 30 days away or less. The server runs it once at start and
 * then every 24 hours; `npm run jobs:review-reminders` runs it once for an outside scheduler (cron).
 * Running it twice sends nothing new: each message's dedupe key holds the record id and review date.
 */

export const reviewReminderIntervalMs = 24 * 60 * 60 * 1000;

/** Runs the job once and logs what it did; never throws (errors are logged and kept per message). */
export async function runReviewReminders(deps: NotifierDeps): Promise<DeliveryCounts & { records: number }> {
  const counts = await sendReviewReminders(deps);
  deps.logger.info?.({ job: 'review-reminders', ...counts }, 'review reminders checked');
  return counts;
}

export interface JobSchedule {
  /** Stops the timer (a run in progress finishes on its own). */
  stop(): void;
}

/**
 * Runs the job now and then every `intervalMs`. The timer is unref'd so it never keeps the process
 * alive; server.ts stops it at shutdown. A run never overlaps the previous one.
 */
export function scheduleReviewReminders(deps: NotifierDeps, intervalMs = reviewReminderIntervalMs): JobSchedule {
  let running: Promise<unknown> | undefined;
  let stopped = false;
  const tick = () => {
    if (stopped || running) return;
    running = runReviewReminders(deps).finally(() => {
      running = undefined;
    });
  };
  const timer = setInterval(tick, intervalMs);
  timer.unref();
  tick();
  return {
    stop() {
      stopped = true;
      clearInterval(timer);
    },
  };
}
