import { createHash } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exposureGroups } from '@schema/exposure-groups';
import { noiseLogs, noiseMasks } from '@schema/noise-logs';
import { shiftResults } from '@schema/shift-results';
import { generateNoiseDemoLog } from '@stats/noise-demo';
import type { NoiseResultDetails } from '../../backend/src/services/noise-logs';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, groupId, workerId } from '../helpers/org-data';

/*
 * Noise logs over HTTP: upload, masks, reviewed figures, acceptance into the group. Hand-worked
 * doses use the NIOSH 98-126 REL (85 dBA criterion, 3 dB exchange rate): 85 dBA is allowed 8 h and
 * 88 dBA 4 h (NIOSH 98-126, Table 1-1), so 4 h at 88 plus 4 h at 85 is 100 % + 50 % = 150 %.
 * Relative tolerance 1e-9: the sums of 480 exact fractions round at ~1e-14; 1e-9 leaves room and
 * would still catch any one interval counted wrongly (1/480 = 2e-3).
 */

const group = 'Forklift driver – noise';

/** 480 one-minute intervals: 4 h at 88 dBA then 4 h at 85 dBA (no acceleration: no wear check). */
function twoLevelLog(): string {
  const lines = ['# noise-log: 1', '# instrument: TEST-1', '# interval_s: 60', 't_s,laeq_db,lcpeak_db'];
  for (let i = 0; i < 480; i++) lines.push(`${i * 60},${i < 240 ? 88 : 85},${i === 10 ? 121.5 : 100}`);
  return `${lines.join('\n')}\n`;
}

describe('noise logs', () => {
  let context: TestContext;
  let ridgeback: number;
  let hygienist: SignedIn;
  let manager: SignedIn;
  let base: string;
  let forkliftGroup: number;
  let driver: number;

  const upload = (text: string | Buffer, fields: Record<string, string | number> = {}, fileName = 'shift.csv', client: SignedIn = hygienist) => {
    let call = client.agent.post(`${base}/noise-logs`).set('X-CSRF-Token', client.csrfToken);
    const all = { exposureGroupId: forkliftGroup, workerId: driver, shiftDate: '2025-03-04', instrument: 'RT-DOS-07', ...fields };
    for (const [key, value] of Object.entries(all)) call = call.field(key, String(value));
    return call.attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), { filename: fileName, contentType: 'text/csv' });
  };
  const logCount = () => context.db.select({ total: count() }).from(noiseLogs).get()!.total;
  const maskCount = () => context.db.select({ total: count() }).from(noiseMasks).get()!.total;
  const dataVersion = () => context.db.select().from(exposureGroups).where(eq(exposureGroups.id, forkliftGroup)).get()!.dataVersion;

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    base = `/api/orgs/${ridgeback}`;
    hygienist = await context.signInAs('hygienist');
    manager = await context.signInAs('manager');
    forkliftGroup = groupId(context.db, ridgeback, group);
    driver = workerId(context.db, ridgeback, 'RT-014');
  });
  afterAll(async () => {
    await context.close();
  });

  it('the demo seed holds synthesized Ridgeback logs: a bench log flagged, two accepted into their group', async () => {
    const list = await hygienist.get(`${base}/noise-logs`);
    expect(list.status).toBe(200);
    const demo = list.body.items.filter((item: { fileName: string }) => /^RT-\d{3}-2025-02-0\d\.csv$/.test(item.fileName));
    expect(demo).toHaveLength(8);
    const bench = demo.find((item: { workerCode: string }) => item.workerCode === 'RT-008');
    const detail = await hygienist.get(`${base}/noise-logs/${bench.id}`);
    expect(detail.body.stillStretchNotice).toBe(true);
    const accepted = demo.filter((item: { status: string }) => item.status === 'accepted');
    expect(accepted.map((item: { workerCode: string }) => item.workerCode).sort()).toEqual(['RT-009', 'RT-010']);
    for (const item of accepted) {
      const result = context.db.select().from(shiftResults).where(eq(shiftResults.id, item.shiftResultId)).get()!;
      expect(result.source).toBe('noise-log');
    }
    const drifting = await hygienist.get(`${base}/noise-logs/${accepted.find((item: { workerCode: string }) => item.workerCode === 'RT-009').id}`);
    // Demo calibrator drift 0.7 dB against the 0.5 dB default limit.
    expect(drifting.body.calibration.exceedsLimit).toBe(true);
  });

  it('stores a format-1 log unchanged with its SHA-256 and answers the hand-worked NIOSH dose', async () => {
    const text = twoLevelLog();
    const answer = await upload(text);
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    const row = context.db.select().from(noiseLogs).where(eq(noiseLogs.id, answer.body.id)).get()!;
    expect(Buffer.compare(row.rawFile, Buffer.from(text, 'utf8'))).toBe(0);
    expect(row.sha256).toBe(createHash('sha256').update(text).digest('hex'));
    expect(answer.body.figures.asLogged.nioshRel.dose).toBeCloseTo(150, 7);
    // 4 h at 88 dBA on the oshaHc set (90 dB criterion, 5 dB rate): T = 8/2^(-2/5) h = 10.556 h → 37.89 %; 85 dBA: T = 16 h → 25 %.
    expect(answer.body.figures.asLogged.oshaHc.dose).toBeCloseTo(100 * (4 / (8 * 2 ** (2 / 5)) + 4 / 16), 7);
    expect(answer.body.figures.maxLcPeakDb).toBe(121.5);
    expect(answer.body.wearCheckAvailable).toBe(false);
    expect(answer.body.stillStretches).toBeNull();
    expect(answer.body.actionLevel).toMatchObject({ dosePercent: 50, twaDb: 85, asLoggedReached: true });
    const file = await hygienist.get(`${base}/noise-logs/${answer.body.id}/file`);
    expect(file.status).toBe(200);
    expect(file.headers['x-content-sha256']).toBe(row.sha256);
  });

  it('refuses a malformed file with the row and column named, and stores nothing', async () => {
    const logs = logCount();
    const masks = maskCount();
    const text = '# noise-log: 1\n# interval_s: 60\nt_s,laeq_db\n0,85\n60,8x5\n120,85\n';
    const answer = await upload(text);
    expect(answer.status).toBe(400);
    expect(answer.body.error.message).toContain('row 5');
    expect(answer.body.error.message).toContain('column "laeq_db"');
    expect(answer.body.error.details.problems[0]).toMatchObject({ row: 5, column: 'laeq_db' });
    const backwards = await upload('# noise-log: 1\n# interval_s: 60\nt_s,laeq_db\n0,85\n60,85\n30,85\n');
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.message).toMatch(/row 6/);
    expect(logCount()).toBe(logs);
    expect(maskCount()).toBe(masks);
  });

  it('refuses a file over 50 MB with a 413 and stores nothing', async () => {
    const logs = logCount();
    const answer = await upload(Buffer.alloc(50 * 1024 * 1024 + 1, 0x30));
    expect(answer.status).toBe(413);
    expect(answer.body.error.message).toContain('limit of 50 MB');
    expect(logCount()).toBe(logs);
  });

  it('reads any CSV through a column mapping (ms and g converted) and saves the mapping as a preset', async () => {
    const lines = ['time_ms;LAeq;ax;ay;az;apk'];
    for (let i = 0; i < 120; i++) lines.push(`${i * 1000};${i < 60 ? 88 : 85};0;0;1;${i === 30 ? 4.2 : 1.1}`);
    const text = lines.join('\n');
    const preview = await hygienist.agent
      .post(`${base}/noise-logs/preview`)
      .set('X-CSRF-Token', hygienist.csrfToken)
      .attach('file', Buffer.from(text), { filename: 'other.csv', contentType: 'text/csv' });
    expect(preview.status).toBe(200);
    expect(preview.body.headers).toEqual(['time_ms', 'LAeq', 'ax', 'ay', 'az', 'apk']);
    expect(preview.body.rows[0]).toEqual(['0', '88', '0', '0', '1', '1.1']);
    const mapping = {
      time: 'time_ms',
      timeUnit: 'ms',
      level: 'LAeq',
      accelerationX: 'ax',
      accelerationY: 'ay',
      accelerationZ: 'az',
      accelerationPeak: 'apk',
      accelerationUnit: 'g',
      intervalSeconds: 1,
    };
    const answer = await upload(text, { mapping: JSON.stringify(mapping), presetName: 'Semicolon meter' }, 'other.csv');
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    expect(answer.body.figures.runSeconds).toBe(120);
    // 4.2 g = 4200 mg ≥ the 3000 mg knock threshold (PRODUCT.md default) at t = 30 s.
    expect(answer.body.knocks).toEqual([{ tS: 30, peakMg: 4200 }]);
    expect(answer.body.masks).toHaveLength(1);
    expect(answer.body.masks[0]).toMatchObject({ startS: 28, endS: 34, origin: 'proposed' });
    const presets = await hygienist.get(`${base}/noise-mapping-presets`);
    expect(presets.body.items.map((preset: { name: string }) => preset.name)).toContain('Semicolon meter');
    const bad = await upload(text.replace('88;0;0;1;1.1', '88;0;0;x;1.1'), { mapping: JSON.stringify(mapping) }, 'other.csv');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/row 2, column "az"/);
  });

  it('masks, extends and removes spans with reasons, audited, and the reviewed dose follows', async () => {
    const uploaded = await upload(twoLevelLog(), { shiftDate: '2025-03-05' });
    const logId = uploaded.body.id as number;
    // Masking the 88 dBA half leaves 4 h at 85 dBA = 50 %, standing for 8 h: 50 % × 8 h / 4 h = 100 %.
    const added = await hygienist.post(`${base}/noise-logs/${logId}/masks`, { startS: 0, endS: 14_400, reason: 'meter worn by another worker' });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    expect(added.body.figures.reviewed.nioshRel.dose).toBeCloseTo(100, 7);
    expect(added.body.figures.maskedSeconds).toBe(14_400);
    expect(added.body.masks[0].effect.doseChange.nioshRel).toBeCloseTo(-50, 7);
    expect(added.body.status).toBe('reviewed');
    const maskId = added.body.masks[0].id as number;
    // Extending to 6 h masks 120 intervals at 85 too: the remaining 2 h at 85 still average 85 → 100 %.
    const extended = await hygienist.patch(`${base}/noise-logs/${logId}/masks/${maskId}`, {
      startS: 0,
      endS: 21_600,
      reason: 'meter on the bench until 12:00',
    });
    expect(extended.status).toBe(200);
    expect(extended.body.figures.maskedSeconds).toBe(21_600);
    // Shortening to 2 h: 2 h at 88 (50 %) + 4 h at 85 (50 %) over 6 h unmasked, × 8/6 → 133.33 %.
    const shortened = await hygienist.patch(`${base}/noise-logs/${logId}/masks/${maskId}`, { startS: 0, endS: 7200, reason: 'only the first two hours' });
    expect(shortened.body.figures.reviewed.nioshRel.dose).toBeCloseTo((100 * 8) / 6, 7);
    const removed = await hygienist.post(`${base}/noise-logs/${logId}/masks/${maskId}/remove`, { reason: 'was worn after all' });
    expect(removed.status).toBe(200);
    expect(removed.body.masks).toHaveLength(0);
    expect(removed.body.figures.reviewed.nioshRel.dose).toBeCloseTo(150, 7);
    const kept = context.db.select().from(noiseMasks).where(eq(noiseMasks.id, maskId)).get()!;
    expect(kept.status).toBe('removed');
    const events = auditOf(context.db, 'noise_mask', maskId).map((event) => [event.action, event.reason]);
    expect(events).toEqual([
      ['created', 'meter worn by another worker'],
      ['changed', 'meter on the bench until 12:00'],
      ['changed', 'only the first two hours'],
      ['removed', 'was worn after all'],
    ]);
    const noReason = await hygienist.post(`${base}/noise-logs/${logId}/masks`, { startS: 0, endS: 60 });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toBeTruthy();
  });

  it('accepts a log into the group as a linked shift result, and a later mask edit updates it and the data version', async () => {
    const uploaded = await upload(twoLevelLog(), { shiftDate: '2025-03-06' });
    const logId = uploaded.body.id as number;
    const versionBefore = dataVersion();
    const accepted = await hygienist.post(`${base}/noise-logs/${logId}/accept`);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    expect(accepted.body.status).toBe('accepted');
    const resultId = accepted.body.shiftResultId as number;
    const result = context.db.select().from(shiftResults).where(eq(shiftResults.id, resultId)).get()!;
    // The group is judged with nioshRel in % dose (demo seed): 150 % as hand-worked above.
    expect(result).toMatchObject({ source: 'noise-log', unit: 'dose-percent', date: '2025-03-06', workerId: driver, status: 'valid' });
    expect(result.value).toBeCloseTo(150, 7);
    // TWA = 10·lg(1.5) + 85 = 86.76 dBA (NIOSH 98-126 eq. 1-2); LEX,8h = energy mean of 4 h at 88 and 4 h at 85 = 86.76 dB.
    const details = result.details as NoiseResultDetails;
    expect(details.noise.twaDb).toBeCloseTo(10 * Math.log10(1.5) + 85, 9);
    expect(details.noise.lex8hDb).toBeCloseTo(10 * Math.log10((10 ** 8.8 + 10 ** 8.5) / 2), 9);
    expect(details.noise.noiseLogId).toBe(logId);
    expect(dataVersion()).toBe(versionBefore + 1);
    const again = await hygienist.post(`${base}/noise-logs/${logId}/accept`);
    expect(again.status).toBe(409);

    await hygienist.post(`${base}/noise-logs/${logId}/masks`, { startS: 0, endS: 14_400, reason: 'meter worn by another worker' });
    const updated = context.db.select().from(shiftResults).where(eq(shiftResults.id, resultId)).get()!;
    expect(updated.value).toBeCloseTo(100, 7);
    expect(dataVersion()).toBe(versionBefore + 2);
    const resultEvents = auditOf(context.db, 'shift_result', resultId).map((event) => event.action);
    expect(resultEvents).toEqual(['created', 'updated']);
  });

  it('e-mails the uploading hygienist when the meter was still longer than the setting, and says so in the log', async () => {
    const demo = generateNoiseDemoLog({ seed: 7, hours: 1, benchMinutes: 16, knockCount: 2 });
    const answer = await upload(demo.text, { shiftDate: '2025-03-07' }, 'bench.csv');
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    expect(answer.body.stillStretchNotice).toBe(true);
    expect(answer.body.stillStretches.length).toBeGreaterThan(0);
    expect(answer.body.masks.filter((mask: { origin: string }) => mask.origin === 'proposed')).toHaveLength(2);
    const message = await context.mailbox.waitFor((mail) => mail.to.includes(hygienist.user.email) && mail.subject.includes('bench.csv'));
    expect(message.subject).toContain('still for 15 min');
    expect(message.text).toContain('RT-014');
    expect(message.html).toContain(`/noise-logs/${answer.body.id}`);
  });

  it('sends downsampled channel data for the whole log and full resolution for a window', async () => {
    const demo = generateNoiseDemoLog({ seed: 11, hours: 2, knockCount: 1 });
    const uploaded = await upload(demo.text, { shiftDate: '2025-03-08' }, 'long.csv');
    const whole = await hygienist.get(`${base}/noise-logs/${uploaded.body.id}/channels?points=1000`);
    expect(whole.status).toBe(200);
    expect(whole.body.downsampled).toBe(true);
    expect(whole.body.tS.length).toBeLessThanOrEqual(1000);
    // min/max buckets keep the loudest interval of the log.
    expect(Math.max(...whole.body.laeqDb)).toBe(Math.max(...demo.log.laeqDb));
    const window = await hygienist.get(`${base}/noise-logs/${uploaded.body.id}/channels?fromS=600&toS=660`);
    expect(window.body.downsampled).toBe(false);
    expect(window.body.tS[1]).toBe(600);
    expect(window.body.laeqDb[1]).toBe(demo.log.laeqDb[600]);
  });

  it('answers 404 for another organization and 403 to a manager who tries to write', async () => {
    const slateHarbor = context.organizationId('slateHarbor');
    const uploaded = await upload(twoLevelLog(), { shiftDate: '2025-03-09' });
    const logId = uploaded.body.id as number;
    const elsewhere = await hygienist.get(`/api/orgs/${slateHarbor}/noise-logs/${logId}`);
    expect(elsewhere.status).toBe(404);
    const slateHygienist = await context.signInAs('hygienist', 'slateHarbor');
    const crossed = await slateHygienist.get(`/api/orgs/${slateHarbor}/noise-logs/${logId}`);
    expect(crossed.status).toBe(404);
    const read = await manager.get(`${base}/noise-logs/${logId}`);
    expect(read.status).toBe(200);
    const logs = logCount();
    expect((await upload(twoLevelLog(), {}, 'shift.csv', manager)).status).toBe(403);
    expect(logCount()).toBe(logs);
    expect((await manager.post(`${base}/noise-logs/${logId}/masks`, { startS: 0, endS: 60, reason: 'try it' })).status).toBe(403);
    expect((await manager.post(`${base}/noise-logs/${logId}/accept`)).status).toBe(403);
    expect((await manager.put(`${base}/noise-settings`, {})).status).toBe(403);
  });

  it('lets an admin change the noise settings and uses them for the next upload', async () => {
    const admin = await context.signInAs('admin');
    const defaults = await admin.get(`${base}/noise-settings`);
    expect(defaults.body).toEqual({ stillMinutes: 15, motionChangeMg: 30, knockMg: 3000, maskBeforeS: 2, maskAfterS: 3, driftLimitDb: 0.5 });
    const changed = await admin.put(`${base}/noise-settings`, { ...defaults.body, knockMg: 1e5 });
    expect(changed.status).toBe(200);
    const demo = generateNoiseDemoLog({ seed: 5, hours: 1, knockCount: 3 });
    const uploaded = await upload(demo.text, { shiftDate: '2025-03-10' });
    expect(uploaded.body.knocks).toEqual([]);
    await admin.put(`${base}/noise-settings`, defaults.body);
  });
});
