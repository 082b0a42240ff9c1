import { exposureCategories } from '@frontend/components/category-badge';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { formatDate } from '@frontend/lib/format';
import { formatFigure, formatProbability, unitLabel } from './format-figure';

/*
 * The text alternative of every chart: a sentence saying what the chart shows, written from the
 * same figures. They sit outside the lazily loaded chart code, so they are there before (and
 * without) the charts.
 */

export type ChartKind = 'probability' | 'histogram' | 'categories' | 'time' | 'workers';

export interface ChartDescription {
  kind: ChartKind;
  title: string;
  caption: string;
}

function nonDetectPart(count: number): string {
  return count === 0 ? '' : ` (${count} non-detect${count === 1 ? '' : 's'}, drawn as open circles)`;
}

export function chartDescriptions(assessment: GroupAssessmentResponse): ChartDescription[] {
  const { classical: c, group, data, bayes } = assessment;
  const unit = unitLabel(group.oelUnit);
  const oel = `${formatFigure(group.oel)} ${unit}`;
  const p95 = `${formatFigure(c.p95)} ${unit}`;
  const charts: ChartDescription[] = [];

  const swLog = c.fitCheck.shapiroWilkLog;
  charts.push({
    kind: 'probability',
    title: 'Log-probability plot',
    caption:
      `Each of the ${c.n} results${nonDetectPart(c.nonDetects)} against its normal score, on a logarithmic value scale, with the fitted lognormal line ` +
      `(geometric mean ${formatFigure(c.gm)} ${unit}, GSD ${formatFigure(c.gsd)}). ` +
      (swLog ? (swLog.p < 0.05 ? `The points bend away from the line (Shapiro–Wilk p = ${formatFigure(swLog.p)}). ` : 'The points follow the line. ') : '') +
      `The 95th percentile estimate, ${p95}, is ${c.p95 > group.oel ? 'above' : 'below'} the OEL of ${oel}; both are drawn as horizontal lines` +
      (group.actionLevel !== null ? `, as is the action level (${formatFigure(group.actionLevel)} ${unit}).` : '.'),
  });

  const detected = data.results.filter((result) => !result.nonDetect).length;
  charts.push({
    kind: 'histogram',
    title: 'Histogram with the fitted density',
    caption:
      `How the ${detected} detected results spread on a logarithmic scale, with the fitted lognormal density scaled to the counts` +
      (c.nonDetects > 0 ? `; the ${c.nonDetects} non-detects are marked as open circles at their detection limits` : '') +
      `. The OEL (${oel}) is marked; ${c.descriptive.countAboveOel} result${c.descriptive.countAboveOel === 1 ? ' is' : 's are'} above it.`,
  });

  if (bayes?.categoryProbabilities) {
    const parts = bayes.categoryProbabilities.map((p, category) => `${category} ${exposureCategories[category].word} ${formatProbability(p)}`);
    charts.push({
      kind: 'categories',
      title: 'Bayesian category probabilities',
      caption: `One bar split by the probability that the 95th percentile lies in each exposure category: ${parts.join(', ')}.`,
    });
  }

  const dates = data.results.map((result) => result.date).sort();
  charts.push({
    kind: 'time',
    title: 'Results over time',
    caption:
      (dates.length > 0
        ? `The ${data.results.length} results from ${formatDate(`${dates[0]}T12:00:00Z`)} to ${formatDate(`${dates[dates.length - 1]}T12:00:00Z`)}`
        : 'No results') +
      `${nonDetectPart(c.nonDetects)}, on a logarithmic scale, with the OEL` +
      (group.actionLevel !== null ? ` and the action level (${formatFigure(group.actionLevel)} ${unit})` : '') +
      '.' +
      (data.excluded.length === 1 ? ' The result left out (what-if) is drawn as a grey cross.' : '') +
      (data.excluded.length > 1 ? ` The ${data.excluded.length} results left out (what-if) are drawn as grey crosses.` : ''),
  });

  const byWorker = new Map<string, number>();
  for (const result of data.results) byWorker.set(result.workerCode, (byWorker.get(result.workerCode) ?? 0) + 1);
  const highest = assessment.betweenWorker?.workerSummaries.reduce((a, b) => (b.gm > a.gm ? b : a));
  charts.push({
    kind: 'workers',
    title: 'Results per worker',
    caption:
      `The results of each of the ${byWorker.size} workers (${[...byWorker.entries()]
        .sort(([a], [b]) => (a < b ? -1 : 1))
        .map(([worker, count]) => `${worker}: ${count}`)
        .join(', ')}), ` +
      `as points over a box of their spread, on a logarithmic scale, with the OEL${group.actionLevel !== null ? ' and the action level' : ''}.` +
      (highest ? ` The highest geometric mean is ${highest.worker}'s, ${formatFigure(highest.gm)} ${unit}.` : ''),
  });
  return charts;
}
