/**
 * Evidence packs (issue: "evidence pack per approved decision record"): who may download, which records,
 * what the zip holds, and that the pack alone is enough to check it — the PDF text (read back with pdf-parse)
 * shows the record's figures, the first page renders (Debian poppler-utils pdftoppm) with ink on it, the data
 * hash is the SHA-256 of the pack's own data, and the figures recomputed from data.csv equal record.json.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roles, can } from '@schema/permissions';
import type { AssessmentResult } from '@schema/assessment';
import type { DecisionRecordView } from '@schema/decision-records';
import type { ShiftValue } from '@stats/types';
import { main as assessMain } from '../../backend/src/cli/assess';
import { categoryLabel } from '../../backend/src/pdf/category-palette';
import { printable } from '../../backend/src/pdf/document';
import { bayesViewOf, classicalOutcome, plannerOf } from '../../backend/src/services/assessment-engine';
import { assessmentDataHash } from '../../backend/src/services/assessment';
import { auditOf } from '../helpers/org-data';
import { readZip as unzip } from '../helpers/read-zip';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

/** A binary body from supertest (it would otherwise try to parse a zip or PDF as text). */
function binary(response: NodeJS.ReadableStream, callback: (error: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => callback(null, Buffer.concat(chunks)));
}

/**
 * Every number in `actual` within a relative 1e-9 of `expected`, everything else equal. The same engine on
 * the same doubles gives the same bits, so any difference at all would mean the pack lost information;
 * 1e-9 only leaves room for a platform's last-bit libm differences (common practice).
 */
function expectSameFigures(actual: unknown, expected: unknown, path = 'figures'): void {
  if (typeof expected === 'number' && typeof actual === 'number') {
    const scale = Math.max(Math.abs(expected), Number.MIN_VALUE);
    expect(Math.abs(actual - expected) / scale, `${path}: ${actual} vs ${expected}`).toBeLessThanOrEqual(1e-9);
    return;
  }
  if (Array.isArray(expected)) {
    expect(Array.isArray(actual), `${path} is an array`).toBe(true);
    expect((actual as unknown[]).length, `${path}.length`).toBe(expected.length);
    expected.forEach((item, index) => expectSameFigures((actual as unknown[])[index], item, `${path}[${index}]`));
    return;
  }
  if (expected !== null && typeof expected === 'object') {
    expect(actual !== null && typeof actual === 'object', `${path} is an object`).toBe(true);
    const keys = Object.keys(expected as object).filter((key) => (expected as Record<string, unknown>)[key] !== undefined);
    expect(
      Object.keys(actual as object)
        .filter((key) => (actual as Record<string, unknown>)[key] !== undefined)
        .sort(),
      `${path} keys`,
    ).toEqual(keys.sort());
    for (const key of keys) expectSameFigures((actual as Record<string, unknown>)[key], (expected as Record<string, unknown>)[key], `${path}.${key}`);
    return;
  }
  expect(actual, path).toEqual(expected);
}

/** The number printed after `label` in the PDF text (the figure column of the key-figures table or a label line). */
function numberAfter(text: string, label: string): number {
  const escaped = label.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const match = new RegExp(`${escaped}\\s+(?:W\\s+)?([0-9.eE+-]+)`).exec(text);
  if (!match) throw new Error(`The PDF text has no figure after "${label}"`);
  return Number(match[1]);
}

/**
 * The code points of the embedded font: the Latin subset's unicode-range as @fontsource/noto-sans publishes
 * it (unicode.json). A character outside it would print as an empty box.
 */
function latinSubsetCovers(): (character: string) => boolean {
  const ranges = (createRequire(import.meta.url)('@fontsource/noto-sans/unicode.json') as Record<string, string>).latin!.split(',').map((range) => {
    const [from, to] = range.replace('U+', '').split('-');
    return [parseInt(from!, 16), parseInt(to ?? from!, 16)] as const;
  });
  return (character) => ranges.some(([from, to]) => character.codePointAt(0)! >= from && character.codePointAt(0)! <= to);
}

/** Share of pixels darker than near-white in a binary PGM (P5, 8-bit) as pdftoppm -gray writes it. */
function inkShare(pgm: Buffer): number {
  const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(pgm.subarray(0, 64).toString('latin1'));
  if (!header) throw new Error('Not a binary PGM');
  const [whole, width, height] = header;
  const pixels = pgm.subarray(whole.length, whole.length + Number(width) * Number(height));
  let dark = 0;
  for (const value of pixels) if (value < 200) dark += 1;
  return dark / pixels.length;
}

describe('evidence packs', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let consultant: SignedIn;
  let folder: string;
  const signedIn = new Map<string, SignedIn>();
  let approvedIds: number[];
  let draftId: number;
  let returnedId: number;

  const packUrl = (organization: number, record: number, extension: 'zip' | 'pdf' = 'zip') =>
    `/api/orgs/${organization}/decision-records/${record}/evidence-pack.${extension}`;
  // supertest hands the parser Node's response stream (typed as its own Response).
  const download = (who: SignedIn, url: string) =>
    who
      .get(url)
      .buffer(true)
      .parse((response, callback) => binary(response as unknown as NodeJS.ReadableStream, callback));

  beforeAll(async () => {
    context = await createTestContext({ decisions: true });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    for (const role of roles) signedIn.set(role, await context.signInAs(role));
    signedIn.set('slate-harbor-admin', await context.signInAs('admin', 'slateHarbor'));
    consultant = signedIn.get('consultant')!;
    const rows = context.db.$client.prepare('select id, status from decision_records where organization_id = ? order by id').all(ridgeback) as Array<{
      id: number;
      status: string;
    }>;
    approvedIds = rows.filter((row) => row.status === 'approved').map((row) => row.id);
    draftId = rows.find((row) => row.status === 'draft')!.id;
    returnedId = rows.find((row) => row.status === 'returned')!.id;
    folder = mkdtempSync(join(tmpdir(), 'bellwether-evidence-'));
  }, 180_000);
  afterAll(async () => {
    rmSync(folder, { recursive: true, force: true });
    await context.close();
  });

  it('lets exactly the roles holding evidence:export (admin, consultant) download a pack, and audits each export', async () => {
    const record = approvedIds[0]!;
    const before = auditOf(context.db, 'decision_record', record).filter((event) => event.action === 'evidence_exported').length;
    for (const role of roles) {
      const answer = await download(signedIn.get(role)!, packUrl(ridgeback, record));
      expect(answer.status, role).toBe(can(role, 'evidence:export') ? 200 : 403);
    }
    const exports = auditOf(context.db, 'decision_record', record).filter((event) => event.action === 'evidence_exported');
    expect(exports.length - before).toBe(roles.filter((role) => can(role, 'evidence:export')).length);
    expect(exports.at(-1)!.after).toMatchObject({ format: 'zip' });
  }, 120_000);

  it('answers 404 for a record of another organization, whichever organization the path names', async () => {
    const slateRecord = (
      context.db.$client.prepare("select id from decision_records where organization_id = ? and status = 'approved'").get(slateHarbor) as { id: number }
    ).id;
    // Slate Harbor's admin asking through Slate Harbor's path for Ridgeback's record.
    expect((await download(signedIn.get('slate-harbor-admin')!, packUrl(slateHarbor, approvedIds[0]!))).status).toBe(404);
    // Ridgeback's admin asking through Ridgeback's path for Slate Harbor's record, and through Slate Harbor's path.
    expect((await download(signedIn.get('admin')!, packUrl(ridgeback, slateRecord))).status).toBe(404);
    expect((await download(signedIn.get('admin')!, packUrl(slateHarbor, slateRecord))).status).toBe(404);
    expect((await download(consultant, packUrl(ridgeback, 999_999))).status).toBe(404);
  });

  it('refuses drafts and returned records with 409 naming the status', async () => {
    for (const [record, status] of [
      [draftId, 'draft'],
      [returnedId, 'returned'],
    ] as const) {
      const answer = await consultant.get(packUrl(ridgeback, record));
      expect(answer.status).toBe(409);
      expect(answer.body.error.message).toBe(`Decision record ${record} is ${status}; an evidence pack is made only from an approved record`);
    }
  });

  it('gives a consultant a pack for every approved demo decision in both organizations, with a safe file name', async () => {
    const approved = context.db.$client.prepare("select id, organization_id as organizationId from decision_records where status = 'approved'").all() as Array<{
      id: number;
      organizationId: number;
    }>;
    expect(approved.length).toBe(3);
    for (const record of approved) {
      const answer = await download(consultant, packUrl(record.organizationId, record.id));
      expect(answer.status).toBe(200);
      expect(answer.headers['content-type']).toBe('application/zip');
      expect(answer.headers['content-disposition']).toMatch(new RegExp(`^attachment; filename="evidence-pack-record-${record.id}-[a-z0-9-]+\\.zip"$`));
      const files = await unzip(answer.body as Buffer);
      expect([...files.keys()].sort()).toEqual(['README.txt', 'data-hash-input.json', 'data.csv', 'evidence-pack.pdf', 'groups.json', 'record.json']);
    }
  }, 120_000);

  describe.each([0, 1])('the pack of approved Ridgeback record #%i', (index) => {
    let files: Map<string, Buffer>;
    let record: DecisionRecordView & { figures: NonNullable<DecisionRecordView['figures']> };
    let pdfText: string;

    beforeAll(async () => {
      const answer = await download(consultant, packUrl(ridgeback, approvedIds[index]!));
      expect(answer.status).toBe(200);
      files = await unzip(answer.body as Buffer);
      record = (JSON.parse(files.get('record.json')!.toString('utf8')) as { record: typeof record }).record;
      const parser = new PDFParse({ data: new Uint8Array(files.get('evidence-pack.pdf')!) });
      pdfText = (await parser.getText()).text;
      await parser.destroy();
    }, 60_000);

    it('record.json is the record the API shows, frozen figures included', async () => {
      const view = (await consultant.get(`/api/orgs/${ridgeback}/decision-records/${record.id}`)).body as DecisionRecordView;
      expect(record).toEqual(view);
      expect(record.status).toBe('approved');
      expect(record.dataHash).toMatch(/^[0-9a-f]{64}$/);
    });

    it('the PDF text shows GM, GSD, P95, UTL, exceedance fraction, category, judgement, approver, data hash and the cautions', () => {
      const classical = record.figures.classical;
      // Printed at 4 significant digits: a rounding error of at most half a unit in the 4th digit (relative 5e-4).
      const printed: Array<[string, number]> = [
        ['Geometric mean (GM)', classical.gm],
        ['Geometric standard deviation (GSD)', classical.gsd],
        ['95th percentile (P95)', classical.p95],
        ['Upper tolerance limit (UTL 95%, 95%)', classical.utl95_95],
        ['Exceedance fraction', classical.exceedanceFraction],
      ];
      for (const [label, value] of printed) {
        const shown = numberAfter(pdfText, label);
        expect(Math.abs(shown - value) / Math.abs(value), `${label}: PDF ${shown}, record ${value}`).toBeLessThanOrEqual(5e-4);
      }
      expect(pdfText).toContain(`Exposure category ${categoryLabel(record.category)}`);
      expect(pdfText).toMatch(new RegExp(`Judgement ${record.judgement}`, 'i'));
      expect(pdfText).toContain(`Approved by ${record.approver!.name}, ${record.approvedAt!.slice(0, 10)}`);
      expect(pdfText).toContain(`Data hash (SHA-256) ${record.dataHash}`);
      // PRODUCT.md "Cautions shown in the product": both sentences, in the PDF.
      expect(pdfText.replace(/\s+/g, ' ')).toContain('Statistics support and never replace the judgement of a qualified hygienist');
      expect(pdfText.replace(/\s+/g, ' ')).toContain('come from the local regulations that apply; follow them and licensed or certified professional practice');
      for (const result of record.figures.data.results) expect(pdfText).toContain(`${result.id} ${result.workerCode} ${result.date}`);
    });

    it('every sentence the PDF prints (methods, notes, cautions, rationale) fits the embedded font once spelled out', () => {
      const covers = latinSubsetCovers();
      const figures = record.figures;
      const texts = [
        ...record.cautions,
        ...figures.classical.methods,
        figures.classical.fit.methodNote,
        figures.classical.managerSentence,
        figures.bayes?.method ?? '',
        figures.bayes?.judgementRule ?? '',
        figures.group.oelStatement,
        figures.hearingConservation?.statement ?? '',
        record.rationale,
        record.actions,
        record.reviewDateSource,
      ];
      const missing = texts.flatMap((text) => [...printable(text)].filter((character) => !covers(character)));
      expect([...new Set(missing)]).toEqual([]);
      // The spelling-out is what makes them fit: the engine's notes do use Greek letters.
      expect(texts.join(' ')).toMatch(/[μσΦ]/);
    });

    it('the first page renders (pdftoppm) to a PNG with ink on it, not a blank page', () => {
      const pdfPath = join(folder, `record-${record.id}.pdf`);
      writeFileSync(pdfPath, files.get('evidence-pack.pdf')!);
      execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '50', '-f', '1', '-l', '1', '-singlefile', pdfPath, join(folder, `page-${record.id}`)]);
      const png = readFileSync(join(folder, `page-${record.id}.png`));
      expect(png.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
      // The same page as grey levels (PGM is trivial to read) to count the pixels that are not paper.
      execFileSync('/usr/bin/pdftoppm', ['-gray', '-r', '50', '-f', '1', '-l', '1', '-singlefile', pdfPath, join(folder, `gray-${record.id}`)]);
      const share = inkShare(readFileSync(join(folder, `gray-${record.id}.pgm`)));
      // A text page at 50 dpi is a few percent ink; a blank page is 0 (common practice, about 7 % on the silica pack when written).
      expect(share).toBeGreaterThan(0.005);
      expect(share).toBeLessThan(0.5);
    });

    it('self-consistency: the data hash is the SHA-256 of data-hash-input.json and of the data rebuilt from data.csv', () => {
      expect(createHash('sha256').update(files.get('data-hash-input.json')!).digest('hex')).toBe(record.dataHash);
      const rows = Papa.parse<Record<string, string>>(files.get('data.csv')!.toString('utf8'), { header: true, skipEmptyLines: true }).data;
      const results: AssessmentResult[] = rows.map((row) => ({
        id: Number(row.result_id),
        workerCode: row.worker_code!,
        date: row.date!,
        value: Number(row.value!.replace(/^</, '')),
        nonDetect: row.non_detect === 'true',
        source: row.source as AssessmentResult['source'],
      }));
      const groups = JSON.parse(files.get('groups.json')!.toString('utf8')) as Record<string, { oel: number; actionLevel?: number }>;
      const limits = groups[record.figures.group.name]!;
      expect(assessmentDataHash({ results, oel: limits.oel, actionLevel: limits.actionLevel ?? null, settings: record.figures.settings })).toBe(
        record.dataHash,
      );
    });

    it('self-consistency: pack recomputation — the engine on data.csv gives every figure of record.json', () => {
      const rows = Papa.parse<Record<string, string>>(files.get('data.csv')!.toString('utf8'), { header: true, skipEmptyLines: true }).data;
      const values: ShiftValue[] = rows.map((row) => ({
        value: Number(row.value!.replace(/^</, '')),
        nonDetect: row.value!.startsWith('<'),
        worker: row.worker_code!,
        date: row.date!,
      }));
      const { group, settings } = record.figures;
      const classical = classicalOutcome({
        values,
        oel: group.oel,
        seed: settings.seed,
        ...(group.actionLevel === null ? {} : { actionLevel: group.actionLevel }),
      });
      expect(classical.refusal).toBeNull();
      if (classical.refusal !== null) return;
      expectSameFigures(classical.assessment, record.figures.classical, 'classical');
      expectSameFigures(classical.betweenWorker, record.figures.betweenWorker, 'betweenWorker');
      const job = { values, oel: group.oel, seed: settings.seed, prior: settings.prior, unacceptableThreshold: settings.unacceptableThreshold };
      expectSameFigures(bayesViewOf(job).view, record.figures.bayes, 'bayes');
      expectSameFigures(plannerOf(job).plan, record.figures.planner, 'planner');
    }, 120_000);

    it('self-consistency: pack recomputation — the README command (`assess` on data.csv and groups.json) prints record.figures.report', () => {
      const pack = join(folder, `pack-${record.id}`);
      execFileSync('mkdir', ['-p', pack]);
      for (const name of ['data.csv', 'groups.json']) writeFileSync(join(pack, name), files.get(name)!);
      const readme = files.get('README.txt')!.toString('utf8');
      const command = /npm run -s assess -- (.+)$/m.exec(readme)![1]!.replaceAll('PACK', pack).split(' ');
      let printed = '';
      const code = assessMain(command, { stdout: (text: string) => (printed += text), stderr: (text: string) => (printed += text) }, { bayesWorkers: false });
      expect(code, printed).toBe(0);
      const report = (JSON.parse(printed) as { groups: unknown[] }).groups;
      expect(report.length).toBe(1);
      expectSameFigures(report[0], record.figures.report, 'report');
    }, 120_000);
  });

  it('serves the PDF alone with the same figures, and the same record always gives the same PDF bytes', async () => {
    const first = await download(consultant, packUrl(ridgeback, approvedIds[0]!, 'pdf'));
    const second = await download(consultant, packUrl(ridgeback, approvedIds[0]!, 'pdf'));
    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toBe('application/pdf');
    expect((first.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(Buffer.compare(first.body as Buffer, second.body as Buffer)).toBe(0);
  });
});
