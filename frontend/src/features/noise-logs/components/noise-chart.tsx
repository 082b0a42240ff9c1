/**
 * Time-history chart of a noise log. Loaded lazily by the review page only (React.lazy), so Plotly
 * sits in its own chunk (ENVIRONMENT.md: react-plotly.js/factory with plotly.js-dist-min).
 * Upper plot: LAeq per interval (line) and LCpeak (thin points), masked spans as hatched bands.
 * Lower lane on the same x axis: still stretches as bars and knocks as markers. Colours are our own
 * CSS variables (styles.css, --noise-*). The page states the same facts in tables beside the chart.
 */
import type { Data, Layout, PlotSelectionEvent } from 'plotly.js-dist-min';
import Plotly from 'plotly.js-dist-min';
import { useMemo } from 'react';
import createPlotlyComponent from 'react-plotly.js/factory';
import type { NoiseChannelData, NoiseLogDetail } from '../api/types';
import { clockTime } from '../lib/format-noise';

const Plot = createPlotlyComponent(Plotly);

function cssVariable(name: string, fallback: string): string {
  if (typeof document === 'undefined') return fallback;
  const value = getComputedStyle(document.documentElement).getPropertyValue(name).trim();
  return value || fallback;
}

/** '#1d5566' + alpha → rgba(). */
function withAlpha(hex: string, alpha: number): string {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!match) return hex;
  return `rgba(${parseInt(match[1], 16)}, ${parseInt(match[2], 16)}, ${parseInt(match[3], 16)}, ${alpha})`;
}

export interface NoiseChartProps {
  log: NoiseLogDetail;
  channels: NoiseChannelData;
  /** 'zoom' pans and zooms; 'select' lets the reviewer drag a span to mask. */
  mode: 'zoom' | 'select';
  onSelectSpan: (span: { startS: number; endS: number }) => void;
  onWindowChange: (window: { fromS?: number; toS?: number }) => void;
}

export default function NoiseChart({ log, channels, mode, onSelectSpan, onWindowChange }: NoiseChartProps) {
  const colours = useMemo(
    () => ({
      level: cssVariable('--noise-level', '#1d5566'),
      peak: cssVariable('--noise-peak', '#8a7bb0'),
      mask: cssVariable('--noise-mask', '#475569'),
      still: cssVariable('--noise-still', '#c08a2e'),
      knock: cssVariable('--noise-knock', '#a33a2a'),
      action: cssVariable('--noise-action', '#b45309'),
    }),
    [],
  );
  const minutes = (seconds: number) => seconds / 60;
  const levels = channels.laeqDb;
  const peaks = channels.peak?.lcPeakDb ?? [];
  const low = Math.min(60, ...levels) - 5;
  const high = Math.max(100, ...levels, ...peaks) + 5;

  const data: Data[] = [];
  for (const mask of log.masks) {
    // A filled closed path with a diagonal pattern: a hatched band over the whole level range.
    data.push({
      type: 'scatter',
      mode: 'lines',
      x: [mask.startS, mask.endS, mask.endS, mask.startS, mask.startS].map(minutes),
      y: [low, low, high, high, low],
      fill: 'toself',
      fillcolor: withAlpha(colours.mask, 0.12),
      fillpattern: { shape: '/', fgcolor: withAlpha(colours.mask, 0.55), size: 8, solidity: 0.15 },
      line: { width: 1, color: withAlpha(colours.mask, 0.6) },
      hoverinfo: 'text',
      text: `Masked ${clockTime(mask.startS)}–${clockTime(mask.endS)}: ${mask.reason}`,
      showlegend: false,
      xaxis: 'x',
      yaxis: 'y',
    } as Data);
  }
  data.push({
    type: 'scatter',
    mode: 'lines',
    name: 'LAeq per interval',
    x: channels.tS.map(minutes),
    y: levels,
    line: { color: colours.level, width: 1.2 },
    hovertemplate: '%{y:.1f} dBA<extra>LAeq</extra>',
    xaxis: 'x',
    yaxis: 'y',
  });
  if (channels.peak) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'LCpeak',
      x: channels.peak.tS.map(minutes),
      y: channels.peak.lcPeakDb,
      marker: { color: colours.peak, size: 2.5 },
      hovertemplate: '%{y:.1f} dBC<extra>LCpeak</extra>',
      xaxis: 'x',
      yaxis: 'y',
    });
  }
  for (const stretch of log.stillStretches ?? []) {
    data.push({
      type: 'scatter',
      mode: 'lines',
      x: [stretch.startS, stretch.endS, stretch.endS, stretch.startS, stretch.startS].map(minutes),
      y: [0.15, 0.15, 0.85, 0.85, 0.15],
      fill: 'toself',
      fillcolor: withAlpha(colours.still, 0.75),
      line: { width: 0, color: colours.still },
      name: 'Still stretch',
      hoverinfo: 'text',
      text: `Still ${clockTime(stretch.startS)}–${clockTime(stretch.endS)}`,
      showlegend: false,
      xaxis: 'x',
      yaxis: 'y2',
    });
  }
  if (log.knocks && log.knocks.length > 0) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'Knock',
      x: log.knocks.map((knock) => minutes(knock.tS)),
      y: log.knocks.map(() => 0.5),
      marker: { symbol: 'x-thin-open', size: 12, line: { width: 2, color: colours.knock }, color: colours.knock },
      hovertemplate: log.knocks.map((knock) => `Knock at ${clockTime(knock.tS)}: ${Math.round(knock.peakMg)} mg<extra></extra>`),
      xaxis: 'x',
      yaxis: 'y2',
    });
  }

  const layout: Partial<Layout> = {
    autosize: true,
    height: 420,
    margin: { l: 56, r: 16, t: 12, b: 44 },
    font: { family: '"Noto Sans", ui-sans-serif, system-ui, sans-serif', size: 12, color: '#1e293b' },
    paper_bgcolor: 'rgba(0,0,0,0)',
    plot_bgcolor: '#ffffff',
    dragmode: mode === 'select' ? 'select' : 'zoom',
    selectdirection: 'h',
    hovermode: 'closest',
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: 1.08 },
    xaxis: { title: { text: 'Minutes from the log start' }, gridcolor: '#e2e8f0', zeroline: false, anchor: 'y2', uirevision: 'time' } as Layout['xaxis'],
    yaxis: { title: { text: 'dB' }, domain: [0.28, 1], range: [low, high], gridcolor: '#e2e8f0', fixedrange: true },
    yaxis2: {
      domain: [0, 0.18],
      range: [0, 1],
      showticklabels: false,
      showgrid: false,
      zeroline: false,
      fixedrange: true,
      title: { text: 'Wear', font: { size: 11 } },
    },
    shapes: [
      // 85 dBA: the hearing conservation trigger expressed as a level (OSHA 1910.95(c)).
      { type: 'line', xref: 'paper', x0: 0, x1: 1, yref: 'y', y0: 85, y1: 85, line: { color: colours.action, width: 1, dash: 'dash' } },
    ],
    annotations: [
      {
        xref: 'paper',
        x: 1,
        yref: 'y',
        y: 85,
        text: '85 dBA',
        showarrow: false,
        xanchor: 'right',
        yanchor: 'bottom',
        font: { size: 10, color: colours.action },
      },
    ],
    uirevision: log.id,
  };

  return (
    <Plot
      data={data}
      layout={layout}
      config={{ responsive: true, displaylogo: false, scrollZoom: true, modeBarButtonsToRemove: ['lasso2d', 'autoScale2d', 'toImage'] }}
      style={{ width: '100%' }}
      useResizeHandler
      onSelected={(event: Readonly<PlotSelectionEvent> | undefined) => {
        const range = (event as { range?: { x?: number[] } } | undefined)?.range?.x;
        if (range && range.length === 2) {
          const [a, b] = range;
          onSelectSpan({ startS: Math.max(0, Math.min(a, b) * 60), endS: Math.max(a, b) * 60 });
        }
      }}
      onRelayout={(event) => {
        const changes = event as Record<string, unknown>;
        if (changes['xaxis.autorange']) onWindowChange({});
        const from = changes['xaxis.range[0]'];
        const to = changes['xaxis.range[1]'];
        if (typeof from === 'number' && typeof to === 'number') onWindowChange({ fromS: from * 60, toS: to * 60 });
      }}
    />
  );
}
