import type { ReactNode } from 'react';
import { averagingTimeLabels, exposureUnitLabels } from '@schema/agents';
import { formatNumber } from '@frontend/lib/format';
import type { GroupOverview } from '../api/get-group-overview';
import { noiseCriteriaSetLabels } from './group-form';
import { limitText } from './oel-text';

function Term({ label, children, wide = false }: { label: string; children: ReactNode; wide?: boolean }) {
  return (
    <div className={wide ? 'sm:col-span-2 lg:col-span-3' : undefined}>
      <dt className="text-xs font-medium tracking-wide text-slate-500 uppercase">{label}</dt>
      <dd className="mt-0.5 text-sm text-slate-900">{children}</dd>
    </div>
  );
}

/** What the group is: where, who, doing what, exposed to which agent, judged against which limit. */
export function GroupDefinition({ overview }: { overview: GroupOverview }) {
  const { group, agent, site, oelEntry } = overview;
  const effective = group.effectiveOel;
  const unit = exposureUnitLabels[group.oelUnit];
  return (
    <section aria-labelledby="definition-title" className="card px-4 py-3">
      <h2 id="definition-title" className="mb-3 text-base">
        Definition
      </h2>
      <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-2 lg:grid-cols-3">
        <Term label="Site">
          {site.name}
          {site.archived && <span className="text-slate-500"> (archived)</span>}
        </Term>
        <Term label="Process or area">{group.processArea || '—'}</Term>
        <Term label="Job titles">{group.jobTitles.length > 0 ? group.jobTitles.join(', ') : '—'}</Term>
        <Term label="Agent">
          {agent.name}
          <span className="text-slate-600">
            {' '}
            · {agent.kind === 'noise' ? 'noise' : agent.kind === 'mixture' ? 'mixture (similar effects)' : 'chemical'}
            {agent.casNumber && `, CAS ${agent.casNumber}`}
            {agent.molecularWeight !== null && `, ${formatNumber(agent.molecularWeight, 6)} g/mol`}
          </span>
        </Term>
        <Term label="OEL">
          <span className="font-semibold tabular-nums">{limitText(group.oelValue, group.oelUnit)}</span>
          <span className="text-slate-600"> · {averagingTimeLabels[group.oelAveragingTime]}</span>
          <span className="block text-xs text-slate-600">
            {group.oelSource}
            {oelEntry ? ' (copied from the OEL list)' : ' (typed in)'}
          </span>
        </Term>
        <Term label="Judged against">
          <span className="font-semibold tabular-nums">{limitText(effective.value, effective.unit)}</span>
          <span className="block text-xs text-slate-600">{effective.statement}</span>
        </Term>
        <Term label={agent.kind === 'noise' ? 'Action level (hearing conservation trigger)' : 'Action level'}>
          {group.actionLevel === null ? '—' : <span className="tabular-nums">{`${formatNumber(group.actionLevel, 6)} ${unit}`}</span>}
        </Term>
        <Term label="Shift length">
          <span className="tabular-nums">{formatNumber(group.shiftHours)} h</span>
        </Term>
        {group.noiseCriteriaSet && <Term label="Noise criteria set">{noiseCriteriaSetLabels[group.noiseCriteriaSet]}</Term>}
        <Term label="Tasks" wide>
          <span className="whitespace-pre-line">{group.tasks || '—'}</span>
        </Term>
        <Term label="Exposure profile" wide>
          <span className="whitespace-pre-line">{group.exposureProfile || '—'}</span>
        </Term>
      </dl>
    </section>
  );
}
