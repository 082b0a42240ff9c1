/**
 * The group charts of PRODUCT.md "Look and feel", drawn as PDF vector paths (pdfkit), for the
 * evidence pack: log-probability plot with the fitted line, OEL and 95th percentile; histogram with
 * the fitted lognormal density; results over time; Bayesian category probabilities as one stacked
 * bar. Each chart draws into a box at the cursor, moves the cursor below it, and takes plain numbers,
 * so it never recomputes a figure: what it shows is what the record froze.
 */
import { normalQuantile } from '@stats/normal-distribution';
import { categoryLabel, categoryScale } from './category-palette';
import { drawFrame, linearScale, logScale, referenceLine, transformedScale } from './chart-axes';
import { contentWidth, ensureSpace, fonts, pdfColours } from './document';

type Doc = PDFKit.PDFDocument;

/** Chart colours (ours): data points, fitted model, OEL, 95th percentile. */
export const chartColours = { point: '#1c6a7d', fitted: '#52606d', oel: '#b42318', p95: '#7a4fb5', bar: '#9fc3cc' } as const;

const chartHeight = 210;

function chartBox(doc: Doc, height = chartHeight): { left: number; top: number; width: number; height: number } {
  ensureSpace(doc, height + 10);
  return { left: doc.page.margins.left, top: doc.y, width: contentWidth(doc), height };
}

function finish(doc: Doc, box: { top: number; height: number }): void {
  doc.x = doc.page.margins.left;
  doc.y = box.top + box.height + 8;
  doc.font(fonts.regular).fontSize(10).fillColor(pdfColours.ink);
}

/** A marker: filled circle for a detected value, hollow for a non-detect (plotted at its detection limit or imputed value). */
function marker(doc: Doc, x: number, y: number, nonDetect: boolean): void {
  doc.circle(x, y, 2.6).lineWidth(0.9);
  if (nonDetect) doc.strokeColor(chartColours.point).stroke();
  else doc.fillColor(chartColours.point).fill();
}

/** Legend entries under a chart title, right-aligned. */
function legend(doc: Doc, box: { left: number; top: number; width: number }, text: string): void {
  doc
    .font(fonts.regular)
    .fontSize(7.5)
    .fillColor(pdfColours.muted)
    .text(text, box.left, box.top + 1, { width: box.width, align: 'right', lineBreak: false });
}

export interface ProbabilityPlotInput {
  points: ReadonlyArray<{ z: number; value: number; nonDetect: boolean }>;
  /** Fitted line ln x = intercept + slope·z. */
  line: { intercept: number; slope: number };
  oel: number;
  p95: number;
  unit: string;
}

const probabilityTicks = [0.01, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 0.99].map((p) => ({ value: p, label: `${Math.round(p * 100)}%` }));

/** Log-probability plot: values (log axis) against normal score, fitted line, OEL and 95th percentile lines. */
export function probabilityPlotChart(doc: Doc, input: ProbabilityPlotInput): void {
  const box = chartBox(doc);
  const values = input.points.map((point) => point.value);
  const scoreLow = Math.min(-2.4, ...input.points.map((point) => point.z));
  const scoreHigh = Math.max(2.4, ...input.points.map((point) => point.z));
  const low = Math.min(...values, Math.exp(input.line.intercept + input.line.slope * scoreLow));
  const high = Math.max(...values, input.oel, input.p95, Math.exp(input.line.intercept + input.line.slope * scoreHigh));
  const y = logScale(low, high);
  // The x axis is the normal score; ticks are labelled with the cumulative probability they stand for.
  const identity = (score: number) => score;
  const x = transformedScale(
    identity,
    scoreLow,
    scoreHigh,
    probabilityTicks.map((tick) => ({ value: normalQuantile(tick.value), label: tick.label })),
  );
  const frame = drawFrame(doc, box, { x, y }, { title: 'Log-probability plot', x: 'Cumulative probability (normal score)', y: `Result (${input.unit})` });
  legend(doc, box, 'filled dot: detected · open circle: non-detect · line: fitted lognormal');
  doc.save();
  doc.rect(frame.left, frame.top, frame.width, frame.height).clip();
  const [x1, y1] = frame.point(scoreLow, Math.exp(input.line.intercept + input.line.slope * scoreLow));
  const [x2, y2] = frame.point(scoreHigh, Math.exp(input.line.intercept + input.line.slope * scoreHigh));
  doc.moveTo(x1, y1).lineTo(x2, y2).lineWidth(1.2).strokeColor(chartColours.fitted).stroke();
  for (const point of input.points) marker(doc, ...frame.point(point.z, point.value), point.nonDetect);
  doc.restore();
  referenceLine(doc, frame, input.oel, `OEL ${input.oel} ${input.unit}`, chartColours.oel);
  referenceLine(doc, frame, input.p95, `95th percentile ${input.p95.toPrecision(3)} ${input.unit}`, chartColours.p95, { dash: true, align: 'left' });
  finish(doc, box);
}

export interface HistogramInput {
  /** Values to bin (detected results; non-detects are counted apart, see `nonDetects`). */
  values: readonly number[];
  nonDetects: number;
  /** Fitted lognormal: μ and σ of the natural logs. */
  mu: number;
  sigma: number;
  oel: number;
  unit: string;
}

/** The lognormal density at x > 0 (Aitchison and Brown, 1957, The Lognormal Distribution, eq. 2.2). */
function lognormalDensity(x: number, mu: number, sigma: number): number {
  const z = (Math.log(x) - mu) / sigma;
  return Math.exp(-0.5 * z * z) / (x * sigma * Math.sqrt(2 * Math.PI));
}

/** Histogram of the results on a linear axis, with the fitted lognormal density scaled to counts (n × bin width × f(x)). */
export function histogramChart(doc: Doc, input: HistogramInput): void {
  const box = chartBox(doc);
  const total = input.values.length + input.nonDetects;
  const top = Math.max(...input.values, input.oel, Math.exp(input.mu + 1.645 * input.sigma));
  const x = linearScale(0, top * 1.05, 6);
  const binCount = Math.max(5, Math.min(20, Math.ceil(Math.sqrt(Math.max(1, input.values.length)) * 2)));
  const upper = x.ticks[x.ticks.length - 1]!.value;
  const binWidth = upper / binCount;
  const counts = new Array<number>(binCount).fill(0);
  for (const value of input.values) counts[Math.min(binCount - 1, Math.floor(value / binWidth))]! += 1;
  const density = Array.from({ length: 121 }, (_, index) => {
    const at = (upper * (index + 0.5)) / 121;
    return { at, count: total * binWidth * lognormalDensity(at, input.mu, input.sigma) };
  });
  const y = linearScale(0, Math.max(1, ...counts, ...density.map((point) => point.count)) * 1.1, 4);
  const frame = drawFrame(doc, box, { x, y }, { title: 'Histogram with fitted lognormal density', x: `Result (${input.unit})`, y: 'Results per bin' });
  legend(
    doc,
    box,
    `bars: detected results${input.nonDetects > 0 ? ` (${input.nonDetects} non-detect${input.nonDetects === 1 ? '' : 's'} not binned)` : ''} · line: fitted density x n x bin width`,
  );
  doc.save();
  doc.rect(frame.left, frame.top, frame.width, frame.height).clip();
  counts.forEach((count, index) => {
    if (count === 0) return;
    const [left, topY] = frame.point(index * binWidth, count);
    const [right, bottom] = frame.point((index + 1) * binWidth, 0);
    doc.rect(left, topY, right - left, bottom - topY).fillAndStroke(chartColours.bar, chartColours.point);
  });
  density.forEach((point, index) => {
    const [px, py] = frame.point(point.at, point.count);
    if (index === 0) doc.moveTo(px, py);
    else doc.lineTo(px, py);
  });
  doc.lineWidth(1.2).strokeColor(chartColours.fitted).stroke();
  // The OEL as a vertical line.
  const [oelX] = frame.point(input.oel, 0);
  doc
    .moveTo(oelX, frame.top)
    .lineTo(oelX, frame.top + frame.height)
    .lineWidth(1)
    .strokeColor(chartColours.oel)
    .stroke();
  doc.restore();
  doc
    .font(fonts.bold)
    .fontSize(7.5)
    .fillColor(chartColours.oel)
    .text(`OEL ${input.oel}`, Math.min(oelX + 3, frame.left + frame.width - 60), frame.top + 3, { width: 60, lineBreak: false });
  finish(doc, box);
}

export interface TimeSeriesInput {
  points: ReadonlyArray<{ date: string; value: number; nonDetect: boolean }>;
  oel: number;
  unit: string;
}

const dayMilliseconds = 86_400_000;

/** Results over time (calendar dates on x, linear y), with the OEL line; non-detects hollow at their detection limit. */
export function timeSeriesChart(doc: Doc, input: TimeSeriesInput): void {
  const box = chartBox(doc);
  const days = input.points.map((point) => Date.parse(`${point.date}T00:00:00Z`) / dayMilliseconds);
  const first = Math.min(...days) - 1;
  const last = Math.max(...days) + 1;
  const xTicks = linearScale(first, last, 5).ticks.map((tick) => ({
    value: tick.value,
    label: new Date(tick.value * dayMilliseconds).toISOString().slice(0, 10),
  }));
  const x = transformedScale((day) => day, first, last, xTicks);
  const y = linearScale(0, Math.max(input.oel, ...input.points.map((point) => point.value)) * 1.1, 5);
  const frame = drawFrame(doc, box, { x, y }, { title: 'Results over time', x: 'Date of the shift', y: `Result (${input.unit})` });
  legend(doc, box, 'filled dot: detected · open circle: non-detect (at its detection limit)');
  doc.save();
  doc.rect(frame.left, frame.top, frame.width, frame.height).clip();
  input.points.forEach((point, index) => marker(doc, ...frame.point(days[index]!, point.value), point.nonDetect));
  doc.restore();
  referenceLine(doc, frame, input.oel, `OEL ${input.oel} ${input.unit}`, chartColours.oel);
  finish(doc, box);
}

/** Percent text for a probability: "12.3%", "<0.1%" for tiny shares. */
export function percent(probability: number): string {
  if (probability > 0 && probability < 0.001) return '<0.1%';
  return `${(probability * 100).toFixed(1)}%`;
}

/**
 * Posterior probabilities of categories 0–4 as one stacked horizontal bar in the category palette, with a
 * legend giving number, word and probability beside each colour (never colour alone).
 */
export function categoryProbabilityBar(doc: Doc, probabilities: readonly number[]): void {
  const box = chartBox(doc, 120);
  const barTop = box.top + 22;
  const barHeight = 26;
  doc
    .font(fonts.bold)
    .fontSize(9.5)
    .fillColor(pdfColours.ink)
    .text('Bayesian probability of each exposure category', box.left, box.top, { width: box.width, lineBreak: false });
  let x = box.left;
  probabilities.forEach((probability, category) => {
    const width = box.width * probability;
    if (width <= 0) return;
    const colours = categoryScale[category]!;
    doc.rect(x, barTop, width, barHeight).fill(colours.fill);
    if (width > 26) {
      doc
        .font(fonts.bold)
        .fontSize(8)
        .fillColor(colours.ink)
        .text(String(category), x, barTop + 8, { width, align: 'center', lineBreak: false });
    }
    x += width;
  });
  doc.rect(box.left, barTop, box.width, barHeight).lineWidth(0.6).strokeColor(pdfColours.muted).stroke();
  // Legend: a swatch, then "N · Word  p%" in two columns.
  const columnWidth = box.width / 3;
  probabilities.forEach((probability, category) => {
    const legendX = box.left + (category % 3) * columnWidth;
    const legendY = barTop + barHeight + 12 + Math.floor(category / 3) * 16;
    doc.rect(legendX, legendY, 10, 10).fillAndStroke(categoryScale[category]!.fill, pdfColours.muted);
    doc
      .font(fonts.regular)
      .fontSize(8.5)
      .fillColor(pdfColours.ink)
      .text(`${categoryLabel(category)}: ${percent(probability)}`, legendX + 14, legendY + 0.5, {
        width: columnWidth - 16,
        lineBreak: false,
      });
  });
  finish(doc, box);
}
