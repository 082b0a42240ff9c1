/**
 * The evidence pack's PDF: one approved decision record as a document someone outside Bellwether can
 * read and check — summary, group definition, judgement and rationale, key figures, charts (vector),
 * methods with their sources, the data table, approvals, the data hash and how to recompute, cautions.
 * Every number printed comes from the record's frozen figures; nothing is recomputed here.
 */
import { exposureUnitLabels } from '@schema/agents';
import { categoryLabel } from './category-palette';
import { categoryProbabilityBar, histogramChart, percent, probabilityPlotChart, timeSeriesChart } from './charts';
import { cautionBox, createPdfDocument, documentToBuffer, ensureSpace, heading, labelledLines, paragraph, table } from './document';
import type { FrozenRecord, PackContext } from '../services/evidence-pack-files';

/** A figure at 4 significant digits (the precision the record page shows; record.json keeps full precision). */
export function figureText(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return 'n/a';
  return Number(value.toPrecision(4)).toString();
}

const judgementWords = { acceptable: 'Acceptable', uncertain: 'Uncertain', unacceptable: 'Unacceptable' } as const;

function dateOf(stamp: string | null): string {
  return stamp ? `${stamp.slice(0, 10)} ${stamp.slice(11, 16)} UTC` : 'n/a';
}

type Doc = PDFKit.PDFDocument;

/** Label column width that keeps the 64-character data hash on one line. */
const narrowLabels = 115;

function summarySection(doc: Doc, record: FrozenRecord, context: PackContext): void {
  const group = record.figures.group;
  heading(doc, `Evidence pack · Decision record ${record.id}`, 1);
  paragraph(doc, `${group.name} · ${group.siteName} · ${context.organization.name}`, { size: 11, bold: true });
  labelledLines(
    doc,
    [
      ['Exposure category', categoryLabel(record.category)],
      ['Judgement', judgementWords[record.judgement]],
      ['Status', record.status === 'approved' ? 'Approved' : `Superseded on ${dateOf(record.supersededAt)}`],
      ['Drafted by', `${record.drafter.name}, submitted ${dateOf(record.submittedAt)}`],
      ['Approved by', `${record.approver?.name ?? 'n/a'}, ${dateOf(record.approvedAt)}`],
      ['Review date', `${record.reviewDate} (${record.reviewDateSource})`],
      ['Data hash (SHA-256)', record.dataHash],
      ['Engine version', `Bellwether ${record.figures.engineVersion.application}, statistics ${record.figures.engineVersion.statistics}`],
    ],
    narrowLabels,
  );
}

function groupSection(doc: Doc, record: FrozenRecord, context: PackContext): void {
  const group = record.figures.group;
  const unit = exposureUnitLabels[group.oelUnit];
  const definition = context.groupDefinition;
  heading(doc, 'Exposure group');
  labelledLines(doc, [
    ['Group', group.name],
    ['Site', group.siteName],
    ['Agent', group.agent.name],
    ['Process area', definition.processArea || 'n/a'],
    ['Job titles', definition.jobTitles.join(', ') || 'n/a'],
    ['Tasks', definition.tasks || 'n/a'],
    ['Exposure profile', definition.exposureProfile || 'n/a'],
    ['Shift length', `${definition.shiftHours} h`],
    ['OEL judged against', `${group.oel} ${unit} (${group.oelAveragingTime}); ${group.oelStatement}`],
    ['OEL source', group.oelSource],
    ['Action level', group.actionLevel === null ? 'none set' : `${group.actionLevel} ${unit}`],
  ]);
  if (record.figures.hearingConservation) paragraph(doc, record.figures.hearingConservation.statement, { size: 9.5 });
}

function judgementSection(doc: Doc, record: FrozenRecord): void {
  heading(doc, 'Judgement and rationale');
  paragraph(doc, `${judgementWords[record.judgement]} · category ${categoryLabel(record.category)}`, { bold: true });
  paragraph(doc, record.rationale);
  heading(doc, 'Actions', 3);
  paragraph(doc, record.actions || 'None recorded.');
  paragraph(doc, record.figures.classical.managerSentence, { size: 9.5 });
}

function figuresSection(doc: Doc, record: FrozenRecord): void {
  const classical = record.figures.classical;
  const bayes = record.figures.bayes;
  const unit = exposureUnitLabels[record.figures.group.oelUnit];
  heading(doc, 'Key figures');
  const rows: string[][] = [
    ['Results used (n)', String(classical.n), `${classical.nonDetects} non-detect${classical.nonDetects === 1 ? '' : 's'}`],
    ['Geometric mean (GM)', figureText(classical.gm), unit],
    ['Geometric standard deviation (GSD)', figureText(classical.gsd), ''],
    ['Arithmetic mean (AM)', figureText(classical.am), unit],
    ['95th percentile (P95)', figureText(classical.p95), unit],
    ['Upper tolerance limit (UTL 95%, 95%)', figureText(classical.utl95_95), unit],
    ['Exceedance fraction', figureText(classical.exceedanceFraction), `upper 95% limit ${figureText(classical.exceedanceFractionUcl95)}`],
    ['AM estimate (MVUE or censored fit)', figureText(classical.amMvue), `upper 95% limit ${figureText(classical.amUcl95)} ${unit}`],
    ['Shapiro-Wilk on logs', `W ${figureText(classical.fitCheck.shapiroWilkLog?.w)}`, `p ${figureText(classical.fitCheck.shapiroWilkLog?.p)}`],
    ['EN 689 test', classical.en689.result, ''],
    ['Category by P95', categoryLabel(classical.categoryByP95), ''],
    ['Category by UTL', categoryLabel(classical.categoryByUtl), ''],
    ['Classical judgement', judgementWords[classical.judgement], ''],
    ['Fit method', classical.fit.method, ''],
  ];
  if (bayes) {
    rows.push(
      ['Bayesian GM (median, 95% interval)', figureText(bayes.gm.median), `${figureText(bayes.gm.lower)} to ${figureText(bayes.gm.upper)} ${unit}`],
      ['Bayesian GSD', figureText(bayes.gsd.median), `${figureText(bayes.gsd.lower)} to ${figureText(bayes.gsd.upper)}`],
      ['Bayesian P95', figureText(bayes.p95.median), `${figureText(bayes.p95.lower)} to ${figureText(bayes.p95.upper)} ${unit}`],
    );
    if (bayes.probabilityP95AboveOel !== null)
      rows.push(['P(P95 > OEL)', percent(bayes.probabilityP95AboveOel), `threshold ${percent(bayes.unacceptableThreshold)}`]);
    if (bayes.judgement) rows.push(['Bayesian judgement', judgementWords[bayes.judgement], '']);
  }
  table(
    doc,
    [
      { header: 'Figure', width: 215 },
      { header: 'Value', width: 110, align: 'right' },
      { header: 'Unit or note', width: 170 },
    ],
    rows,
  );
}

function chartsSection(doc: Doc, record: FrozenRecord): void {
  const figures = record.figures;
  const unit = exposureUnitLabels[figures.group.oelUnit];
  const classical = figures.classical;
  // Keep the heading with the first chart (a chart is about 220 pt tall).
  ensureSpace(doc, 260);
  heading(doc, 'Charts');
  probabilityPlotChart(doc, {
    points: classical.probabilityPlot.points,
    line: classical.probabilityPlot.line,
    oel: figures.group.oel,
    p95: classical.p95,
    unit,
  });
  histogramChart(doc, {
    values: figures.data.results.filter((result) => !result.nonDetect).map((result) => result.value),
    nonDetects: classical.nonDetects,
    mu: classical.fit.mu,
    sigma: classical.fit.sigma,
    oel: figures.group.oel,
    unit,
  });
  timeSeriesChart(doc, { points: figures.data.results, oel: figures.group.oel, unit });
  if (figures.bayes?.categoryProbabilities) categoryProbabilityBar(doc, figures.bayes.categoryProbabilities);
  else paragraph(doc, `No Bayesian category probabilities: ${figures.unavailable.bayes ?? 'not computed'}.`, { size: 9.5 });
}

function methodsSection(doc: Doc, record: FrozenRecord): void {
  const figures = record.figures;
  heading(doc, 'Methods and sources');
  paragraph(doc, `Lognormal fit: ${figures.classical.fit.methodNote}`, { size: 9.5 });
  for (const method of figures.classical.methods) paragraph(doc, `• ${method}`, { size: 9.5 });
  if (figures.bayes) {
    paragraph(doc, `• Bayesian view: ${figures.bayes.method}`, { size: 9.5 });
    paragraph(doc, `• Judgement rule (Bayesian): ${figures.bayes.judgementRule}`, { size: 9.5 });
  }
  const settings = figures.settings;
  paragraph(
    doc,
    `Settings: seed ${settings.seed}; prior ${settings.prior}; unacceptable threshold ${settings.unacceptableThreshold} (${settings.unacceptableThresholdSource}); ` +
      `Markov chains ${settings.mcmc.chains} × ${settings.mcmc.kept} kept after ${settings.mcmc.burnIn} burn-in.`,
    { size: 9.5 },
  );
}

function dataSection(doc: Doc, record: FrozenRecord): void {
  const figures = record.figures;
  const unit = exposureUnitLabels[figures.group.oelUnit];
  heading(doc, `Data used (${figures.data.results.length} results, ${unit})`);
  table(
    doc,
    [
      { header: 'Result id', width: 60, align: 'right' },
      { header: 'Worker', width: 80 },
      { header: 'Date', width: 80 },
      { header: `Value (${unit})`, width: 95, align: 'right' },
      { header: 'Non-detect', width: 75 },
      { header: 'Source', width: 105 },
    ],
    figures.data.results.map((result) => [
      String(result.id),
      result.workerCode,
      result.date,
      result.nonDetect ? `<${result.value}` : String(result.value),
      result.nonDetect ? `yes, limit ${result.value}` : 'no',
      result.source,
    ]),
  );
  if (record.frozenInputs.excluded.length > 0) {
    heading(doc, 'Results left out', 3);
    table(
      doc,
      [
        { header: 'Result id', width: 60, align: 'right' },
        { header: 'Worker', width: 70 },
        { header: 'Date', width: 75 },
        { header: 'Value', width: 70, align: 'right' },
        { header: 'Reason', width: 220 },
      ],
      record.frozenInputs.excluded.map((result) => [
        String(result.id),
        result.workerCode,
        result.date,
        result.nonDetect ? `<${result.value}` : String(result.value),
        result.reason,
      ]),
    );
  }
}

function approvalsSection(doc: Doc, record: FrozenRecord): void {
  heading(doc, 'Approvals');
  const rows = [
    ['Drafted and submitted', record.drafter.name, dateOf(record.submittedAt)],
    ['Approved', record.approver?.name ?? 'n/a', dateOf(record.approvedAt)],
    ...record.acknowledgedBy.map((person) => ['Acknowledged', person.name, dateOf(person.at)]),
  ];
  table(
    doc,
    [
      { header: 'Step', width: 160 },
      { header: 'Name', width: 175 },
      { header: 'Date', width: 160 },
    ],
    rows,
  );
}

function reproducibilitySection(doc: Doc, record: FrozenRecord, command: string): void {
  heading(doc, 'Check and recompute');
  labelledLines(
    doc,
    [
      ['Data hash (SHA-256)', record.dataHash],
      ['Hashed text', 'data-hash-input.json in the pack (canonical JSON of the values used, OEL, action level and settings)'],
      ['Recompute with', command],
    ],
    narrowLabels,
  );
  paragraph(doc, 'README.txt in the pack says how the hash is built from data.csv and which engine version to use.', { size: 9.5 });
}

/** The evidence pack PDF; created at the record's approval time so the same record gives the same bytes. */
export function evidencePackPdf(record: FrozenRecord, context: PackContext, command: string): Promise<Buffer> {
  const doc = createPdfDocument({
    title: `Evidence pack · Decision record ${record.id}`,
    organizationName: context.organization.name,
    createdAt: new Date(record.approvedAt),
    subject: `${record.figures.group.name}: exposure category, judgement and the figures they rest on`,
    keywords: `decision record ${record.id}; data hash ${record.dataHash}`,
  });
  summarySection(doc, record, context);
  cautionBox(doc, record.cautions);
  groupSection(doc, record, context);
  judgementSection(doc, record);
  figuresSection(doc, record);
  chartsSection(doc, record);
  methodsSection(doc, record);
  dataSection(doc, record);
  approvalsSection(doc, record);
  reproducibilitySection(doc, record, command);
  return documentToBuffer(doc);
}
