import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labImportMaximumRows } from '@schema/lab-imports';
import { noiseLogLimits } from '@stats/noise-log';
import { groupId, workerId } from '../helpers/org-data';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

/*
 * Upload and body limits hold on every upload route: size (413 naming the limit), rows (400 naming
 * the limit), type (400 naming the file), and JSON bodies over the limit (413 as our JSON error,
 * never an HTML page or a stack trace). Nothing is stored by a refused upload.
 */

/** The 8-byte PNG signature and an IHDR chunk start: what a photo renamed to .csv begins with. */
const pngBytes = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52, 0x00, 0x00, 0x00, 0x01]);

describe('upload and body limits', () => {
  let context: TestContext;
  let hygienist: SignedIn;
  let base: string;
  let noiseFields: Record<string, string | number>;

  const count = (table: string) => (context.db.$client.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
  const upload = (path: string, bytes: Buffer, fileName: string, contentType: string, fields: Record<string, string | number> = {}) => {
    let call = hygienist.agent.post(`${base}/${path}`).set('X-CSRF-Token', hygienist.csrfToken);
    for (const [key, value] of Object.entries(fields)) call = call.field(key, String(value));
    return call.attach('file', bytes, { filename: fileName, contentType });
  };

  beforeAll(async () => {
    context = await createTestContext();
    const ridgeback = context.organizationId('ridgeback');
    base = `/api/orgs/${ridgeback}`;
    hygienist = await context.signInAs('hygienist');
    noiseFields = {
      exposureGroupId: groupId(context.db, ridgeback, 'Forklift driver – noise'),
      workerId: workerId(context.db, ridgeback, 'RT-014'),
      shiftDate: '2025-03-04',
      instrument: 'LIMITS',
    };
  }, 60_000);
  afterAll(() => context.close());

  it(`a lab file with more than ${labImportMaximumRows} data rows is refused naming the limit, and nothing is stored`, async () => {
    const batches = count('import_batches');
    const rows = Array.from({ length: labImportMaximumRows + 1 }, (_, index) => `RT-011,2025-01-20,${index}`);
    const answer = await upload('lab-imports', Buffer.from(['Worker,Date,Result', ...rows].join('\n')), 'many.csv', 'text/csv');
    expect(answer.status).toBe(400);
    expect(answer.headers['content-type']).toMatch(/^application\/json/);
    expect(JSON.stringify(answer.body.error)).toContain(
      `the file has ${labImportMaximumRows + 1} data rows; at most ${labImportMaximumRows} are read in one import`,
    );
    expect(count('import_batches')).toBe(batches);
  });

  it('a PNG named .csv, or sent as a PNG, is refused as a lab file and as a noise log', async () => {
    const batches = count('import_batches');
    const logs = count('noise_logs');
    const disguisedLab = await upload('lab-imports', pngBytes, 'photo.csv', 'text/csv');
    expect(disguisedLab.status).toBe(400);
    expect(disguisedLab.body.error.message).toMatch(/^The file is not (a text file|UTF-8 text)/);
    const plainLab = await upload('lab-imports', pngBytes, 'photo.png', 'image/png');
    expect(plainLab.status).toBe(400);
    expect(plainLab.body.error.message).toContain('"photo.png" (image/png) is not one');

    const disguisedNoise = await upload('noise-logs', pngBytes, 'photo.csv', 'text/csv', noiseFields);
    expect(disguisedNoise.status).toBe(400);
    expect(disguisedNoise.body.error.message).toMatch(/not valid UTF-8 text/);
    const plainNoise = await upload('noise-logs', pngBytes, 'photo.png', 'image/png', noiseFields);
    expect(plainNoise.status).toBe(400);
    expect(plainNoise.body.error.message).toContain('"photo.png" is not one');
    expect(count('import_batches')).toBe(batches);
    expect(count('noise_logs')).toBe(logs);
  });

  it('a noise log longer than the format allows (more than 7 days of rows) is refused naming the row, and nothing is stored', async () => {
    const logs = count('noise_logs');
    const lastSecond = noiseLogLimits.tS.max + 60;
    const rows: string[] = [];
    for (let second = 0; second <= lastSecond; second += 60) rows.push(`${second},80.0,95.0,0,0,1000,1100`);
    const text = [
      '# noise-log: 1',
      '# instrument: LIMITS',
      '# worker: RT-014',
      '# start: 2025-03-04T06:30:00-08:00',
      '# interval_s: 60',
      '# calibration_reference_db: 114',
      '# calibration_before_db: 114',
      '# calibration_after_db: 114',
      't_s,laeq_db,lcpeak_db,ax_mg,ay_mg,az_mg,apeak_mg',
      ...rows,
    ].join('\n');
    const answer = await upload('noise-logs', Buffer.from(text), 'week.csv', 'text/csv', noiseFields);
    expect(answer.status).toBe(400);
    expect(answer.body.error.message).toMatch(/row \d+/);
    expect(count('noise_logs')).toBe(logs);
  });

  it('a lab file over 5 MB answers 413 as a JSON error naming the limit', async () => {
    const answer = await upload('lab-imports', Buffer.alloc(5 * 1024 * 1024 + 1, 0x41), 'big.csv', 'text/csv');
    expect(answer.status).toBe(413);
    expect(answer.headers['content-type']).toMatch(/^application\/json/);
    expect(answer.body.error).toEqual({ code: 'payload_too_large', message: 'The file is larger than the limit of 5 MB; nothing was stored' });
  });

  it('a JSON body over the limit on an organization route answers 413 as a JSON error, not an HTML page', async () => {
    const sites = count('sites');
    const answer = await hygienist.post(`${base}/sites`, { name: 'Huge', description: 'x'.repeat(1024 * 1024 + 10) });
    expect(answer.status).toBe(413);
    expect(answer.headers['content-type']).toMatch(/^application\/json/);
    expect(answer.body.error).toEqual({ code: 'payload_too_large', message: `The request body is larger than the limit of ${context.config.jsonLimit}` });
    expect(answer.text).not.toMatch(/<html|at .*\.js:\d+/i);
    expect(count('sites')).toBe(sites);
  });
});
