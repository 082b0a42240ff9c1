import { useState, type FormEvent } from 'react';
import { mixtureCreate } from '@schema/mixtures';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { QueryState } from '@frontend/components/query-state';
import { isApiError } from '@frontend/lib/api-client';
import { useCreateMixture, useMixtures } from '../api/mixtures';

/**
 * Mixtures on the agents page: agents the organization marks as having similar effects, judged
 * together by the index Σ Cᵢ/OELᵢ (OSHA 29 CFR 1910.1000(d)(2)(i)). A group set up for a mixture
 * (OEL 1, unit "× limit") gets its results from its components' results.
 */
export function MixturesSection({
  organizationId,
  chemicals,
  canEdit,
}: {
  organizationId: string;
  chemicals: Array<{ id: number; name: string }>;
  canEdit: boolean;
}) {
  const mixtures = useMixtures(organizationId);
  const create = useCreateMixture(organizationId);
  const [name, setName] = useState('');
  const [chosen, setChosen] = useState<number[]>([]);
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState<string | null>(null);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(null);
    const parsed = mixtureCreate.safeParse({ name, componentAgentIds: chosen });
    if (!parsed.success) {
      setProblems(Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])));
      return;
    }
    setProblems({});
    try {
      const mixture = await create.mutateAsync(parsed.data);
      setSaved(`Mixture “${mixture.name}” defined. Set up an exposure group for it with an OEL of 1 (× limit).`);
      setName('');
      setChosen([]);
    } catch (failure) {
      setProblems(isApiError(failure) ? (failure.fields ?? { name: failure.message }) : { name: 'The mixture could not be saved.' });
    }
  }

  return (
    <section aria-labelledby="mixtures-title" className="mt-10 space-y-3">
      <div>
        <h2 id="mixtures-title" className="text-base">
          Mixtures (similar effects)
        </h2>
        <p className="text-sm text-slate-600">
          Agents with similar effects are judged together by the additive index Σ Cᵢ/OELᵢ (OSHA 29 CFR 1910.1000(d)(2)(i)); the index must not exceed 1.
        </p>
      </div>
      {saved && <Notice tone="success">{saved}</Notice>}
      <QueryState query={mixtures} loading="Loading the mixtures…" errorTitle="Could not load the mixtures">
        {(list) =>
          list.length === 0 ? (
            <p className="text-sm text-slate-600">No mixtures defined.</p>
          ) : (
            <div className="card overflow-x-auto">
              <table className="table-dense w-full">
                <caption className="sr-only">Mixtures</caption>
                <thead>
                  <tr>
                    <th scope="col">Mixture</th>
                    <th scope="col">Components</th>
                    <th scope="col">Groups</th>
                    <th scope="col">Valid results</th>
                  </tr>
                </thead>
                <tbody>
                  {list.map((mixture) => (
                    <tr key={mixture.id}>
                      <td className="font-medium">{mixture.name}</td>
                      <td>{mixture.components.map((component) => component.name).join(' + ')}</td>
                      <td>{mixture.groupCount}</td>
                      <td>{mixture.validResultCount}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )
        }
      </QueryState>
      {canEdit && (
        <form onSubmit={submit} noValidate className="card space-y-3 p-3" aria-label="Define a mixture">
          <TextField
            label="Mixture name"
            autoComplete="off"
            className="max-w-md"
            value={name}
            onChange={(event) => setName(event.target.value)}
            error={problems.name}
          />
          <fieldset>
            <legend className="text-sm font-medium text-slate-800">Components (chemicals with similar effects)</legend>
            <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm">
              {chemicals.map((agent) => (
                <label key={agent.id} className="inline-flex items-center gap-1">
                  <input
                    type="checkbox"
                    checked={chosen.includes(agent.id)}
                    onChange={(event) => setChosen(event.target.checked ? [...chosen, agent.id] : chosen.filter((id) => id !== agent.id))}
                  />
                  {agent.name}
                </label>
              ))}
            </div>
            {problems.componentAgentIds && <p className="mt-1 text-xs font-medium text-red-800">{problems.componentAgentIds}</p>}
          </fieldset>
          <Button type="submit" variant="primary" pending={create.isPending}>
            Define mixture
          </Button>
        </form>
      )}
    </section>
  );
}
