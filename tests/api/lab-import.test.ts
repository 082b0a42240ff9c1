import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importBatches } from '@schema/lab-imports';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { auditOf, batchCount, resultCount, siteId, workerId } from '../helpers/org-data';

/*
 * Lab CSV import over HTTP: upload → preview → check → commit. The shift TWAs expected below are
 * worked by hand from TWA = Σ(Cᵢ·tᵢ)/T (OSHA 29 CFR 1910.1000(d)(1)(i)), written out beside each.
 */

const header = 'Worker,Date,Group,Analyte,Result,Units,Sample ID,Start,End,Lab';
const planer = 'Planer feeder – wood dust';
const dust = 'Inhalable wood dust';
const goodFile = [
  header,
  `RT-011,2025-01-20,${planer},${dust},0.40,mg/m3,L-1001,07:00,09:00,Test lab`,
  `RT-011,2025-01-20,${planer},${dust},0.10,mg/m3,L-1002,09:00,13:00,Test lab`,
  `RT-012,2025-01-20,${planer},${dust},<0.05,mg/m3,L-1003,07:00,11:00,Test lab`,
  `RT-012,2025-01-20,${planer},${dust},0.30,mg/m3,L-1004,11:00,15:00,Test lab`,
  `RT-013,2025-01-20,${planer},${dust},<0.05,mg/m3,L-1005,07:00,11:00,Test lab`,
  `RT-013,2025-01-20,${planer},${dust},<0.02,mg/m3,L-1006,11:00,15:00,Test lab`,
  `RT-001,2025-01-21,Head sawyer – wood dust,${dust},0.75,mg/m3,L-1007,,,Test lab`,
].join('\n');

/** The mapping the preview suggests for `header` (checked in the first test). */
const mapping = {
  workerCode: 'Worker',
  date: 'Date',
  group: 'Group',
  agent: 'Analyte',
  value: 'Result',
  unit: 'Units',
  detectionLimit: null,
  sampleId: 'Sample ID',
  lab: 'Lab',
  startTime: 'Start',
  endTime: 'End',
  minutes: null,
};

describe('lab CSV import', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let base: string;

  const upload = (text: string | Buffer, fileName = 'results.csv', contentType = 'text/csv', client: SignedIn = hygienist) =>
    client.agent
      .post(base)
      .set('X-CSRF-Token', client.csrfToken)
      .attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), { filename: fileName, contentType });
  const commit = (batchId: number, body: object, client: SignedIn = hygienist) => client.post(`${base}/${batchId}/commit`, body);
  const statusOf = (batchId: number) => context.db.select().from(importBatches).where(eq(importBatches.id, batchId)).get()!.status;

  /** Uploads a file that reads as a table, commits it, and checks the commit is refused with nothing stored. */
  async function expectRefused(text: string, body: object = { mapping, unsampledTime: 'zero' }) {
    const uploaded = await upload(text);
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    const before = resultCount(context.db);
    const answer = await commit(uploaded.body.batch.id, body);
    expect(answer.status).toBe(400);
    expect(resultCount(context.db)).toBe(before);
    expect(statusOf(uploaded.body.batch.id)).toBe('uploaded');
    return answer.body.error as {
      message: string;
      fields?: Record<string, string>;
      details?: { problems: Array<{ row: number | null; column: string | null; message: string }> };
    };
  }

  /** Checks an upload is refused with nothing stored (no batch, no results). */
  async function expectUploadRefused(text: string | Buffer, fileName?: string, contentType?: string, status = 400) {
    const batches = batchCount(context.db);
    const results = resultCount(context.db);
    const answer = await upload(text, fileName, contentType);
    expect(answer.status, JSON.stringify(answer.body)).toBe(status);
    expect(batchCount(context.db)).toBe(batches);
    expect(resultCount(context.db)).toBe(results);
    return answer.body.error as { message: string; details?: { problems: Array<{ row: number | null; column: string | null; message: string }> } };
  }

  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    base = `/api/orgs/${ridgeback}/lab-imports`;
  });
  afterAll(() => context.close());

  describe('a good file', () => {
    let batchId: number;

    it('upload keeps the file with its SHA-256 and answers with columns, a suggested mapping and the first rows', async () => {
      const answer = await upload(goodFile);
      expect(answer.status).toBe(201);
      batchId = answer.body.batch.id;
      expect(answer.body.batch).toMatchObject({
        fileName: 'results.csv',
        fileSize: Buffer.byteLength(goodFile),
        sha256: createHash('sha256').update(goodFile).digest('hex'),
        status: 'uploaded',
        rowCount: 7,
        delimiter: ',',
      });
      expect(answer.body.batch).not.toHaveProperty('content');
      expect(answer.body.preview.suggestedMapping).toEqual(mapping);
      expect(answer.body.preview.columns[4]).toEqual({ name: 'Result', examples: ['0.40', '0.10', '<0.05'] });
      expect(answer.body.preview.rows[0]).toEqual({ row: 2, values: expect.objectContaining({ Worker: 'RT-011', Result: '0.40', Start: '07:00' }) });
      expect(answer.body.preview.rowCount).toBe(7);
      expect(answer.body.warnings).toEqual([]);
      expect(auditOf(context.db, 'import_batch', batchId)[0]).toMatchObject({ action: 'uploaded', after: { sha256: answer.body.batch.sha256 } });
    });

    it('GET returns the batch and its preview; the list shows it', async () => {
      const one = await hygienist.get(`${base}/${batchId}`);
      expect(one.body.batch.id).toBe(batchId);
      expect(one.body.preview.rowCount).toBe(7);
      const list = await hygienist.get(`${base}?status=uploaded`);
      expect(list.body.items.map((batch: { id: number }) => batch.id)).toContain(batchId);
    });

    it('a shift with samples needs the unsampled-time choice (400 naming unsampledTime)', async () => {
      const answer = await commit(batchId, { mapping });
      expect(answer.status).toBe(400);
      expect(answer.body.error.fields.unsampledTime).toBe(
        '3 shift(s) combine samples or cover only part of the shift: choose what the unsampled time is taken as (zero or sampled-average)',
      );
    });

    it('check (dry run) with sampled-average divides by the sampled time and stores nothing', async () => {
      const before = resultCount(context.db);
      const answer = await hygienist.post(`${base}/${batchId}/check`, { mapping, unsampledTime: 'sampled-average' });
      expect(answer.status).toBe(200);
      expect(answer.body.resultCount).toBe(4);
      const rt011 = answer.body.results.find((result: { workerCode: string }) => result.workerCode === 'RT-011');
      // (0.40 × 120 + 0.10 × 240) / (120 + 240) = 72 / 360 = 0.2 mg/m³
      expect(rt011.value).toBeCloseTo(0.2, 12);
      expect(rt011.rows).toEqual([2, 3]);
      expect(rt011.statement).toMatch(
        /TWA = Σ\(Cᵢ·tᵢ\)\/Σtᵢ, Σtᵢ = 360 min \(the sampled time\); the 120 unsampled minutes of the 480-min shift are taken as exposed at the average of the sampled periods/,
      );
      expect(resultCount(context.db)).toBe(before);
      expect(statusOf(batchId)).toBe('uploaded');
    });

    it('commit with unsampled time at zero stores one result per worker-shift, all or nothing, each stating its calculation', async () => {
      const before = resultCount(context.db);
      const answer = await commit(batchId, { mapping, unsampledTime: 'zero' });
      expect(answer.status, JSON.stringify(answer.body)).toBe(201);
      expect(resultCount(context.db)).toBe(before + 4);
      expect(answer.body.batch).toMatchObject({
        status: 'committed',
        resultCount: 4,
        committedAt: '2025-03-03T08:00:00.000Z',
        committedByUserId: hygienist.user.id,
      });
      const byWorker = Object.fromEntries(answer.body.results.map((result: { worker: { code: string } }) => [result.worker.code, result]));

      // RT-011: (0.40 × 120 + 0.10 × 240) / 480 = 72 / 480 = 0.15 mg/m³
      expect(byWorker['RT-011'].value).toBeCloseTo(0.15, 12);
      expect(byWorker['RT-011']).toMatchObject({
        nonDetect: false,
        source: 'lab-import',
        importBatchId: batchId,
        sampleId: 'L-1001 + L-1002',
        startTime: '07:00',
        endTime: '13:00',
        sampledMinutes: 360,
      });
      expect(byWorker['RT-011'].details.statement).toMatch(/the 120 unsampled minutes of the 480-min shift are taken as zero exposure/);
      expect(byWorker['RT-011'].details.statement).toMatch(/OSHA 29 CFR 1910\.1000\(d\)\(1\)\(i\)/);

      // RT-012: the non-detect part at its limit: (0.05 × 240 + 0.30 × 240) / 480 = 84 / 480 = 0.175 (upper bound);
      // at zero: 72 / 480 = 0.15 (lower bound). Detected, flagged.
      expect(byWorker['RT-012'].value).toBeCloseTo(0.175, 12);
      expect(byWorker['RT-012'].nonDetect).toBe(false);
      expect(byWorker['RT-012'].details.combination.lowerBound).toBeCloseTo(0.15, 12);
      expect(byWorker['RT-012'].details.flags).toEqual(['Upper bound: 1 non-detect sample(s) counted at the detection limit; lower bound 0.15 mg/m³.']);

      // RT-013: every part below detection: a non-detect below (0.05 × 240 + 0.02 × 240) / 480 = 16.8 / 480 = 0.035.
      expect(byWorker['RT-013']).toMatchObject({ nonDetect: true });
      expect(byWorker['RT-013'].value).toBeCloseTo(0.035, 12);
      expect(byWorker['RT-013'].detectionLimit).toBe(byWorker['RT-013'].value);

      // RT-001: one sample without a duration is the lab's shift figure.
      expect(byWorker['RT-001']).toMatchObject({ value: 0.75, reportedValue: 0.75, reportedUnit: 'mg/m3', exposureGroupName: 'Head sawyer – wood dust' });
      expect(byWorker['RT-001'].details.combination.assumption).toBe('single');

      expect(auditOf(context.db, 'import_batch', batchId).at(-1)).toMatchObject({ action: 'committed', after: { resultCount: 4, unsampledTime: 'zero' } });
      expect(auditOf(context.db, 'shift_result', byWorker['RT-011'].id)[0]).toMatchObject({
        action: 'created',
        after: { source: 'lab-import', importBatchId: batchId },
      });
      const results = await hygienist.get(`/api/orgs/${ridgeback}/shift-results?importBatchId=${batchId}`);
      expect(results.body.total).toBe(4);
    });

    it('a second commit of the same batch answers 409', async () => {
      const answer = await commit(batchId, { mapping, unsampledTime: 'zero' });
      expect(answer.status).toBe(409);
      expect(answer.body.error.message).toMatch(/was already committed/);
    });

    it('the same file uploaded again is flagged, and its commit reports every row as a duplicate of a stored result', async () => {
      const uploaded = await upload(goodFile);
      expect(uploaded.body.warnings).toEqual([`The same file (same SHA-256) was committed before as lab import ${batchId} on 2025-03-03T08:00:00.000Z.`]);
      const before = resultCount(context.db);
      const answer = await commit(uploaded.body.batch.id, { mapping, unsampledTime: 'zero' });
      expect(answer.status).toBe(400);
      const problems = answer.body.error.details.problems;
      expect(problems).toHaveLength(7);
      expect(problems[0]).toEqual({
        row: 2,
        column: null,
        message: expect.stringMatching(/^duplicate of result \d+, already stored \(same worker, date, group, agent and sample id "L-1001"\)$/),
      });
      expect(answer.body.error.message).toMatch(/^The lab import was refused \(7 problems; nothing was stored\): row 2: duplicate of result/);
      expect(resultCount(context.db)).toBe(before);
    });
  });

  describe('units', () => {
    it('ppm is converted to the group’s mg/m³ from the molecular weight; µg/m³ by 1/1000', async () => {
      const toluene = await hygienist.post(`/api/orgs/${ridgeback}/agents`, {
        name: 'Toluene',
        kind: 'chemical',
        casNumber: '108-88-3',
        molecularWeight: 92.14,
      });
      const group = await hygienist.post(`/api/orgs/${ridgeback}/exposure-groups`, {
        siteId: siteId(context.db, ridgeback, 'Ridgeback sawmill'),
        name: 'Saw filer – solvent',
        agentId: toluene.body.id,
        oelValue: 50,
        oelUnit: 'mg/m3',
        oelSource: 'In-house limit (test data)',
        oelAveragingTime: '8h-twa',
      });
      for (const code of ['RT-006', 'RT-007'])
        await hygienist.post(`/api/orgs/${ridgeback}/group-memberships`, {
          workerId: workerId(context.db, ridgeback, code),
          exposureGroupId: group.body.id,
          fromDate: '2025-01-01',
        });
      const uploaded = await upload(['Employee;Sample date;Conc;Unit', 'RT-006;2025-01-22;100;ppm', 'RT-007;2025-01-22;1500;µg/m³'].join('\n'));
      expect(uploaded.body.batch.delimiter).toBe(';');
      expect(uploaded.body.preview.suggestedMapping).toMatchObject({ workerCode: 'Employee', date: 'Sample date', value: 'Conc', unit: 'Unit', group: null });
      const answer = await commit(uploaded.body.batch.id, { mapping: uploaded.body.preview.suggestedMapping, defaults: { exposureGroupId: group.body.id } });
      expect(answer.status, JSON.stringify(answer.body)).toBe(201);
      const [rt006, rt007] = answer.body.results;
      // Toluene 100 ppm = 376.9 mg/m³ (REFERENCES.md); within half a unit of the printed last digit.
      expect(Math.abs(rt006.value - 376.9)).toBeLessThanOrEqual(0.05);
      expect(rt006.details.conversion).toMatchObject({ from: 'ppm', to: 'mg/m3', molecularWeight: 92.14, molarVolumeLitres: 24.45 });
      expect(rt007.value).toBeCloseTo(1.5, 12);
      expect(rt007).toMatchObject({ reportedValue: 1500, reportedUnit: 'ug/m3' });
    });
  });

  describe('malformed files: a clear error and nothing stored', () => {
    it('1. an empty file', async () => {
      const error = await expectUploadRefused('');
      expect(error.message).toBe('The file is empty (1 problem; nothing was stored): the file has no bytes at all');
      const blank = await expectUploadRefused('\n\n  \n');
      expect(blank.message).toMatch(/^The file is empty/);
    });

    it('2. a missing required column: no value column to map', async () => {
      const error = await expectRefused([`Worker,Date,Group,Units`, `RT-011,2025-01-23,${planer},mg/m3`].join('\n'), {
        mapping: { ...mapping, value: null, agent: null, sampleId: null, lab: null, startTime: null, endTime: null },
      });
      expect(error.fields).toEqual({ 'mapping.value': 'Map a column of the file to this field' });
      const named = await expectRefused([`Worker,Date,Group,Units`, `RT-011,2025-01-23,${planer},mg/m3`].join('\n'), {
        mapping: { workerCode: 'Worker', date: 'Date', group: 'Group', unit: 'Units', value: 'Result' },
      });
      expect(named.fields).toEqual({ 'mapping.value': 'No column "Result" in the file (its columns: Worker, Date, Group, Units)' });
      expect(named.message).toBe('Check the request body: mapping.value: No column "Result" in the file (its columns: Worker, Date, Group, Units)');
    });

    it('3. a bad date', async () => {
      const error = await expectRefused([header, `RT-011,2025-13-01,${planer},${dust},0.4,mg/m3,L-2001,,,`].join('\n'));
      expect(error.details!.problems).toEqual([
        { row: 2, column: 'Date', message: 'expected a date written YYYY-MM-DD, got "2025-13-01" (choose the file\'s date format if it uses another)' },
      ]);
      expect(error.message).toMatch(/row 2, column "Date": expected a date written YYYY-MM-DD, got "2025-13-01"/);
    });

    it('4. a negative value', async () => {
      const error = await expectRefused(
        [header, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2002,,,`, `RT-012,2025-01-23,${planer},${dust},-0.3,mg/m3,L-2003,,,`].join('\n'),
      );
      expect(error.details!.problems).toEqual([{ row: 3, column: 'Result', message: 'the value must be above 0, got "-0.3"' }]);
    });

    it('5. "<" without a number and no detection-limit column', async () => {
      const error = await expectRefused([header, `RT-011,2025-01-23,${planer},${dust},<,mg/m3,L-2004,,,`].join('\n'));
      expect(error.details!.problems).toEqual([
        { row: 2, column: 'Result', message: '"<" needs its detection limit: write it as "<0.02", or map the detection-limit column' },
      ]);
    });

    it('6. an unknown worker code', async () => {
      const error = await expectRefused([header, `RT-999,2025-01-23,${planer},${dust},0.4,mg/m3,L-2005,,,`].join('\n'));
      expect(error.details!.problems).toEqual([{ row: 2, column: 'Worker', message: 'no worker "RT-999" in this organization' }]);
    });

    it('7. an unknown group', async () => {
      const error = await expectRefused([header, `RT-011,2025-01-23,Kiln – wood dust,${dust},0.4,mg/m3,L-2006,,,`].join('\n'));
      expect(error.details!.problems).toEqual([{ row: 2, column: 'Group', message: 'no exposure group "Kiln – wood dust" in this organization' }]);
    });

    it('8. a worker who is not in the group on that date', async () => {
      const error = await expectRefused(
        [header, `RT-003,2025-01-23,${planer},${dust},0.4,mg/m3,L-2007,,,`, `RT-005,2024-02-01,${planer},${dust},0.4,mg/m3,L-2008,,,`].join('\n'),
      );
      expect(error.details!.problems).toEqual([
        { row: 2, column: 'Worker', message: 'RT-003 is not a member of "Planer feeder – wood dust" on 2025-01-23 (never a member)' },
        { row: 3, column: 'Worker', message: 'RT-005 is not a member of "Planer feeder – wood dust" on 2024-02-01 (member 2024-03-04 – open)' },
      ]);
    });

    it('9. a unit that cannot be converted: ppm for an agent without molecular weight', async () => {
      const error = await expectRefused([header, `RT-011,2025-01-23,${planer},${dust},2,ppm,L-2009,,,`].join('\n'));
      expect(error.details!.problems).toEqual([
        {
          row: 2,
          column: 'Units',
          message: 'cannot convert ppm to mg/m³ for "Inhalable wood dust": the agent has no molecular weight (set it on the agent, or report in mg/m³)',
        },
      ]);
    });

    it('10. mixed delimiters', async () => {
      const error = await expectUploadRefused(
        [header, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2010,,,Test lab`, `RT-012;2025-01-23;${planer};${dust};0.5;mg/m3;L-2011;;;Test lab`].join(
          '\n',
        ),
      );
      expect(error.details!.problems).toEqual([
        {
          row: 3,
          column: null,
          message: '1 field where the header has 10: this row seems to use a semicolon where the header uses a comma — use one delimiter throughout',
        },
      ]);
    });

    it('11. a file over the 5 MB limit', async () => {
      const big = `${header}\n${`RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-3000,,,Test lab\n`.repeat(60_000)}`;
      expect(Buffer.byteLength(big)).toBeGreaterThan(5 * 1024 * 1024);
      const error = await expectUploadRefused(big, 'big.csv', 'text/csv', 413);
      expect(error.message).toBe('The file is larger than the limit of 5 MB; nothing was stored');
    });

    it('12. a sample that ends before it starts', async () => {
      const error = await expectRefused([header, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2012,09:00,07:00,`].join('\n'));
      expect(error.details!.problems).toEqual([
        {
          row: 2,
          column: 'End',
          message: 'the sample ends (07:00) before or when it starts (09:00); for a sample past midnight write the end as 2025-01-24T07:00',
        },
      ]);
    });

    it('13. a decimal comma in a semicolon file', async () => {
      const error = await expectRefused(['Worker;Date;Group;Result;Units', `RT-011;2025-01-23;${planer};7,5;mg/m3`].join('\n'), {
        mapping: { workerCode: 'Worker', date: 'Date', group: 'Group', value: 'Result', unit: 'Units' },
      });
      expect(error.message).toMatch(/row 2, column "Result": expected a number or "<LOD" \(e\.g\. 0\.35 or <0\.02\), got "7,5"/);
    });

    it('14. a file that is not CSV text (by name, or by its bytes)', async () => {
      const named = await expectUploadRefused('a,b\n1,2', 'results.xlsx', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
      expect(named.message).toMatch(/Upload the lab results as a \.csv \(or \.txt\) text file; "results\.xlsx"/);
      const binary = await expectUploadRefused(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00]), 'results.csv');
      expect(binary.message).toMatch(/^The file is not a text file/);
      const latin1 = await expectUploadRefused(Buffer.from([0x57, 0x6f, 0x72, 0x6b, 0x65, 0x72, 0x2c, 0x44, 0x0a, 0xe9, 0x2c, 0x31]), 'results.csv');
      expect(latin1.message).toMatch(/^The file is not UTF-8 text/);
    });

    it('15. several samples in one shift without their durations', async () => {
      const error = await expectRefused(
        [header, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2013,,,`, `RT-011,2025-01-23,${planer},${dust},0.2,mg/m3,L-2014,,,`].join('\n'),
      );
      expect(error.details!.problems.map((problem) => [problem.row, problem.message])).toEqual([
        [
          2,
          'RT-011 on 2025-01-23 in "Planer feeder – wood dust" has 2 samples: each needs its minutes or its start and end times to be combined into a shift TWA',
        ],
        [
          3,
          'RT-011 on 2025-01-23 in "Planer feeder – wood dust" has 2 samples: each needs its minutes or its start and end times to be combined into a shift TWA',
        ],
      ]);
    });

    it('16. samples covering more than the shift (unsampled time at zero), and overlapping samples', async () => {
      const error = await expectRefused(
        [
          header,
          `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2015,06:00,12:00,`,
          `RT-011,2025-01-23,${planer},${dust},0.2,mg/m3,L-2016,12:00,17:00,`,
          `RT-012,2025-01-23,${planer},${dust},0.4,mg/m3,L-2017,07:00,10:00,`,
          `RT-012,2025-01-23,${planer},${dust},0.2,mg/m3,L-2018,09:30,12:00,`,
        ].join('\n'),
      );
      expect(error.details!.problems).toEqual([
        {
          row: 2,
          column: null,
          message:
            'the samples of RT-011 on 2025-01-23 in "Planer feeder – wood dust" cover 660 min, more than the 480-min shift: check the times, or give the shift length (shiftHours)',
        },
        { row: 5, column: null, message: 'this sample (09:30–12:00) overlaps the one in row 4 (07:00–10:00)' },
      ]);
    });

    it('17. the same sample twice in one file', async () => {
      const error = await expectRefused(
        [header, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2019,,,`, `RT-011,2025-01-23,${planer},${dust},0.4,mg/m3,L-2019,,,`].join('\n'),
      );
      expect(error.details!.problems).toEqual([{ row: 3, column: null, message: 'repeats row 2 (same worker, date, group, agent and sample id "L-2019")' }]);
    });

    it('18. one bad row among good ones stores none of them, and every bad row is listed', async () => {
      const error = await expectRefused(
        [
          header,
          `RT-011,2025-01-24,${planer},${dust},0.4,mg/m3,L-2020,,,`,
          `RT-012,2025-01-24,${planer},${dust},abc,mg/m3,L-2021,,,`,
          `RT-013,2025-01-24,${planer},${dust},0.3,mg/m3,L-2022,,,`,
          `RT-011,2025-01-25,${planer},${dust},0.3,mg/m3,L-2023,,,`,
          `,2025-01-25,${planer},${dust},0.3,furlongs,L-2024,,,`,
        ].join('\n'),
      );
      expect(error.details!.problems).toEqual([
        { row: 3, column: 'Result', message: 'expected a number or "<LOD" (e.g. 0.35 or <0.02), got "abc"' },
        { row: 6, column: 'Worker', message: 'the worker code is empty' },
        { row: 6, column: 'Units', message: 'unknown unit "furlongs" (use mg/m3, µg/m3, ppm, f/cc, dBA or % dose)' },
      ]);
    });

    it('19. a date in the future, and an agent that is not the group’s', async () => {
      const error = await expectRefused(
        [header, `RT-011,2025-03-10,${planer},${dust},0.4,mg/m3,L-2025,,,`, `RT-012,2025-01-23,${planer},Noise,0.4,mg/m3,L-2026,,,`].join('\n'),
      );
      expect(error.details!.problems).toEqual([
        { row: 2, column: 'Date', message: '2025-03-10 is in the future' },
        { row: 3, column: 'Analyte', message: '"Noise" is not the agent of "Planer feeder – wood dust" (which is for "Inhalable wood dust")' },
      ]);
    });

    it('20. a quote that is never closed', async () => {
      const error = await expectUploadRefused([header, `RT-011,2025-01-23,"${planer},${dust},0.4,mg/m3,L-2027,,,`].join('\n'));
      expect(error.message).toMatch(/^The file cannot be read as a table/);
      expect(error.details!.problems[0]).toMatchObject({ row: 2, message: expect.stringMatching(/quoted field/) });
    });
  });

  describe('permissions and organizations', () => {
    it('a manager cannot upload (403) and nothing is stored; a consultant cannot commit (403) and sees no cells of the file', async () => {
      const manager = await context.signInAs('manager');
      const batches = batchCount(context.db);
      const answer = await upload(goodFile, 'results.csv', 'text/csv', manager);
      expect(answer.status).toBe(403);
      expect(batchCount(context.db)).toBe(batches);
      const uploaded = await upload(goodFile);
      const consultant = await context.signInAs('consultant');
      expect((await commit(uploaded.body.batch.id, { mapping, unsampledTime: 'zero' }, consultant)).status).toBe(403);
      // The consultant may read the batch, but not the file's cells (a lab file can hold worker names).
      const seen = await consultant.get(`${base}/${uploaded.body.batch.id}`);
      expect(seen.status).toBe(200);
      expect(seen.body.preview).toMatchObject({ rows: [], cellsHidden: true, rowCount: 7 });
      expect(seen.body.preview.columns[0]).toEqual({ name: 'Worker', examples: [] });
      const hygienistView = await hygienist.get(`${base}/${uploaded.body.batch.id}`);
      expect(hygienistView.body.preview.rows).toHaveLength(7);
    });

    it('another organization’s batch answers 404', async () => {
      const slateHygienist = await context.signInAs('hygienist', 'slateHarbor');
      const slateUpload = await slateHygienist.agent
        .post(`/api/orgs/${slateHarbor}/lab-imports`)
        .set('X-CSRF-Token', slateHygienist.csrfToken)
        .attach('file', Buffer.from('Worker,Date,Result\nSH-001,2025-01-20,0.01'), { filename: 'slate.csv', contentType: 'text/csv' });
      expect(slateUpload.status).toBe(201);
      const foreign = slateUpload.body.batch.id;
      expect((await hygienist.get(`${base}/${foreign}`)).status).toBe(404);
      expect((await hygienist.post(`${base}/${foreign}/check`, { mapping })).status).toBe(404);
      expect((await commit(foreign, { mapping })).status).toBe(404);
    });

    it('an upload without a file answers 400 naming the form field', async () => {
      const answer = await hygienist.post(base, { file: 'not a file' });
      expect(answer.status).toBe(400);
      expect(answer.body.error).toMatchObject({
        message: 'Attach the lab results as a CSV file in the multipart form field "file"',
        fields: { file: 'Attach a CSV file' },
      });
    });
  });
});
