import { useState } from 'react';
import { useAgentChoices, useAgents, type AgentView } from '@frontend/features/agents/api/get-agents';
import { useOelEntries, type OelEntryView } from '@frontend/features/agents/api/get-oel-entries';
import { AgentForm } from '@frontend/features/agents/components/agent-form';
import { AgentsTable } from '@frontend/features/agents/components/agents-table';
import { OelEntriesTable } from '@frontend/features/agents/components/oel-entries-table';
import { OelEntryForm } from '@frontend/features/agents/components/oel-entry-form';
import { MixturesSection } from '@frontend/features/mixtures/components/mixtures-section';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { DocumentTitle } from '@frontend/components/document-title';
import { FilterSelect, ListToolbar } from '@frontend/components/list-filters';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

const kindOptions = [
  { value: '', label: 'Noise and chemicals' },
  { value: 'noise', label: 'Noise' },
  { value: 'chemical', label: 'Chemicals' },
];

/** /orgs/:orgId/agents — the agents and the organization's OEL list, one above the other. */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const canEdit = useCanEdit();
  const agentParams = useListParams({ defaultSort: 'name', sortFields: ['name', 'kind', 'casNumber', 'createdAt', 'updatedAt'] });
  const oelParams = useListParams({
    prefix: 'oel.',
    defaultSort: 'agentName',
    sortFields: ['agentName', 'source', 'value', 'unit', 'averagingTime', 'createdAt'],
  });
  const agents = useAgents(organizationId, listQueryString(agentParams, ['archived', 'kind']));
  const entries = useOelEntries(organizationId, listQueryString(oelParams, ['archived', 'agentId']));
  const choices = useAgentChoices(organizationId);
  const agentOptions = [{ value: '', label: 'Every agent' }, ...(choices.data?.items ?? []).map((agent) => ({ value: String(agent.id), label: agent.name }))];

  const [editingAgent, setEditingAgent] = useState<AgentView | 'new' | null>(null);
  const [editingEntry, setEditingEntry] = useState<OelEntryView | 'new' | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  return (
    <>
      <DocumentTitle title={`Agents & OELs · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Agents & OELs"
        description="What people are exposed to, and the limits your organization judges exposure against. A group copies its limit when it takes it."
      />
      {saved && (
        <Notice tone="success" className="mb-4">
          {saved}
        </Notice>
      )}

      <section aria-labelledby="agents-title" className="mb-10 space-y-3">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <h2 id="agents-title" className="text-base">
            Agents
          </h2>
          {canEdit && (
            <Button variant="primary" onClick={() => setEditingAgent('new')}>
              Add agent
            </Button>
          )}
        </div>
        <ListToolbar params={agentParams} label="Filter agents" searchLabel="Search name, CAS number or notes">
          <FilterSelect params={agentParams} name="kind" label="Kind" options={kindOptions} className="w-52" />
        </ListToolbar>
        <QueryState query={agents} loading="Loading agents…" errorTitle="Could not load the agents">
          {(page) => (
            <AgentsTable
              organizationId={organizationId}
              page={page}
              params={agentParams}
              busy={agents.isPlaceholderData}
              canEdit={canEdit}
              onEdit={setEditingAgent}
              onOutcome={setSaved}
            />
          )}
        </QueryState>
      </section>

      <section aria-labelledby="oel-title" className="space-y-3">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2 id="oel-title" className="text-base">
              OEL list
            </h2>
            <p className="text-sm text-slate-600">Each line: agent × source × value × unit × averaging time.</p>
          </div>
          {canEdit && (
            <Button variant="primary" disabled={!choices.data?.items.length} onClick={() => setEditingEntry('new')}>
              Add limit
            </Button>
          )}
        </div>
        <ListToolbar params={oelParams} label="Filter the OEL list" searchLabel="Search source or notes">
          <FilterSelect params={oelParams} name="agentId" label="Agent" options={agentOptions} className="w-64" />
        </ListToolbar>
        <QueryState query={entries} loading="Loading the OEL list…" errorTitle="Could not load the OEL list">
          {(page) => (
            <OelEntriesTable
              organizationId={organizationId}
              page={page}
              params={oelParams}
              busy={entries.isPlaceholderData}
              canEdit={canEdit}
              onEdit={setEditingEntry}
              onOutcome={setSaved}
            />
          )}
        </QueryState>
      </section>

      <MixturesSection organizationId={organizationId} canEdit={canEdit} chemicals={(choices.data?.items ?? []).filter((agent) => agent.kind === 'chemical')} />

      <Dialog open={editingAgent !== null} onClose={() => setEditingAgent(null)} title={editingAgent === 'new' ? 'Add an agent' : 'Edit agent'}>
        <AgentForm
          organizationId={organizationId}
          agent={editingAgent === 'new' || editingAgent === null ? undefined : editingAgent}
          onCancel={() => setEditingAgent(null)}
          onSaved={(agent) => {
            setSaved(`Agent “${agent.name}” ${editingAgent === 'new' ? 'added' : 'saved'}.`);
            setEditingAgent(null);
          }}
        />
      </Dialog>
      <Dialog open={editingEntry !== null} onClose={() => setEditingEntry(null)} title={editingEntry === 'new' ? 'Add a limit to the OEL list' : 'Edit limit'}>
        <OelEntryForm
          organizationId={organizationId}
          agents={choices.data?.items ?? []}
          entry={editingEntry === 'new' || editingEntry === null ? undefined : editingEntry}
          onCancel={() => setEditingEntry(null)}
          onSaved={(entry) => {
            setSaved(`Limit for “${entry.agentName}” ${editingEntry === 'new' ? 'added' : 'saved'}.`);
            setEditingEntry(null);
          }}
        />
      </Dialog>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
