import type { Clock } from './clock';
import type { AppConfig } from './config';
import type { Db } from './db/client';
import type { Outbox } from './email/capture-server';
import type { Mailer } from './email/mailer';
import type { Logger } from './logger';
import type { AssessmentEngine } from './services/assessment';

/** What `createApp` needs from outside; server.ts builds the real ones, tests build their own. */
export interface AppDeps {
  db: Db;
  mailer: Mailer;
  config: AppConfig;
  clock: Clock;
  logger: Logger;
  /** The local e-mail capture's mailbox, while it runs; the Outbox endpoints exist only then. */
  outbox?: Outbox;
  /** Statistics worker threads and the cache of group assessments (services/assessment.ts). */
  assessment: AssessmentEngine;
}
