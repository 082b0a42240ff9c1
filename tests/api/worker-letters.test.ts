import { createHash } from 'node:crypto';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GroupWorkerLetters, WorkerLetterView } from '@schema/worker-letters';
import { agentId, auditOf, groupId, siteId, workerId } from '../helpers/org-data';
import type { Mailer, MailMessage } from '../../backend/src/email/mailer';
import { sendWorkerLetter } from '../../backend/src/services/worker-letters';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

/*
 * Worker letters (docs/decisions/024-worker-letters.md) over HTTP: which results need a letter
 * (the 85 dB(A) boundary of OSHA 29 CFR 1910.95(c)(1), "equal to or exceeding"), drafting, the PDF
 * read back with pdf-parse, sending through the local e-mail capture, hand-over, cancel, roles and
 * other organizations.
 */

async function pdfText(bytes: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    // Lines wrap wherever the page ends: compare with single spaces.
    return (await parser.getText()).text.replace(/\s+/g, ' ');
  } finally {
    await parser.destroy();
  }
}

describe('worker letters', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let base: string;
  let noiseGroup: number;
  let named: number;
  let noAddress: number;
  const results: Record<string, number> = {};
  let letters: WorkerLetterView[] = [];
  const address = 'robin.example@crew.ridgeback.example';

  const lettersOf = async (group: number) => {
    const answer = await hygienist.get(`${base}/exposure-groups/${group}/worker-letters`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    return answer.body as GroupWorkerLetters;
  };
  const letterFor = (code: string) => letters.find((letter) => letter.worker.code === code)!;
  // Collect the PDF's bytes as a Buffer whatever the content type.
  const getPdf = (client: SignedIn, id: number) =>
    client
      .get(`${base}/worker-letters/${id}.pdf`)
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(Buffer.from(chunk)));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}`;
    // A noise group in dB(A) with no action level of its own: the 85 dB(A) trigger applies.
    const group = await hygienist.post(`${base}/exposure-groups`, {
      siteId: siteId(context.db, ridgeback, 'Ridgeback sawmill'),
      name: 'Letter test – noise',
      agentId: agentId(context.db, ridgeback, 'Noise'),
      oelValue: 90,
      oelUnit: 'dBA',
      oelSource: 'Test limit (OSHA PEL set)',
      oelAveragingTime: '8h-twa',
      noiseCriteriaSet: 'oshaHc',
      shiftHours: 8,
    });
    expect(group.status, JSON.stringify(group.body)).toBe(201);
    noiseGroup = group.body.id;
    const first = await hygienist.post(`${base}/workers`, { code: 'LT-001', name: 'Robin Example', jobTitle: 'Trimmer operator', email: address });
    const second = await hygienist.post(`${base}/workers`, { code: 'LT-002', name: 'Jo Sample', jobTitle: 'Trimmer operator' });
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    named = first.body.id;
    noAddress = second.body.id;
    for (const workerId of [named, noAddress]) {
      const member = await hygienist.post(`${base}/group-memberships`, { workerId, exposureGroupId: noiseGroup, fromDate: '2025-01-01' });
      expect(member.status, JSON.stringify(member.body)).toBe(201);
    }
    const enter = async (key: string, workerId: number, date: string, value: number) => {
      const answer = await hygienist.post(`${base}/shift-results`, { exposureGroupId: noiseGroup, workerId, date, value });
      expect(answer.status, JSON.stringify(answer.body)).toBe(201);
      results[key] = answer.body.id;
    };
    await enter('at85', named, '2025-02-03', 85.0);
    await enter('below', named, '2025-02-04', 84.9);
    await enter('above', named, '2025-02-05', 91.2);
    await enter('other', noAddress, '2025-02-03', 86.0);
    // Seeding the demo takes seconds on a busy machine.
  }, 60_000);
  afterAll(() => context.close());

  it('lists the results at or above 85 dB(A) — 85.0 included, 84.9 not (1910.95(c)(1) "equal to or exceeding") — with the action level’s basis', async () => {
    const view = await lettersOf(noiseGroup);
    expect(view.actionLevel).toMatchObject({ value: 85, unit: 'dBA', origin: 'hearing-conservation-default' });
    expect(view.actionLevel!.basis).toContain('1910.95(c)(1)');
    expect(view.pending.map((row) => row.shiftResultId)).toEqual([results.at85, results.other, results.above]);
    expect(view.pending.find((row) => row.shiftResultId === results.above)!.atOrAboveLimit).toBe(true);
    expect(view.letters).toEqual([]);
    expect(view.defaultDuty).toContain('29 CFR 1910.95(e)');
  });

  it('drafts one letter per worker listing all their pending results, audited without names; nothing is left pending', async () => {
    const answer = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/worker-letters`, {});
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    letters = answer.body.letters;
    expect(letters.map((letter) => [letter.worker.code, letter.status, letter.results.map((result) => result.shiftResultId)])).toEqual([
      ['LT-001', 'drafted', [results.at85, results.above]],
      ['LT-002', 'drafted', [results.other]],
    ]);
    expect(letterFor('LT-001')).toMatchObject({ draftedAt: '2025-03-03T08:00:00.000Z', draftedBy: { name: 'Dana Whitlock' }, sentAt: null, delivery: null });
    expect((await lettersOf(noiseGroup)).pending).toEqual([]);
    const [event] = auditOf(context.db, 'worker_letter', letterFor('LT-001').id);
    expect(event).toMatchObject({ action: 'drafted', after: { workerId: named, shiftResultIds: [results.at85, results.above] } });
    expect(JSON.stringify(event)).not.toContain('Robin');
    expect(JSON.stringify(event)).not.toContain(address);
  });

  it('refuses to draft again when no result is waiting (409), and names listed ids that are not pending (400)', async () => {
    const again = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/worker-letters`, {});
    expect(again.status).toBe(409);
    expect(again.body.error.message).toContain('waiting for a letter');
    const listed = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/worker-letters`, { resultIds: [results.below] });
    expect(listed.status).toBe(400);
    expect(listed.body.error.fields.resultIds).toContain(String(results.below));
  });

  it('previews the draft as a PDF whose text has the worker’s name, results, dates, the duty cited and the cautions', async () => {
    const answer = await getPdf(hygienist, letterFor('LT-001').id);
    expect(answer.status).toBe(200);
    expect(answer.headers['content-type']).toBe('application/pdf');
    const text = await pdfText(answer.body as Buffer);
    for (const expected of [
      'Robin Example',
      'LT-001',
      '2025-02-03',
      '85.0 dB(A)',
      '2025-02-05',
      '91.2 dB(A)',
      'The action level for this work is 85.0 dB(A)',
      'OSHA 29 CFR 1910.95(e)',
      'follow the local regulation',
      'hearing check (an audiometric test)',
      'Statistics support and never replace the judgement of a qualified hygienist.',
      'Dana Whitlock (hygienist@ridgeback.example)',
    ]) {
      expect(text, expected).toContain(expected);
    }
    expect(text).not.toContain('84.9');
  });

  it('sends the letter: the capture holds the e-mail to the worker’s address with the text and the PDF attached, and the kept PDF is the one sent', async () => {
    const id = letterFor('LT-001').id;
    const answer = await hygienist.post(`${base}/worker-letters/${id}/send`);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.body).toMatchObject({
      status: 'sent',
      delivery: 'email',
      recipientAddress: address,
      sentAt: '2025-03-03T08:00:00.000Z',
      sentBy: { name: 'Dana Whitlock' },
    });
    const mail = await context.mailbox.waitFor((message) => message.to === address);
    expect(mail.subject).toBe('Your noise exposure results from Ridgeback Timber Co.');
    expect(mail.text).toContain('Dear Robin Example,');
    expect(mail.text).toContain('2025-02-05: 91.2 dB(A)');
    expect(mail.text).toContain('29 CFR 1910.95(e)');
    expect(mail.html).toContain('91.2 dB(A)');
    expect(mail.attachments).toHaveLength(1);
    const [attachment] = mail.attachments;
    expect(attachment).toMatchObject({ filename: 'exposure-letter-LT-001-2025-03-03.pdf', contentType: 'application/pdf' });
    const sentHash = createHash('sha256').update(attachment.content).digest('hex');
    expect(answer.body.pdfSha256).toBe(sentHash);
    expect(await pdfText(attachment.content)).toContain('Robin Example');
    const kept = await getPdf(hygienist, id);
    expect(
      createHash('sha256')
        .update(kept.body as Buffer)
        .digest('hex'),
    ).toBe(sentHash);
    const events = auditOf(context.db, 'worker_letter', id);
    expect(events.map((event) => event.action)).toEqual(['drafted', 'sent']);
    expect(events[1].after).toEqual({ status: 'sent', delivery: 'email', pdfSha256: sentHash });

    const twice = await hygienist.post(`${base}/worker-letters/${id}/send`);
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toContain('already sent on 2025-03-03');
  });

  it('refuses to e-mail a worker with no address (422), offering print and hand-over; hand-over then records the date', async () => {
    const id = letterFor('LT-002').id;
    const before = context.mailbox.list().length;
    const refused = await hygienist.post(`${base}/worker-letters/${id}/send`);
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe(
      "Worker LT-002 has no e-mail address. Print the letter (PDF), hand it over and mark it handed over, or add an address on the worker's page and send again.",
    );
    expect(context.mailbox.list()).toHaveLength(before);

    const early = await hygienist.post(`${base}/worker-letters/${id}/hand-over`, { handedOverOn: '2025-03-02' });
    expect(early.status).toBe(400);
    expect(early.body.error.fields.handedOverOn).toContain('drafted on 2025-03-03');
    const future = await hygienist.post(`${base}/worker-letters/${id}/hand-over`, { handedOverOn: '2025-03-20' });
    expect(future.status).toBe(400);
    expect(future.body.error.fields.handedOverOn).toBe('The date is in the future');

    const handed = await hygienist.post(`${base}/worker-letters/${id}/hand-over`, { handedOverOn: '2025-03-03' });
    expect(handed.status, JSON.stringify(handed.body)).toBe(200);
    expect(handed.body).toMatchObject({ status: 'sent', delivery: 'hand', handedOverOn: '2025-03-03', recipientAddress: null });
    expect(handed.body.pdfSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(auditOf(context.db, 'worker_letter', id).at(-1)).toMatchObject({ action: 'handed-over', after: { delivery: 'hand', handedOverOn: '2025-03-03' } });
  });

  it('cancels a drafted letter with a reason (its results wait again) and refuses to cancel a sent one', async () => {
    const group = groupId(context.db, ridgeback, 'Maintenance fitter – noise');
    const pendingBefore = (await lettersOf(group)).pending.map((row) => row.shiftResultId);
    expect(pendingBefore.length).toBeGreaterThan(0);
    const drafted = await hygienist.post(`${base}/exposure-groups/${group}/worker-letters`, { resultIds: [pendingBefore[0]] });
    expect(drafted.status, JSON.stringify(drafted.body)).toBe(201);
    const id = drafted.body.letters[0].id as number;
    expect((await lettersOf(group)).pending.map((row) => row.shiftResultId)).toEqual(pendingBefore.slice(1));

    const noReason = await hygienist.post(`${base}/worker-letters/${id}/cancel`, {});
    expect(noReason.status).toBe(400);
    const cancelled = await hygienist.post(`${base}/worker-letters/${id}/cancel`, { reason: 'Drafted for the wrong shift' });
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200);
    expect(cancelled.body).toMatchObject({ status: 'cancelled', cancelReason: 'Drafted for the wrong shift', cancelledBy: { name: 'Dana Whitlock' } });
    expect((await lettersOf(group)).pending.map((row) => row.shiftResultId)).toEqual(pendingBefore);
    expect(auditOf(context.db, 'worker_letter', id).at(-1)).toMatchObject({ action: 'cancelled', reason: 'Drafted for the wrong shift' });

    const sent = await hygienist.post(`${base}/worker-letters/${letterFor('LT-001').id}/cancel`, { reason: 'Too late' });
    expect(sent.status).toBe(409);
    const sendCancelled = await hygienist.post(`${base}/worker-letters/${id}/send`);
    expect(sendCancelled.status).toBe(409);
    expect(sendCancelled.body.error.message).toContain('was cancelled');
  });

  it('refuses to cancel or hand over a letter while its e-mail is on its way (409), and records it sent once the mail server accepts', async () => {
    const result = await hygienist.post(`${base}/shift-results`, { exposureGroupId: noiseGroup, workerId: named, date: '2025-02-20', value: 88.4 });
    expect(result.status, JSON.stringify(result.body)).toBe(201);
    const drafted = await hygienist.post(`${base}/exposure-groups/${noiseGroup}/worker-letters`, { resultIds: [result.body.id] });
    expect(drafted.status, JSON.stringify(drafted.body)).toBe(201);
    const id = drafted.body.letters[0].id as number;
    // A mail server that holds the message until the test lets it go.
    let release: () => void = () => undefined;
    let accepted: (message: MailMessage) => void = () => undefined;
    const reached = new Promise<MailMessage>((resolve) => (accepted = resolve));
    const slowMailer: Mailer = {
      send: (message) =>
        new Promise<void>((resolve) => {
          release = resolve;
          accepted(message);
        }),
      close: () => undefined,
    };
    const sending = sendWorkerLetter(context.db, context.clock, slowMailer, { organizationId: ridgeback, letterId: id, actor: hygienist.user });
    expect((await reached).to).toBe(address);

    const cancel = await hygienist.post(`${base}/worker-letters/${id}/cancel`, { reason: 'Changed my mind mid-send' });
    expect(cancel.status).toBe(409);
    expect(cancel.body.error.message).toBe(`Worker letter ${id} is being e-mailed right now: it cannot be cancelled. Reload in a moment.`);
    const handOver = await hygienist.post(`${base}/worker-letters/${id}/hand-over`, { handedOverOn: '2025-03-03' });
    expect(handOver.status).toBe(409);
    expect(handOver.body.error.message).toContain('is being e-mailed right now');
    const again = await hygienist.post(`${base}/worker-letters/${id}/send`);
    expect(again.status).toBe(409);

    release();
    await expect(sending).resolves.toMatchObject({ id, status: 'sent', delivery: 'email' });
    expect(auditOf(context.db, 'worker_letter', id).map((event) => event.action)).toEqual(['drafted', 'sent']);
  });

  it('refuses to send a letter whose result was voided after drafting (409)', async () => {
    const group = groupId(context.db, ridgeback, 'Forklift driver – noise');
    const drafted = await hygienist.post(`${base}/exposure-groups/${group}/worker-letters`, {});
    expect(drafted.status, JSON.stringify(drafted.body)).toBe(201);
    const letter = drafted.body.letters[0] as WorkerLetterView;
    const voided = await hygienist.post(`${base}/shift-results/${letter.results[0].shiftResultId}/void`, { reason: 'Meter fault found at calibration' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    const answer = await hygienist.post(`${base}/worker-letters/${letter.id}/send`);
    expect(answer.status).toBe(409);
    expect(answer.body.error.message).toContain('was voided after the letter was drafted');
  });

  it('never counts a non-detect, even with a detection limit above the action level', async () => {
    const group = groupId(context.db, ridgeback, 'Planer feeder – wood dust');
    const nonDetect = await hygienist.post(`${base}/shift-results`, {
      exposureGroupId: group,
      workerId: workerId(context.db, ridgeback, 'RT-011'),
      date: '2024-12-29',
      nonDetect: true,
      detectionLimit: 3,
    });
    expect(nonDetect.status, JSON.stringify(nonDetect.body)).toBe(201);
    const view = await lettersOf(group);
    expect(view.actionLevel).toMatchObject({ value: 2.5, origin: 'group' });
    expect(view.pending.map((row) => row.shiftResultId)).not.toContain(nonDetect.body.id);
    expect(view.pending.length).toBeGreaterThan(0);
    for (const row of view.pending) expect(row.value).toBeGreaterThanOrEqual(2.5);
  });

  it('lets analysts and managers read letters and PDFs but not change them; consultants (no worker names) get 403', async () => {
    const id = letterFor('LT-001').id;
    for (const role of ['analyst', 'manager'] as const) {
      const client = await context.signInAs(role);
      expect((await client.get(`${base}/exposure-groups/${noiseGroup}/worker-letters`)).status).toBe(200);
      expect((await getPdf(client, id)).status).toBe(200);
      expect((await client.post(`${base}/exposure-groups/${noiseGroup}/worker-letters`, {})).status).toBe(403);
      expect((await client.post(`${base}/worker-letters/${letterFor('LT-002').id}/cancel`, { reason: 'Not mine to send' })).status).toBe(403);
    }
    const consultant = await context.signInAs('consultant');
    expect((await consultant.get(`${base}/exposure-groups/${noiseGroup}/worker-letters`)).status).toBe(403);
    expect((await getPdf(consultant, id)).status).toBe(403);
    expect((await consultant.get(`${base}/worker-letters/${id}`)).status).toBe(403);
  });

  it('answers 404 for another organization’s letters and groups, under one’s own organization', async () => {
    const outsider = await context.signInAs('admin', 'slateHarbor');
    const own = `/api/orgs/${context.organizationId('slateHarbor')}`;
    const id = letterFor('LT-001').id;
    expect((await outsider.get(`${own}/worker-letters/${id}`)).status).toBe(404);
    // Not a member of Ridgeback at all: 404 there too, so the organization is never confirmed.
    expect((await getPdf(outsider, id)).status).toBe(404);
    expect((await outsider.get(`${own}/worker-letters/${id}.pdf`)).status).toBe(404);
    expect((await outsider.post(`${own}/worker-letters/${id}/cancel`, { reason: 'Not ours at all' })).status).toBe(404);
    expect((await outsider.get(`${own}/exposure-groups/${noiseGroup}/worker-letters`)).status).toBe(404);
  });

  it('shows the worker’s e-mail address only to roles that may see names, and rejects a malformed one naming the field', async () => {
    expect((await hygienist.get(`${base}/workers/${named}`)).body.email).toBe(address);
    const consultant = await context.signInAs('consultant');
    const hidden = await consultant.get(`${base}/workers/${named}`);
    expect(hidden.body.nameHidden).toBe(true);
    expect(hidden.body).not.toHaveProperty('email');
    const bad = await hygienist.patch(`${base}/workers/${noAddress}`, { email: 'jo at example' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.email).toBe('Enter an e-mail address such as name@example.com');
    const audit = auditOf(context.db, 'worker', named);
    expect(audit[0].after).toMatchObject({ emailRecorded: true });
    expect(JSON.stringify(audit)).not.toContain(address);
  });
});
