import { useState, type FormEvent, type ReactNode } from 'react';
import { Button } from '@frontend/components/button';
import { SelectField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import type { ProtectorAdequacy, ProtectorEstimate } from '@schema/hearing-protectors';
import { isApiError } from '@frontend/lib/api-client';
import { useAddGroupProtector, useHearingProtectors, useProtectorAdequacy, useRemoveGroupProtector } from '../api/hearing-protectors';
import { methodLabels, VerdictBadge } from './verdict-text';

/**
 * "Protectors in use" on a noise group's page: which protectors the group wears and, for the level
 * the user chooses (the group's 95th percentile estimate or a typed LA/LC), the level at the ear by
 * each published method with its source, formula and verdict.
 */
export function GroupProtectorsPanel({ organizationId, groupId, canEdit }: { organizationId: string; groupId: number; canEdit: boolean }) {
  const [query, setQuery] = useState('level=p95');
  const [levelChoice, setLevelChoice] = useState<'p95' | 'typed'>('p95');
  const [typed, setTyped] = useState({ la: '', lc: '', assumed: '2' });
  const adequacy = useProtectorAdequacy(organizationId, groupId, query);
  const [problem, setProblem] = useState<string | null>(null);

  function apply(event: FormEvent) {
    event.preventDefault();
    const parts = new URLSearchParams({ level: levelChoice, assumedCMinusA: typed.assumed.trim() || '2' });
    if (levelChoice === 'typed') {
      if (typed.la.trim()) parts.set('la', typed.la.trim());
      if (typed.lc.trim()) parts.set('lc', typed.lc.trim());
    }
    setQuery(parts.toString());
  }

  return (
    <section aria-labelledby="protectors-title" className="space-y-3">
      <h2 id="protectors-title" className="text-base">
        Protectors in use
      </h2>
      <p className="text-sm text-slate-600">
        The level at the ear under each protector, estimated from its labelled ratings by each published method, and judged in the EN 458 bands around your
        action level.
      </p>
      {canEdit && <AddProtector organizationId={organizationId} groupId={groupId} onProblem={setProblem} />}
      {problem && <Notice tone="error">{problem}</Notice>}
      <form onSubmit={apply} className="card flex flex-wrap items-end gap-3 p-3" aria-label="Level used">
        <fieldset className="space-y-1 text-sm">
          <legend className="font-medium text-slate-800">Level used</legend>
          <label className="mr-4 inline-flex items-center gap-1">
            <input type="radio" name="level" value="p95" checked={levelChoice === 'p95'} onChange={() => setLevelChoice('p95')} /> The group’s 95th percentile
            estimate
          </label>
          <label className="inline-flex items-center gap-1">
            <input type="radio" name="level" value="typed" checked={levelChoice === 'typed'} onChange={() => setLevelChoice('typed')} /> A level I type in
          </label>
        </fieldset>
        {levelChoice === 'typed' && (
          <>
            <TextField
              label="LA, dB(A)"
              inputMode="decimal"
              className="w-28"
              value={typed.la}
              onChange={(event) => setTyped({ ...typed, la: event.target.value })}
            />
            <TextField
              label="LC, dB(C) (if measured)"
              inputMode="decimal"
              className="w-44"
              value={typed.lc}
              onChange={(event) => setTyped({ ...typed, lc: event.target.value })}
            />
          </>
        )}
        <TextField
          label="Assumed LC − LA, dB"
          hint="Used only when LC is unknown (EN 458 methods)."
          inputMode="decimal"
          className="w-44"
          value={typed.assumed}
          onChange={(event) => setTyped({ ...typed, assumed: event.target.value })}
        />
        <Button type="submit">Work out</Button>
      </form>
      <p className="text-xs text-slate-600">
        The 95th percentile is the level most shifts stay under, so protection judged on it covers the louder shifts too; a typed level lets you check one task
        or measured spectrum (with LC, the EN 458 and C-weighted methods need no assumption).
      </p>
      {adequacy.isPending && <p className="text-sm text-slate-600">Working out the levels at the ear…</p>}
      {adequacy.error && (
        <Notice tone="warning" title="The levels could not be worked out">
          {isApiError(adequacy.error) ? (adequacy.error.fields ? Object.values(adequacy.error.fields).join(' ') : adequacy.error.message) : 'Try again.'}
        </Notice>
      )}
      {adequacy.data && <AdequacyTable organizationId={organizationId} groupId={groupId} data={adequacy.data} canEdit={canEdit} onProblem={setProblem} />}
    </section>
  );
}

function AddProtector({ organizationId, groupId, onProblem }: { organizationId: string; groupId: number; onProblem: (message: string | null) => void }) {
  const protectors = useHearingProtectors(organizationId);
  const add = useAddGroupProtector(organizationId, groupId);
  const [choice, setChoice] = useState('');
  const options = [
    { value: '', label: 'Choose a protector…' },
    ...(protectors.data ?? []).map((protector) => ({ value: String(protector.id), label: protector.name })),
  ];
  return (
    <div className="flex flex-wrap items-end gap-2">
      <SelectField label="Add a protector in use" options={options} className="w-72" value={choice} onChange={(event) => setChoice(event.target.value)} />
      <Button
        disabled={!choice}
        pending={add.isPending}
        onClick={async () => {
          onProblem(null);
          try {
            await add.mutateAsync(Number(choice));
            setChoice('');
          } catch (failure) {
            onProblem(isApiError(failure) ? failure.message : 'The protector could not be added.');
          }
        }}
      >
        Add to group
      </Button>
    </div>
  );
}

function AdequacyTable({
  organizationId,
  groupId,
  data,
  canEdit,
  onProblem,
}: {
  organizationId: string;
  groupId: number;
  data: ProtectorAdequacy;
  canEdit: boolean;
  onProblem: (message: string | null) => void;
}) {
  const remove = useRemoveGroupProtector(organizationId, groupId);
  return (
    <div className="space-y-2">
      <p className="text-sm font-medium text-slate-800">{data.level.statement}</p>
      <p className="text-xs text-slate-600">
        {data.bands.statement} {data.bands.source}
      </p>
      {data.protectors.length === 0 ? (
        <p className="text-sm text-slate-600">No protectors are recorded as in use in this group.</p>
      ) : (
        <EstimatesTable
          caption="Level at the ear by protector and method"
          headerLabel="Protector"
          rows={data.protectors.map(({ protector, estimates }) => ({
            key: String(protector.id),
            estimates,
            header: (
              <>
                {protector.name}
                {canEdit && (
                  <div>
                    <Button
                      size="sm"
                      className="mt-1"
                      onClick={async () => {
                        onProblem(null);
                        try {
                          await remove.mutateAsync(protector.id);
                        } catch (failure) {
                          onProblem(isApiError(failure) ? failure.message : 'The protector could not be taken off.');
                        }
                      }}
                    >
                      Take off group
                    </Button>
                  </div>
                )}
              </>
            ),
          }))}
        />
      )}
      {data.combinations.length > 0 && (
        <section aria-labelledby="dual-protection-title" className="space-y-2">
          <h3 id="dual-protection-title" className="text-sm font-semibold">
            Earplug and earmuff worn together
          </h3>
          <p className="text-xs text-slate-600">
            Two protectors together give far less than the sum of their ratings: the OSHA rule credits only 5 dB more than the better of the two. Use it where
            the level is too high for one protector alone.
          </p>
          <EstimatesTable
            caption="Level at the ear with an earplug and an earmuff worn together, by method"
            headerLabel="Worn together"
            rows={data.combinations.map(({ plug, muff, estimates }) => ({
              key: `${plug.id}-${muff.id}`,
              estimates,
              header: (
                <>
                  {plug.name} <span className="font-normal text-slate-600">+</span> {muff.name}
                </>
              ),
            }))}
          />
        </section>
      )}
      <aside aria-label="Hearing protector cautions" className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-3 text-sm text-amber-950">
        <ul className="space-y-1">
          {data.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </aside>
    </div>
  );
}

/** One row group per protector (or pair): each method's level at the ear, verdict, working and source, or why it does not apply. */
function EstimatesTable({
  caption,
  headerLabel,
  rows,
}: {
  caption: string;
  headerLabel: string;
  rows: Array<{ key: string; header: ReactNode; estimates: ProtectorEstimate[] }>;
}) {
  return (
    <div className="card overflow-x-auto">
      <table className="table-dense w-full">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr>
            <th scope="col">{headerLabel}</th>
            <th scope="col">Method</th>
            <th scope="col">Level at the ear</th>
            <th scope="col">Verdict</th>
            <th scope="col">Working and source</th>
          </tr>
        </thead>
        <tbody>
          {rows.flatMap(({ key, header, estimates }) =>
            estimates.map((estimate, position) => (
              <tr key={`${key}-${estimate.method}`}>
                {position === 0 && (
                  <th scope="rowgroup" rowSpan={estimates.length} className="align-top text-left font-medium">
                    {header}
                  </th>
                )}
                <td>{methodLabels[estimate.method] ?? estimate.method}</td>
                {estimate.unavailable === null ? (
                  <>
                    <td className="tabular-nums">{estimate.levelAtEarDb.toFixed(1)} dB(A)</td>
                    <td>
                      <VerdictBadge verdict={estimate.verdict} />
                    </td>
                    <td className="text-xs text-slate-700">
                      <p>{estimate.working}</p>
                      {estimate.assumptions.map((assumption) => (
                        <p key={assumption} className="text-amber-900">
                          {assumption}
                        </p>
                      ))}
                      <p className="text-slate-500">{estimate.source}</p>
                    </td>
                  </>
                ) : (
                  <td colSpan={3} className="text-xs text-slate-600">
                    Not available: {estimate.unavailable}
                  </td>
                )}
              </tr>
            )),
          )}
        </tbody>
      </table>
    </div>
  );
}
