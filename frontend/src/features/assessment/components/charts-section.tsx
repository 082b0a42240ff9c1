import { lazy, Suspense } from 'react';
import type { GroupAssessmentResponse } from '../api/get-assessment';
import { chartDescriptions } from '../lib/chart-captions';

// Plotly (about 1.4 MB gzip) is loaded only when a chart is shown, in its own chunk.
const AssessmentChart = lazy(() => import('./assessment-chart'));

function ChartLoading() {
  return (
    <div role="status" className="flex h-64 items-center justify-center rounded bg-slate-50 text-sm text-slate-500">
      Loading the chart…
    </div>
  );
}

/** The group's charts, each a figure whose caption says in words what the chart shows. */
export function ChartsSection({ assessment }: { assessment: GroupAssessmentResponse }) {
  const charts = chartDescriptions(assessment);
  return (
    <section aria-labelledby="charts-title">
      <h2 id="charts-title" className="mb-2 text-base">
        Charts
      </h2>
      <div className="grid gap-4 lg:grid-cols-2">
        {charts.map((chart) => (
          <figure key={chart.kind} className={`card m-0 p-3 ${chart.kind === 'categories' ? 'lg:col-span-2' : ''}`} data-chart={chart.kind}>
            <h3 className="text-sm">{chart.title}</h3>
            <Suspense fallback={<ChartLoading />}>
              <AssessmentChart kind={chart.kind} assessment={assessment} />
            </Suspense>
            <figcaption className="mt-1 text-xs leading-relaxed text-slate-600">{chart.caption}</figcaption>
          </figure>
        ))}
      </div>
    </section>
  );
}
