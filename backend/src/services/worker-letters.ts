import { createHash } from 'node:crypto';
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { agents } from '@schema/agents';
import type { ExposureGroup } from '@schema/exposure-groups';
import { shiftResults } from '@schema/shift-results';
import { users } from '@schema/users';
import {
  workerLetterResults,
  workerLetters,
  type GroupWorkerLetters,
  type PendingLetterResult,
  type WorkerLetterDraft,
  type WorkerLetterView,
} from '@schema/worker-letters';
import { workers, type Worker } from '@schema/workers';
import { resolveActionLevel, resultsAtOrAboveActionLevel, type ResolvedActionLevel } from '@stats/action-level';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import type { Mailer } from '../email/mailer';
import { workerLetterEmail, workerLetterFileName } from '../email/worker-letter-email';
import { Conflict, HttpError, NotFound, Unprocessable } from '../errors';
import { workerLetterPdf } from '../pdf/worker-letter';
import { audit, fieldError, type Tx } from './changes';
import { latestPossibleDate, today } from './dates';
import { findExposureGroup } from './exposure-groups';
import { qualified } from './list';
import { cautions as generalCautions } from './sampling-plans';
import { buildWorkerLetter, defaultDutyFor } from './worker-letter-content';

/*
 * Worker letters (docs/decisions/024-worker-letters.md): find the valid results at or above the
 * group's action level that no live letter covers, draft one letter per worker listing them, then
 * e-mail it (PDF attached) or record that the printed letter was handed over, or cancel it.
 * Every route here needs `workerNames:read` (a letter names the worker) and changes need
 * `data:edit`. Names and addresses never go to the audit trail, which consultants may read.
 */

/** Who acts: the signed-in user (the drafting hygienist is the letter's contact person). */
export interface LetterActor {
  id: number;
  name: string;
  email: string;
}

const entityType = 'worker_letter';

function groupAgent(db: Tx, group: ExposureGroup) {
  const agent = db.select().from(agents).where(eq(agents.id, group.agentId)).get();
  if (!agent) throw new NotFound(`The agent of exposure group ${group.id} is missing`);
  return agent;
}

function actionLevelOf(group: ExposureGroup, agentKind: 'noise' | 'chemical' | 'mixture'): ResolvedActionLevel | null {
  return resolveActionLevel({
    agentKind,
    oelValue: group.oelValue,
    oelUnit: group.oelUnit,
    oelAveragingTime: group.oelAveragingTime,
    actionLevel: group.actionLevel,
    noiseCriteriaSet: group.noiseCriteriaSet,
  });
}

function missingActionLevelReason(group: ExposureGroup, agentKind: string): string {
  return agentKind === 'noise'
    ? `"${group.name}" has its limit in % dose under ISO 9612, which has no dose scale for the 85 dB(A) trigger: set the group's action level (in % dose) from the rule that applies`
    : `"${group.name}" has a ${group.oelAveragingTime === 'ceiling' ? 'ceiling' : 'short-term'} limit, for which half the limit is no action level: set the group's action level from the rule that applies`;
}

/** Valid results of the group at or above the action level that no drafted or sent letter covers, by date then worker code. */
function pendingResults(db: Tx, group: ExposureGroup, level: ResolvedActionLevel) {
  const rows = db
    .select({ result: shiftResults, worker: workers })
    .from(shiftResults)
    .innerJoin(workers, eq(workers.id, shiftResults.workerId))
    .where(
      and(
        eq(shiftResults.exposureGroupId, group.id),
        eq(shiftResults.status, 'valid'),
        sql`not exists (select 1 from ${workerLetterResults} where ${qualified(workerLetterResults.shiftResultId)} = ${qualified(shiftResults.id)} and ${qualified(workerLetterResults.active)} = 1)`,
      ),
    )
    .orderBy(asc(shiftResults.date), asc(workers.code), asc(shiftResults.id))
    .all();
  return resultsAtOrAboveActionLevel(
    rows.map((row) => ({ ...row, value: row.result.value, unit: row.result.unit, nonDetect: row.result.nonDetect, status: row.result.status })),
    level,
  );
}

const workerSummary = (worker: Worker) => ({ id: worker.id, code: worker.code, name: worker.name, email: worker.email });

function userNames(db: Tx, ids: Array<number | null>): Map<number, string> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  return new Map(
    db
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(inArray(users.id, wanted))
      .all()
      .map((row) => [row.id, row.name]),
  );
}

type LetterRow = typeof workerLetters.$inferSelect;

function letterViews(db: Tx, rows: Array<{ letter: LetterRow; worker: Worker }>): WorkerLetterView[] {
  const names = userNames(
    db,
    rows.flatMap(({ letter }) => [letter.draftedByUserId, letter.sentByUserId, letter.cancelledByUserId]),
  );
  const person = (id: number | null) => (id === null ? null : { id, name: names.get(id) ?? '' });
  return rows.map(({ letter, worker }) => ({
    id: letter.id,
    exposureGroupId: letter.exposureGroupId,
    worker: workerSummary(worker),
    status: letter.status,
    dutyCited: letter.dutyCited,
    subject: letter.content.subject,
    results: letter.content.results,
    draftedAt: letter.draftedAt,
    draftedBy: person(letter.draftedByUserId)!,
    delivery: letter.delivery,
    recipientAddress: letter.recipientAddress,
    sentAt: letter.sentAt,
    sentBy: person(letter.sentByUserId),
    handedOverOn: letter.handedOverOn,
    pdfSha256: letter.pdfSha256,
    cancelledAt: letter.cancelledAt,
    cancelledBy: person(letter.cancelledByUserId),
    cancelReason: letter.cancelReason,
  }));
}

function selectLetters(db: Tx) {
  return db.select({ letter: workerLetters, worker: workers }).from(workerLetters).innerJoin(workers, eq(workers.id, workerLetters.workerId));
}

/** The group's letters (newest first), its pending results and the action level used. */
export function groupWorkerLetters(db: Db, organizationId: number, groupId: number): GroupWorkerLetters {
  const group = findExposureGroup(db, organizationId, groupId);
  const agent = groupAgent(db, group);
  const level = actionLevelOf(group, agent.kind);
  const pending: PendingLetterResult[] =
    level === null
      ? []
      : pendingResults(db, group, level).map(({ result, worker }) => ({
          shiftResultId: result.id,
          worker: workerSummary(worker),
          date: result.date,
          value: result.value,
          unit: result.unit,
          atOrAboveLimit: result.unit === group.oelUnit && result.value >= group.oelValue,
        }));
  const letters = letterViews(
    db,
    selectLetters(db).where(eq(workerLetters.exposureGroupId, group.id)).orderBy(desc(workerLetters.draftedAt), desc(workerLetters.id)).all(),
  );
  return {
    group: { id: group.id, name: group.name, agentKind: agent.kind, oelValue: group.oelValue, oelUnit: group.oelUnit },
    actionLevel: level === null ? null : { value: level.value, unit: group.oelUnit, origin: level.origin, basis: level.basis },
    actionLevelMissing: level === null ? missingActionLevelReason(group, agent.kind) : null,
    pending,
    letters,
    defaultDuty: defaultDutyFor(agent.kind),
    cautions: [...generalCautions],
  };
}

/**
 * Drafts one letter per worker with pending results (all of them, or only `resultIds`), each
 * listing that worker's results; one transaction. 409 when the group has no action level or
 * nothing is pending; 400 naming any listed id that is not pending.
 */
export function draftWorkerLetters(
  db: Db,
  clock: Clock,
  input: { organizationId: number; organizationName: string; groupId: number; actor: LetterActor; draft: WorkerLetterDraft },
): WorkerLetterView[] {
  const now = clock.now();
  const stamp = now.toISOString();
  const ids = db.transaction((tx) => {
    const group = findExposureGroup(tx, input.organizationId, input.groupId);
    const agent = groupAgent(tx, group);
    if (group.archived) throw new Conflict(`Exposure group "${group.name}" is archived: bring it back before drafting letters`);
    const level = actionLevelOf(group, agent.kind);
    if (level === null) throw new Conflict(missingActionLevelReason(group, agent.kind));
    let pending = pendingResults(tx, group, level);
    if (input.draft.resultIds) {
      const wanted = new Set(input.draft.resultIds);
      const unknown = [...wanted].filter((id) => !pending.some((row) => row.result.id === id));
      if (unknown.length > 0)
        throw fieldError(
          'resultIds',
          `Result${unknown.length === 1 ? '' : 's'} ${unknown.join(', ')} ${unknown.length === 1 ? 'is' : 'are'} not a valid result of this group at or above the action level without a letter`,
        );
      pending = pending.filter((row) => wanted.has(row.result.id));
    }
    if (pending.length === 0)
      throw new Conflict(`No result of "${group.name}" at or above the action level (${level.value} ${group.oelUnit}) is waiting for a letter`);
    const dutyCited = input.draft.dutyCited ?? defaultDutyFor(agent.kind);
    const byWorker = new Map<number, typeof pending>();
    for (const row of pending) byWorker.set(row.worker.id, [...(byWorker.get(row.worker.id) ?? []), row]);
    const created: number[] = [];
    for (const rows of byWorker.values()) {
      const worker = rows[0].worker;
      const content = buildWorkerLetter({
        organizationName: input.organizationName,
        letterDate: today(clock),
        worker: { code: worker.code, name: worker.name, jobTitle: worker.jobTitle },
        group: {
          id: group.id,
          name: group.name,
          agentName: agent.name,
          agentKind: agent.kind,
          oelValue: group.oelValue,
          oelUnit: group.oelUnit,
          oelSource: group.oelSource,
        },
        actionLevel: level,
        results: rows.map(({ result }) => ({ id: result.id, date: result.date, value: result.value, unit: result.unit })),
        dutyCited,
        contact: { name: input.actor.name, email: input.actor.email },
      });
      const letter = tx
        .insert(workerLetters)
        .values({
          organizationId: input.organizationId,
          exposureGroupId: group.id,
          workerId: worker.id,
          status: 'drafted',
          dutyCited,
          content,
          draftedAt: stamp,
          draftedByUserId: input.actor.id,
          createdAt: stamp,
          updatedAt: stamp,
        })
        .returning({ id: workerLetters.id })
        .get();
      tx.insert(workerLetterResults)
        .values(rows.map(({ result }) => ({ organizationId: input.organizationId, letterId: letter.id, shiftResultId: result.id, active: true })))
        .run();
      audit(tx, {
        organizationId: input.organizationId,
        actor: input.actor,
        entityType,
        entityId: letter.id,
        action: 'drafted',
        after: { exposureGroupId: group.id, workerId: worker.id, shiftResultIds: rows.map(({ result }) => result.id), actionLevel: level.value, dutyCited },
        at: now,
      });
      created.push(letter.id);
    }
    return created;
  });
  return letterViews(db, selectLetters(db).where(inArray(workerLetters.id, ids)).orderBy(asc(workerLetters.id)).all());
}

function letterOrNotFound(db: Tx, organizationId: number, letterId: number) {
  const row = selectLetters(db)
    .where(and(eq(workerLetters.id, letterId), eq(workerLetters.organizationId, organizationId)))
    .get();
  if (!row) throw new NotFound(`No worker letter ${letterId} in this organization`);
  return row;
}

export function getWorkerLetter(db: Db, organizationId: number, letterId: number): WorkerLetterView {
  return letterViews(db, [letterOrNotFound(db, organizationId, letterId)])[0];
}

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** The letter's PDF: as sent or handed over when it was (the kept bytes), else rendered from its stored words. */
export async function workerLetterPdfFile(db: Db, organizationId: number, letterId: number): Promise<{ fileName: string; bytes: Buffer; sha256: string }> {
  const { letter } = letterOrNotFound(db, organizationId, letterId);
  const bytes = letter.sentPdf ?? (await workerLetterPdf(letter.content, new Date(letter.draftedAt)));
  return { fileName: workerLetterFileName(letter.content), bytes, sha256: sha256(bytes) };
}

function requireDrafted(letter: LetterRow, action: string): void {
  if (letter.status === 'sent')
    throw new Conflict(
      `Worker letter ${letter.id} was already ${letter.delivery === 'hand' ? `handed over on ${letter.handedOverOn}` : `sent on ${letter.sentAt?.slice(0, 10)}`}: it cannot be ${action}`,
    );
  if (letter.status === 'cancelled') throw new Conflict(`Worker letter ${letter.id} was cancelled: it cannot be ${action}; draft a new one`);
}

/** 409 when a result the letter reports was voided after drafting (the letter would state a wrong result). */
function requireResultsStillValid(db: Tx, letter: LetterRow): void {
  const ids = letter.content.results.map((result) => result.shiftResultId);
  const voided = db
    .select({ id: shiftResults.id, date: shiftResults.date })
    .from(shiftResults)
    .where(and(inArray(shiftResults.id, ids), eq(shiftResults.status, 'void')))
    .all();
  if (voided.length > 0)
    throw new Conflict(
      `The result of ${voided.map((row) => row.date).join(', ')} in worker letter ${letter.id} was voided after the letter was drafted: cancel this letter and draft a new one`,
      { resultIds: voided.map((row) => row.id) },
    );
}

/**
 * Marks a drafted letter sent (e-mailed to an address, or handed over on a day), keeping the PDF
 * delivered and its SHA-256, with its audit event; 409 if the letter stopped being a draft meanwhile.
 */
function recordDelivery(
  db: Db,
  clock: Clock,
  input: {
    organizationId: number;
    letterId: number;
    actor: LetterActor;
    pdf: Buffer;
    delivery: { delivery: 'email'; recipientAddress: string } | { delivery: 'hand'; handedOverOn: string };
  },
): void {
  const now = clock.now();
  const pdfSha256 = sha256(input.pdf);
  db.transaction((tx) => {
    const current = tx.select({ status: workerLetters.status }).from(workerLetters).where(eq(workerLetters.id, input.letterId)).get();
    if (current?.status !== 'drafted') throw new Conflict(`Worker letter ${input.letterId} changed while it was being recorded: reload and try again`);
    tx.update(workerLetters)
      .set({
        status: 'sent',
        ...input.delivery,
        sentAt: now.toISOString(),
        sentByUserId: input.actor.id,
        sentPdf: input.pdf,
        pdfSha256,
        updatedAt: now.toISOString(),
      })
      .where(eq(workerLetters.id, input.letterId))
      .run();
    // The address stays out of the audit trail (consultants read it); the day handed over goes in.
    const { recipientAddress: _address, ...delivered } = { recipientAddress: undefined, ...input.delivery };
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: input.letterId,
      action: input.delivery.delivery === 'email' ? 'sent' : 'handed-over',
      before: { status: 'drafted' },
      after: { status: 'sent', ...delivered, pdfSha256 },
      at: now,
    });
  });
}

/**
 * Letters being e-mailed right now (this process runs every request): a double click never sends a
 * letter twice, and a letter cannot be cancelled or marked handed over while its e-mail is on its way
 * (the e-mail would go out with the record saying otherwise).
 */
const sending = new Set<number>();

function requireNotSending(letterId: number, action: string): void {
  if (sending.has(letterId)) throw new Conflict(`Worker letter ${letterId} is being e-mailed right now: it cannot be ${action}. Reload in a moment.`);
}

/**
 * E-mails a drafted letter (HTML and text, PDF attached) to the worker's address and records it as
 * sent with the PDF and its SHA-256. 422 when the worker has no address (print the PDF and mark it
 * handed over instead); 503 when the mail server refuses (the letter stays drafted).
 */
export async function sendWorkerLetter(
  db: Db,
  clock: Clock,
  mailer: Mailer,
  input: { organizationId: number; letterId: number; actor: LetterActor },
): Promise<WorkerLetterView> {
  const { letter, worker } = letterOrNotFound(db, input.organizationId, input.letterId);
  requireDrafted(letter, 'sent again');
  requireResultsStillValid(db, letter);
  if (!worker.email)
    throw new Unprocessable(
      `Worker ${worker.code} has no e-mail address. Print the letter (PDF), hand it over and mark it handed over, or add an address on the worker's page and send again.`,
      { pdf: `worker-letters/${letter.id}.pdf`, handOver: `worker-letters/${letter.id}/hand-over` },
    );
  requireNotSending(letter.id, 'sent again');
  sending.add(letter.id);
  try {
    const pdf = await workerLetterPdf(letter.content, new Date(letter.draftedAt));
    try {
      await mailer.send(workerLetterEmail({ to: worker.email, content: letter.content, pdf }));
    } catch (error) {
      throw new HttpError(
        503,
        'internal',
        `The e-mail to worker ${worker.code} could not be sent (${error instanceof Error ? error.message : String(error)}). The letter stays drafted: try again later, or print it and mark it handed over.`,
      );
    }
    recordDelivery(db, clock, {
      organizationId: input.organizationId,
      letterId: letter.id,
      actor: input.actor,
      pdf,
      delivery: { delivery: 'email', recipientAddress: worker.email },
    });
  } finally {
    sending.delete(letter.id);
  }
  return getWorkerLetter(db, input.organizationId, letter.id);
}

/** Records that the printed letter was handed to the worker on `handedOverOn`, keeping the PDF printed. */
export async function handOverWorkerLetter(
  db: Db,
  clock: Clock,
  input: { organizationId: number; letterId: number; actor: LetterActor; handedOverOn: string },
): Promise<WorkerLetterView> {
  const { letter } = letterOrNotFound(db, input.organizationId, input.letterId);
  requireDrafted(letter, 'handed over');
  requireNotSending(letter.id, 'marked handed over');
  requireResultsStillValid(db, letter);
  const draftedOn = letter.draftedAt.slice(0, 10);
  if (input.handedOverOn < draftedOn) throw fieldError('handedOverOn', `The letter was drafted on ${draftedOn}: it cannot have been handed over before that`);
  if (input.handedOverOn > latestPossibleDate(clock)) throw fieldError('handedOverOn', 'The date is in the future');
  const pdf = await workerLetterPdf(letter.content, new Date(letter.draftedAt));
  recordDelivery(db, clock, {
    organizationId: input.organizationId,
    letterId: letter.id,
    actor: input.actor,
    pdf,
    delivery: { delivery: 'hand', handedOverOn: input.handedOverOn },
  });
  return getWorkerLetter(db, input.organizationId, letter.id);
}

/** Cancels a drafted letter with a reason; its results wait for a letter again. A sent letter cannot be cancelled. */
export function cancelWorkerLetter(
  db: Db,
  clock: Clock,
  input: { organizationId: number; letterId: number; actor: LetterActor; reason: string },
): WorkerLetterView {
  const now = clock.now();
  db.transaction((tx) => {
    const { letter } = letterOrNotFound(tx, input.organizationId, input.letterId);
    requireDrafted(letter, 'cancelled');
    requireNotSending(letter.id, 'cancelled');
    tx.update(workerLetters)
      .set({ status: 'cancelled', cancelledAt: now.toISOString(), cancelledByUserId: input.actor.id, cancelReason: input.reason, updatedAt: now.toISOString() })
      .where(eq(workerLetters.id, letter.id))
      .run();
    tx.update(workerLetterResults).set({ active: false }).where(eq(workerLetterResults.letterId, letter.id)).run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType,
      entityId: letter.id,
      action: 'cancelled',
      reason: input.reason,
      before: { status: 'drafted' },
      after: { status: 'cancelled' },
      at: now,
    });
  });
  return getWorkerLetter(db, input.organizationId, input.letterId);
}
