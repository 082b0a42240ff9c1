import { useState, type FormEvent } from 'react';
import { mixtureCreate, type MixtureCreate, type MixtureView } from '@schema/mixtures';
import { Button } from '@frontend/components/button';
import { TextAreaField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { QueryState } from '@frontend/components/query-state';
import { RecordActions } from '@frontend/components/record-actions';
import { ArchivedBadge } from '@frontend/components/status-badge';
import { isApiError } from '@frontend/lib/api-client';
import { useArchiveMixture, useCreateMixture, useMixtures, useUpdateMixture } from '../api/mixtures';

type Chemical = { id: number; name: string };

/**
 * Mixtures on the agents page: agents the organization marks as having similar effects, judged
 * together by the index Σ Cᵢ/OELᵢ (OSHA 29 CFR 1910.1000(d)(2)(i)). A group set up for a mixture
 * (OEL 1, unit "× limit") gets its results from its components' results. Editors define, edit and
 * archive mixtures; the components are fixed once results were computed from them.
 */
export function MixturesSection({ organizationId, chemicals, canEdit }: { organizationId: string; chemicals: Chemical[]; canEdit: boolean }) {
  const mixtures = useMixtures(organizationId);
  const archive = useArchiveMixture(organizationId);
  const [editing, setEditing] = useState<MixtureView | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

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
                    <th scope="col">Status</th>
                    {canEdit && (
                      <th scope="col">
                        <span className="sr-only">Actions</span>
                      </th>
                    )}
                  </tr>
                </thead>
                <tbody>
                  {list.map((mixture) => (
                    <tr key={mixture.id} className={mixture.archived ? 'text-slate-500' : undefined}>
                      <td className="font-medium">
                        {mixture.name}
                        {mixture.notes && <span className="block text-xs font-normal text-slate-600">{mixture.notes}</span>}
                      </td>
                      <td>{mixture.components.map((component) => component.name).join(' + ')}</td>
                      <td>{mixture.groupCount}</td>
                      <td>{mixture.validResultCount}</td>
                      <td>
                        <ArchivedBadge archived={mixture.archived} />
                      </td>
                      {canEdit && (
                        <td>
                          <RecordActions
                            name={mixture.name}
                            what="mixture"
                            archived={mixture.archived}
                            consequence="An archived mixture cannot be chosen for a new exposure group; its results and records stay."
                            onEdit={() => {
                              setSaved(null);
                              setEditing(mixture);
                            }}
                            onArchive={(archived, reason) => archive.mutateAsync({ mixtureId: mixture.id, archived, reason })}
                            onDone={setSaved}
                          />
                        </td>
                      )}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )
        }
      </QueryState>
      {canEdit &&
        (editing ? (
          <EditMixtureForm
            key={editing.id}
            organizationId={organizationId}
            mixture={editing}
            chemicals={chemicals}
            onClose={(message) => {
              setEditing(null);
              if (message) setSaved(message);
            }}
          />
        ) : (
          <NewMixtureForm organizationId={organizationId} chemicals={chemicals} onSaved={setSaved} />
        ))}
    </section>
  );
}

/** The problems of a failed save, by field (the API names the field; anything else goes under the name). */
function problemsOf(failure: unknown): Record<string, string> {
  return isApiError(failure) ? (failure.fields ?? { name: failure.message }) : { name: 'The mixture could not be saved.' };
}

function NewMixtureForm({ organizationId, chemicals, onSaved }: { organizationId: string; chemicals: Chemical[]; onSaved: (message: string | null) => void }) {
  const create = useCreateMixture(organizationId);
  const [resetKey, setResetKey] = useState(0);
  return (
    <MixtureFields
      key={resetKey}
      label="Define a mixture"
      chemicals={chemicals}
      initial={{ name: '', componentAgentIds: [], notes: '' }}
      componentsLocked={null}
      submitLabel="Define mixture"
      pending={create.isPending}
      onSubmit={async (values) => {
        onSaved(null);
        const mixture = await create.mutateAsync(values);
        onSaved(`Mixture “${mixture.name}” defined. Set up an exposure group for it with an OEL of 1 (× limit).`);
        setResetKey((key) => key + 1);
      }}
    />
  );
}

function EditMixtureForm({
  organizationId,
  mixture,
  chemicals,
  onClose,
}: {
  organizationId: string;
  mixture: MixtureView;
  chemicals: Chemical[];
  onClose: (message?: string) => void;
}) {
  const update = useUpdateMixture(organizationId);
  const current = mixture.components.map((component) => component.id);
  // An archived component still belongs to the mixture: offer it beside the chemicals in use.
  const choices = [...chemicals, ...mixture.components.filter((component) => !chemicals.some((chemical) => chemical.id === component.id))];
  return (
    <MixtureFields
      label={`Edit mixture ${mixture.name}`}
      chemicals={choices}
      initial={{ name: mixture.name, componentAgentIds: current, notes: mixture.notes }}
      componentsLocked={
        mixture.validResultCount > 0
          ? `The components are fixed: ${mixture.validResultCount} valid mixture result(s) were computed from them. Define a new mixture for another set of agents.`
          : null
      }
      submitLabel="Save changes"
      pending={update.isPending}
      onCancel={() => onClose()}
      onSubmit={async (values) => {
        const sameComponents = [...values.componentAgentIds].sort((a, b) => a - b).join(',') === [...current].sort((a, b) => a - b).join(',');
        const changes = {
          ...(values.name !== mixture.name ? { name: values.name } : {}),
          ...((values.notes ?? '') !== mixture.notes ? { notes: values.notes ?? '' } : {}),
          ...(sameComponents ? {} : { componentAgentIds: values.componentAgentIds }),
        };
        if (Object.keys(changes).length === 0) return onClose('Nothing changed.');
        const saved = await update.mutateAsync({ mixtureId: mixture.id, changes });
        onClose(`Mixture “${saved.name}” saved.`);
      }}
    />
  );
}

/** Name, components and notes of a mixture, checked with the API's own schema before sending. */
function MixtureFields({
  label,
  chemicals,
  initial,
  componentsLocked,
  submitLabel,
  pending,
  onSubmit,
  onCancel,
}: {
  label: string;
  chemicals: Chemical[];
  initial: MixtureCreate;
  /** Why the components cannot change, or null when they can. */
  componentsLocked: string | null;
  submitLabel: string;
  pending: boolean;
  onSubmit: (values: MixtureCreate) => Promise<void>;
  onCancel?: () => void;
}) {
  const [name, setName] = useState(initial.name);
  const [chosen, setChosen] = useState<number[]>(initial.componentAgentIds);
  const [notes, setNotes] = useState(initial.notes ?? '');
  const [problems, setProblems] = useState<Record<string, string>>({});

  async function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = mixtureCreate.safeParse({ name, componentAgentIds: chosen, notes });
    if (!parsed.success) {
      setProblems(Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])));
      return;
    }
    setProblems({});
    try {
      await onSubmit(parsed.data);
    } catch (failure) {
      setProblems(problemsOf(failure));
    }
  }

  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-3" aria-label={label}>
      <h3 className="text-sm font-semibold">{label}</h3>
      <TextField
        label="Mixture name"
        autoComplete="off"
        className="max-w-md"
        value={name}
        onChange={(event) => setName(event.target.value)}
        error={problems.name}
      />
      <fieldset disabled={componentsLocked !== null}>
        <legend className="text-sm font-medium text-slate-800">Components (chemicals with similar effects)</legend>
        {componentsLocked && <p className="text-xs text-slate-600">{componentsLocked}</p>}
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
      <TextAreaField
        label="Notes (optional)"
        hint="e.g. the shared target organ and where the similar effects are documented"
        className="max-w-xl"
        value={notes}
        onChange={(event) => setNotes(event.target.value)}
        error={problems.notes}
      />
      <div className="flex gap-2">
        <Button type="submit" variant="primary" pending={pending}>
          {submitLabel}
        </Button>
        {onCancel && (
          <Button type="button" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
