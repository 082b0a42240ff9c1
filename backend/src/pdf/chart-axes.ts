/**
 * Plot frames for the vector charts (charts.ts): a rectangle in page points, x and y scales
 * (linear, logarithmic, or given by a function such as the normal score), and axes with ticks and
 * labels drawn as pdfkit paths and text — never raster images, so charts stay sharp when zoomed.
 */
import { fonts, pdfColours } from './document';

type Doc = PDFKit.PDFDocument;

/** A scale maps a data value to a fraction 0…1 of its axis. */
export interface Scale {
  toFraction(value: number): number;
  ticks: ReadonlyArray<{ value: number; label: string }>;
}

/** A "nice" step (1, 2 or 5 × 10^k) giving about `count` ticks over [low, high] (common practice). */
function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const scaled = raw / power;
  return (scaled <= 1 ? 1 : scaled <= 2 ? 2 : scaled <= 5 ? 5 : 10) * power;
}

/** A short label for a tick value (no trailing zeros, at most 4 significant digits). */
export function tickLabel(value: number): string {
  if (value === 0) return '0';
  const text = Number(value.toPrecision(4)).toString();
  return text.length > 8 ? value.toExponential(1) : text;
}

/** A linear scale from `low` to a nice number at or above `high`, with about five ticks. */
export function linearScale(low: number, high: number, tickCount = 5): Scale {
  const top = high > low ? high : low + 1;
  const step = niceStep(top - low, tickCount);
  const start = Math.floor(low / step) * step;
  const end = Math.ceil(top / step) * step;
  const ticks: Array<{ value: number; label: string }> = [];
  for (let value = start; value <= end + step / 2; value += step) ticks.push({ value, label: tickLabel(Number(value.toPrecision(12))) });
  return { toFraction: (value) => (value - start) / (end - start), ticks };
}

/** A base-10 logarithmic scale over whole decades around [low, high] (both > 0), ticks at 1, 2 and 5 × 10^k. */
export function logScale(low: number, high: number): Scale {
  const from = Math.floor(Math.log10(low));
  const to = Math.max(from + 1, Math.ceil(Math.log10(high)));
  const ticks: Array<{ value: number; label: string }> = [];
  for (let power = from; power <= to; power += 1) {
    for (const multiple of to - from > 3 ? [1] : [1, 2, 5]) {
      const value = multiple * 10 ** power;
      if (value <= 10 ** to * 1.0001) ticks.push({ value, label: tickLabel(value) });
    }
  }
  return { toFraction: (value) => (Math.log10(value) - from) / (to - from), ticks };
}

/** A scale through any increasing transform (e.g. cumulative probability → normal score), with given ticks. */
export function transformedScale(
  transform: (value: number) => number,
  low: number,
  high: number,
  ticks: ReadonlyArray<{ value: number; label: string }>,
): Scale {
  const start = transform(low);
  const end = transform(high);
  return { toFraction: (value) => (transform(value) - start) / (end - start), ticks };
}

/** The plotting rectangle and its scales; `point` turns data into page coordinates. */
export interface PlotFrame {
  left: number;
  top: number;
  width: number;
  height: number;
  x: Scale;
  y: Scale;
  point(x: number, y: number): [number, number];
}

/**
 * Draw a frame: a title above, the plot border, grid lines and tick labels, and the axis titles.
 * `box` is the whole chart area (title and labels included); the plot area sits inside it.
 */
export function drawFrame(
  doc: Doc,
  box: { left: number; top: number; width: number; height: number },
  scales: { x: Scale; y: Scale },
  labels: { title: string; x: string; y: string },
): PlotFrame {
  const plot = { left: box.left + 48, top: box.top + 20, width: box.width - 60, height: box.height - 58 };
  const point = (x: number, y: number): [number, number] => [
    plot.left + scales.x.toFraction(x) * plot.width,
    plot.top + plot.height - scales.y.toFraction(y) * plot.height,
  ];
  doc.save();
  doc.font(fonts.bold).fontSize(9.5).fillColor(pdfColours.ink).text(labels.title, box.left, box.top, { width: box.width, lineBreak: false });
  doc.font(fonts.regular).fontSize(7.5).fillColor(pdfColours.muted);
  for (const tick of scales.y.ticks) {
    const fraction = scales.y.toFraction(tick.value);
    if (fraction < -1e-9 || fraction > 1 + 1e-9) continue;
    const y = plot.top + plot.height - fraction * plot.height;
    doc
      .moveTo(plot.left, y)
      .lineTo(plot.left + plot.width, y)
      .lineWidth(0.3)
      .strokeColor(pdfColours.rule)
      .stroke();
    doc.text(tick.label, plot.left - 46, y - 4, { width: 42, align: 'right', lineBreak: false });
  }
  for (const tick of scales.x.ticks) {
    const fraction = scales.x.toFraction(tick.value);
    if (fraction < -1e-9 || fraction > 1 + 1e-9) continue;
    const x = plot.left + fraction * plot.width;
    doc
      .moveTo(x, plot.top + plot.height)
      .lineTo(x, plot.top + plot.height + 3)
      .lineWidth(0.5)
      .strokeColor(pdfColours.muted)
      .stroke();
    doc.text(tick.label, x - 25, plot.top + plot.height + 5, { width: 50, align: 'center', lineBreak: false });
  }
  doc.rect(plot.left, plot.top, plot.width, plot.height).lineWidth(0.7).strokeColor(pdfColours.muted).stroke();
  doc.fontSize(8).fillColor(pdfColours.ink);
  doc.text(labels.x, plot.left, plot.top + plot.height + 18, { width: plot.width, align: 'center', lineBreak: false });
  // The y title runs up the left edge.
  doc.save();
  doc.rotate(-90, { origin: [box.left + 6, plot.top + plot.height / 2] });
  doc.text(labels.y, box.left + 6 - plot.height / 2, plot.top + plot.height / 2 - 4, { width: plot.height, align: 'center', lineBreak: false });
  doc.restore();
  doc.restore();
  return { ...plot, x: scales.x, y: scales.y, point };
}

/** A horizontal reference line across the plot (OEL, 95th percentile) with its label at the right end. */
export function referenceLine(
  doc: Doc,
  frame: PlotFrame,
  value: number,
  label: string,
  colour: string,
  options: { dash?: boolean; align?: 'left' | 'right' } = {},
): void {
  const fraction = frame.y.toFraction(value);
  if (fraction < 0 || fraction > 1) return;
  const y = frame.top + frame.height - fraction * frame.height;
  doc.save();
  if (options.dash) doc.dash(4, { space: 3 });
  doc
    .moveTo(frame.left, y)
    .lineTo(frame.left + frame.width, y)
    .lineWidth(1)
    .strokeColor(colour)
    .stroke();
  doc.undash();
  doc
    .font(fonts.bold)
    .fontSize(7.5)
    .fillColor(colour)
    .text(label, frame.left + 4, y - 10, { width: frame.width - 8, align: options.align ?? 'right', lineBreak: false });
  doc.restore();
}
