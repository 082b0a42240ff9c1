/**
 * The assessment's Plotly charts. This module is loaded lazily (charts-section.tsx), so Plotly lands in
 * its own chunk and never in the initial bundle (docs: ENVIRONMENT.md, react-plotly.js/factory with
 * plotly.js-dist-min). Every chart has its text alternative in the figure caption outside this chunk;
 * the plot itself is hidden from assistive technology, which reads the caption and the tables instead.
 */
import type { Annotation, Data, Layout, Shape } from 'plotly.js-dist-min';
import Plotly from 'plotly.js-dist-min';
import createPlotlyComponent from 'react-plotly.js/factory';
import { exposureCategories } from '@frontend/components/category-badge';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import type { ChartKind } from '../lib/chart-captions';
import { formatFigure, unitLabel } from '../lib/format-figure';

const Plot = createPlotlyComponent(Plotly);

type Assessment = GroupAssessmentResponse;

/**
 * A CSS colour (e.g. `var(--category-2)`, an oklch() value) as rgb() that Plotly can read: the browser
 * resolves it, a 1-pixel canvas turns it into sRGB. Plotly's colour parser does not know oklch().
 */
const colourCache = new Map<string, string>();
function cssColour(expression: string, fallback: string): string {
  const known = colourCache.get(expression);
  if (known) return known;
  let result = fallback;
  try {
    const probe = document.createElement('span');
    probe.style.color = expression;
    document.body.appendChild(probe);
    const resolved = getComputedStyle(probe).color;
    probe.remove();
    const canvas = document.createElement('canvas');
    canvas.width = 1;
    canvas.height = 1;
    const context = canvas.getContext('2d', { willReadFrequently: true });
    if (context && resolved) {
      context.fillStyle = resolved;
      context.fillRect(0, 0, 1, 1);
      const [r, g, b] = context.getImageData(0, 0, 1, 1).data;
      result = `rgb(${r}, ${g}, ${b})`;
    }
  } catch {
    result = fallback;
  }
  colourCache.set(expression, result);
  return result;
}

const ink = '#1e293b';
const muted = '#64748b';
const grid = '#e2e8f0';
const oelColour = '#b91c1c';
const actionColour = '#b45309';
const pointColour = () => cssColour('var(--color-primary-700)', '#1d5566');
const lineColour = () => cssColour('var(--color-primary-500)', '#2f7f93');
const barColour = () => cssColour('var(--color-primary-200)', '#bcdde5');

const font = { family: '"Noto Sans", ui-sans-serif, system-ui, sans-serif', size: 12, color: ink };

function baseLayout(overrides: Partial<Layout>): Partial<Layout> {
  return {
    font,
    margin: { l: 64, r: 16, t: 36, b: 52 },
    paper_bgcolor: 'rgba(0,0,0,0)',
    plot_bgcolor: '#ffffff',
    showlegend: true,
    // Above the plot: below it the legend would collide with the x-axis title.
    legend: { orientation: 'h', x: 0, xanchor: 'left', y: 1.02, yanchor: 'bottom', font: { size: 11, color: ink } },
    hoverlabel: { font: { family: font.family, size: 12 } },
    ...overrides,
  };
}

/** Tick values at 1, 2 and 5 × powers of ten (fewer when the range is wide) covering `low`–`high` (data units). */
function niceLogTicks(low: number, high: number): number[] {
  for (const steps of [[1, 2, 5], [1, 3], [1]]) {
    const ticks: number[] = [];
    for (let power = Math.floor(Math.log10(low)) - 1; power <= Math.ceil(Math.log10(high)) + 1; power++) {
      for (const step of steps) {
        const tick = step * 10 ** power;
        if (tick >= low && tick <= high) ticks.push(Number(tick.toPrecision(6)));
      }
    }
    if (ticks.length <= 9 || steps.length === 1) return ticks;
  }
  return [];
}

/** A value axis on a log scale whose range covers `values`, labelled 1-2-5 in plain numbers (no minor-digit clutter). */
const logAxis = (title: string, values: readonly number[]) => {
  const low = Math.min(...values) / 1.25;
  const high = Math.max(...values) * 1.25;
  const tickvals = niceLogTicks(low, high);
  return {
    type: 'log' as const,
    title: { text: title, font: { size: 12, color: muted } },
    gridcolor: grid,
    zeroline: false,
    range: [Math.log10(low), Math.log10(high)] as [number, number],
    tickvals,
    ticktext: tickvals.map((tick) => formatFigure(tick)),
    automargin: true,
  };
};

function horizontalLine(y: number, colour: string, dash: 'solid' | 'dash' | 'dot'): Partial<Shape> {
  return { type: 'line', xref: 'paper', x0: 0, x1: 1, yref: 'y', y0: y, y1: y, line: { color: colour, width: 1.5, dash } };
}

function lineLabel(y: number, text: string, colour: string, side: 'left' | 'right'): Partial<Annotation> {
  return {
    xref: 'paper',
    x: side === 'right' ? 1 : 0,
    xanchor: side,
    yref: 'y',
    y: Math.log10(y), // annotations on a log axis take log10 positions; shapes take values
    yanchor: 'bottom',
    text,
    showarrow: false,
    font: { size: 11, color: colour },
    bgcolor: 'rgba(255,255,255,0.8)',
  };
}

/** OEL (and action level) as horizontal lines with labels, for charts whose y axis is the value on a log scale. */
function limitLines(
  assessment: Assessment,
  extra: Array<{ value: number; label: string; colour: string; dash: 'solid' | 'dash' | 'dot'; side?: 'left' | 'right' }> = [],
  actionLevelSide: 'left' | 'right' = 'right',
) {
  const { group } = assessment;
  const unit = unitLabel(group.oelUnit);
  const lines: Array<{ value: number; label: string; colour: string; dash: 'solid' | 'dash' | 'dot'; side?: 'left' | 'right' }> = [
    { value: group.oel, label: `OEL ${formatFigure(group.oel)} ${unit}`, colour: oelColour, dash: 'solid' },
    ...extra,
  ];
  if (group.actionLevel !== null) {
    const level = group.actionLevel;
    lines.push({ value: level, label: `Action level ${formatFigure(level)} ${unit}`, colour: actionColour, dash: 'dot', side: actionLevelSide });
  }
  return {
    shapes: lines.map((line) => horizontalLine(line.value, line.colour, line.dash)),
    annotations: lines.map((line) => lineLabel(line.value, line.label, line.colour, line.side ?? 'right')),
    /** Every line's value, so the value axis can be made to show them all. */
    values: lines.map((line) => line.value),
  };
}

const detectedMarker = () => ({ color: pointColour(), size: 8, symbol: 'circle' as const, line: { color: '#ffffff', width: 1 } });
const nonDetectMarker = () => ({ color: pointColour(), size: 9, symbol: 'circle-open' as const, line: { color: pointColour(), width: 2 } });
const leftOutMarker = { color: '#94a3b8', size: 9, symbol: 'x-thin-open' as const, line: { color: '#94a3b8', width: 2 } };

/** Standard normal quantiles of the probabilities marked on the probability plot's axis. */
const probabilityTicks: Array<[number, string]> = [
  [-2.3263, '1 %'],
  [-1.6449, '5 %'],
  [-1.2816, '10 %'],
  [-0.6745, '25 %'],
  [0, '50 %'],
  [0.6745, '75 %'],
  [1.2816, '90 %'],
  [1.6449, '95 %'],
  [2.3263, '99 %'],
];

function probabilityFigure(assessment: Assessment): { data: Data[]; layout: Partial<Layout> } {
  const { classical, group } = assessment;
  const unit = unitLabel(group.oelUnit);
  const { points, line } = classical.probabilityPlot;
  const zs = points.map((point) => point.z);
  const low = Math.min(-2.4, Math.min(...zs) - 0.3);
  const high = Math.max(2.4, Math.max(...zs) + 0.3);
  const lineZ = Array.from({ length: 41 }, (_, i) => low + ((high - low) * i) / 40);
  const detected = points.filter((point) => !point.nonDetect);
  const censored = points.filter((point) => point.nonDetect);
  const plotted = (name: string, subset: typeof points, marker: object, prefix: string): Data => ({
    type: 'scatter',
    mode: 'markers',
    name,
    x: subset.map((point) => point.z),
    y: subset.map((point) => point.value),
    customdata: subset.map((point) => `${formatFigure(point.p * 100)} %`),
    marker,
    hovertemplate: `${prefix}%{y:.4g} ${unit}<br>plotting position %{customdata}<extra></extra>`,
  });
  const data: Data[] = [
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Fitted lognormal',
      x: lineZ,
      y: lineZ.map((z) => Math.exp(line.intercept + line.slope * z)),
      line: { color: lineColour(), width: 2 },
      hoverinfo: 'skip',
    },
    plotted('Result', detected, detectedMarker(), ''),
  ];
  if (censored.length > 0) data.push(plotted('Non-detect (at its fitted value)', censored, nonDetectMarker(), 'Non-detect, plotted at '));
  // On a probability plot the highest results sit on the right, near the limit lines: their labels go left.
  const { values: lineValues, ...lines } = limitLines(
    assessment,
    [{ value: classical.p95, label: `P95 ${formatFigure(classical.p95)} ${unit}`, colour: lineColour(), dash: 'dash', side: 'left' }],
    'left',
  );
  return {
    data,
    layout: baseLayout({
      xaxis: {
        title: { text: 'Cumulative probability (normal scale)', font: { size: 12, color: muted } },
        tickvals: probabilityTicks.map(([z]) => z),
        ticktext: probabilityTicks.map(([, label]) => label),
        tickangle: 0,
        tickfont: { size: 10 },
        range: [low, high],
        gridcolor: grid,
        zeroline: false,
      },
      yaxis: logAxis(`Value (${unit})`, [...points.map((point) => point.value), ...lineValues]),
      ...lines,
    }),
  };
}

/** Ticks at 1, 2 and 5 × powers of ten within [low, high] (log10 units), labelled with the value. */
function logTicks(low: number, high: number): { tickvals: number[]; ticktext: string[] } {
  const tickvals: number[] = [];
  for (let power = Math.floor(low) - 1; power <= Math.ceil(high) + 1; power++) {
    for (const step of [1, 2, 5]) {
      const position = power + Math.log10(step);
      if (position >= low && position <= high) tickvals.push(position);
    }
  }
  return { tickvals, ticktext: tickvals.map((position) => formatFigure(10 ** position)) };
}

function histogramFigure(assessment: Assessment): { data: Data[]; layout: Partial<Layout> } {
  const { classical, group, data: used } = assessment;
  const unit = unitLabel(group.oelUnit);
  const detected = used.results.filter((result) => !result.nonDetect).map((result) => Math.log10(result.value));
  const limits = used.results.filter((result) => result.nonDetect).map((result) => Math.log10(result.value));
  const all = [...detected, ...limits];
  const low = Math.min(...detected);
  const high = Math.max(...detected);
  const bins = Math.max(3, Math.min(12, Math.ceil(Math.sqrt(detected.length)) + 1));
  const width = high > low ? (high - low) / bins : 0.2;
  const start = high > low ? low : low - width / 2;
  const counts = new Array<number>(bins).fill(0);
  for (const x of detected) counts[Math.min(bins - 1, Math.floor((x - start) / width))]++;
  const centres = counts.map((_, i) => start + (i + 0.5) * width);
  // The fitted lognormal is normal in log10 units: mean μ/ln 10, SD σ/ln 10; scaled to n results per bin width.
  const mean = classical.fit.mu / Math.LN10;
  const sd = classical.fit.sigma / Math.LN10;
  const oelLog = Math.log10(group.oel);
  const from = Math.min(start, ...all, oelLog, mean - 3 * sd) - width / 2;
  const to = Math.max(start + bins * width, ...all, oelLog, mean + 3 * sd) + width / 2;
  const grid80 = Array.from({ length: 81 }, (_, i) => from + ((to - from) * i) / 80);
  const density = grid80.map((x) => (classical.n * width * Math.exp(-0.5 * ((x - mean) / sd) ** 2)) / (sd * Math.sqrt(2 * Math.PI)));
  const data: Data[] = [
    {
      type: 'bar',
      name: 'Detected results',
      x: centres,
      y: counts,
      width: counts.map(() => width * 0.96),
      marker: { color: barColour(), line: { color: pointColour(), width: 1 } },
      customdata: centres.map((centre) => `${formatFigure(10 ** (centre - width / 2))}–${formatFigure(10 ** (centre + width / 2))}`),
      hovertemplate: `%{customdata} ${unit}: %{y} results<extra></extra>`,
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Fitted lognormal density',
      x: grid80,
      y: density,
      line: { color: lineColour(), width: 2 },
      hoverinfo: 'skip',
    },
  ];
  if (limits.length > 0) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'Non-detect (at its detection limit)',
      x: limits,
      y: limits.map(() => 0.15),
      marker: nonDetectMarker(),
      customdata: limits.map((x) => formatFigure(10 ** x)),
      hovertemplate: `Non-detect: below %{customdata} ${unit}<extra></extra>`,
    });
  }
  const top = Math.max(...counts, ...density);
  return {
    data,
    layout: baseLayout({
      bargap: 0,
      xaxis: {
        title: { text: `Value (${unit}, logarithmic scale)`, font: { size: 12, color: muted } },
        ...logTicks(from, to),
        range: [from, to],
        gridcolor: grid,
        zeroline: false,
      },
      yaxis: {
        title: { text: 'Results', font: { size: 12, color: muted } },
        gridcolor: grid,
        range: [0, top * 1.15],
        dtick: top > 10 ? undefined : 1,
        zeroline: false,
      },
      shapes: [{ type: 'line', xref: 'x', x0: oelLog, x1: oelLog, yref: 'paper', y0: 0, y1: 1, line: { color: oelColour, width: 1.5 } }],
      annotations: [
        {
          xref: 'x',
          x: oelLog,
          xanchor: 'right',
          yref: 'paper',
          y: 1,
          yanchor: 'top',
          text: `OEL ${formatFigure(group.oel)} ${unit} `,
          showarrow: false,
          font: { size: 11, color: oelColour },
        },
      ],
    }),
  };
}

function categoriesFigure(assessment: Assessment): { data: Data[]; layout: Partial<Layout> } {
  const probabilities = assessment.bayes?.categoryProbabilities ?? [0, 0, 0, 0, 0];
  const data: Data[] = probabilities.map((probability, category) => {
    const entry = exposureCategories[category];
    const percent = probability * 100;
    return {
      type: 'bar',
      orientation: 'h',
      name: `${category} · ${entry.word}`,
      y: ['P95'],
      x: [percent],
      marker: { color: cssColour(`var(--category-${category})`, '#cccccc'), line: { color: '#ffffff', width: 1 } },
      text: [percent >= 6 ? `${category} · ${Math.round(percent)} %` : ''],
      textposition: 'inside',
      insidetextanchor: 'middle',
      textfont: { color: cssColour(`var(--category-${category}-ink)`, ink), size: 12 },
      hovertemplate: `Category ${category} (${entry.word}, ${entry.band}): ${formatFigure(percent)} %<extra></extra>`,
    } satisfies Data;
  });
  return {
    data,
    layout: baseLayout({
      barmode: 'stack',
      height: 150,
      margin: { l: 16, r: 16, t: 8, b: 36 },
      xaxis: { range: [0, 100], ticksuffix: ' %', gridcolor: grid, zeroline: false, fixedrange: true },
      yaxis: { visible: false, fixedrange: true },
      legend: { orientation: 'h', x: 0, y: -0.45, yanchor: 'top', traceorder: 'normal', font: { size: 11, color: ink } },
    }),
  };
}

function timeFigure(assessment: Assessment): { data: Data[]; layout: Partial<Layout> } {
  const { data: used, group } = assessment;
  const unit = unitLabel(group.oelUnit);
  const trace = (name: string, results: Assessment['data']['results'], marker: object, prefix = ''): Data => ({
    type: 'scatter',
    mode: 'markers',
    name,
    x: results.map((result) => result.date),
    y: results.map((result) => result.value),
    text: results.map((result) => result.workerCode),
    marker,
    hovertemplate: `%{x|%d %b %Y} · %{text}<br>${prefix}%{y:.4g} ${unit}<extra></extra>`,
  });
  const data: Data[] = [
    trace(
      'Result',
      used.results.filter((result) => !result.nonDetect),
      detectedMarker(),
    ),
  ];
  const censored = used.results.filter((result) => result.nonDetect);
  if (censored.length > 0) data.push(trace('Non-detect (at its detection limit)', censored, nonDetectMarker(), 'below '));
  if (used.excluded.length > 0) data.push(trace('Left out (what-if)', used.excluded, leftOutMarker));
  const { values: lineValues, ...lines } = limitLines(assessment);
  return {
    data,
    layout: baseLayout({
      xaxis: { type: 'date', gridcolor: grid, automargin: true, title: { text: 'Date', font: { size: 12, color: muted } } },
      yaxis: logAxis(`Value (${unit})`, [...used.results, ...used.excluded].map((result) => result.value).concat(lineValues)),
      ...lines,
    }),
  };
}

function workersFigure(assessment: Assessment): { data: Data[]; layout: Partial<Layout> } {
  const { data: used, group } = assessment;
  const unit = unitLabel(group.oelUnit);
  const codes = [...new Set([...used.results, ...used.excluded].map((result) => result.workerCode))].sort();
  const position = new Map(codes.map((code, index) => [code, index]));
  // A fixed, small horizontal spread so points of one worker do not hide each other (no randomness: the chart is the same every time).
  const jitter = (index: number) => ((index % 5) - 2) * 0.07;
  const data: Data[] = codes.map((code, index) => {
    const values = used.results.filter((result) => result.workerCode === code).map((result) => result.value);
    return {
      type: 'box',
      name: code,
      x: values.map(() => index),
      y: values,
      boxpoints: false,
      width: 0.5,
      fillcolor: 'rgba(148, 163, 184, 0.15)',
      line: { color: '#94a3b8', width: 1 },
      showlegend: false,
      hoverinfo: 'skip',
    } satisfies Data;
  });
  const points = (name: string, results: Assessment['data']['results'], marker: object, prefix = ''): Data => ({
    type: 'scatter',
    mode: 'markers',
    name,
    x: results.map((result, i) => (position.get(result.workerCode) ?? 0) + jitter(i)),
    y: results.map((result) => result.value),
    text: results.map((result) => `${result.workerCode} · ${result.date}`),
    marker,
    hovertemplate: `%{text}<br>${prefix}%{y:.4g} ${unit}<extra></extra>`,
  });
  data.push(
    points(
      'Result',
      used.results.filter((result) => !result.nonDetect),
      detectedMarker(),
    ),
  );
  const censored = used.results.filter((result) => result.nonDetect);
  if (censored.length > 0) data.push(points('Non-detect (at its detection limit)', censored, nonDetectMarker(), 'below '));
  if (used.excluded.length > 0) data.push(points('Left out (what-if)', used.excluded, leftOutMarker));
  const { values: lineValues, ...lines } = limitLines(assessment);
  return {
    data,
    layout: baseLayout({
      xaxis: {
        tickvals: codes.map((_, index) => index),
        ticktext: codes,
        range: [-0.6, codes.length - 0.4],
        gridcolor: grid,
        zeroline: false,
        title: { text: 'Worker', font: { size: 12, color: muted } },
      },
      yaxis: logAxis(`Value (${unit})`, [...used.results, ...used.excluded].map((result) => result.value).concat(lineValues)),
      ...lines,
    }),
  };
}

const figures: Record<ChartKind, (assessment: Assessment) => { data: Data[]; layout: Partial<Layout> }> = {
  probability: probabilityFigure,
  histogram: histogramFigure,
  categories: categoriesFigure,
  time: timeFigure,
  workers: workersFigure,
};

/** One chart of the assessment page, drawn with Plotly. */
export default function AssessmentChart({ kind, assessment }: { kind: ChartKind; assessment: Assessment }) {
  const { data, layout } = figures[kind](assessment);
  const height = kind === 'categories' ? 150 : 300;
  return (
    <div aria-hidden="true" className="mt-1" data-testid={`chart-${kind}`}>
      <Plot
        data={data}
        layout={{ ...layout, autosize: true, height }}
        config={{ displayModeBar: false, responsive: true, displaylogo: false }}
        useResizeHandler
        style={{ width: '100%', height }}
      />
    </div>
  );
}
