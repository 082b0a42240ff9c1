import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import { DataTable, TablePager, useServerListTable, type ListTableFeatures } from '@frontend/components/data-table';
import { RecordActions } from '@frontend/components/record-actions';
import { EmptyState } from '@frontend/components/states';
import { ArchivedBadge } from '@frontend/components/status-badge';
import { formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { AgentView } from '../api/get-agents';
import { useArchiveAgent } from '../api/update-agent';

const column = createColumnHelper<ListTableFeatures, AgentView>();

/** Agents: noise and chemicals, with CAS number and molecular weight; sorted and paged by the server. */
export function AgentsTable({
  organizationId,
  page,
  params,
  busy,
  canEdit,
  onEdit,
  onOutcome,
}: {
  organizationId: string;
  page: ListPage<AgentView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (agent: AgentView) => void;
}) {
  const archive = useArchiveAgent(organizationId);
  const columns = useMemo(
    () =>
      column.columns([
        column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
        column.accessor('kind', { header: 'Kind', cell: (info) => (info.getValue() === 'noise' ? 'Noise' : 'Chemical') }),
        column.accessor('casNumber', { header: 'CAS number', cell: (info) => <span className="tabular-nums">{info.getValue() ?? '—'}</span> }),
        column.accessor('molecularWeight', {
          header: 'Mol. weight',
          enableSorting: false,
          cell: (info) => <span className="tabular-nums">{info.getValue() === null ? '—' : `${formatNumber(info.getValue(), 6)} g/mol`}</span>,
        }),
        column.accessor('oelEntryCount', { header: 'Limits', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
        column.accessor('exposureGroupCount', { header: 'Groups', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
        column.accessor('archived', { header: 'Status', enableSorting: false, cell: (info) => <ArchivedBadge archived={info.getValue()} /> }),
        ...(canEdit
          ? [
              column.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => {
                  const agent = info.row.original;
                  return (
                    <RecordActions
                      name={agent.name}
                      what="agent"
                      archived={agent.archived}
                      consequence="It leaves the pick lists; groups, limits and results that use it stay. An agent of a group in use cannot be archived."
                      onDone={onOutcome}
                      onEdit={() => onEdit(agent)}
                      onArchive={(archived, reason) => archive.mutateAsync({ agentId: agent.id, archived, reason })}
                    />
                  );
                },
              }),
            ]
          : []),
      ]),
    [canEdit, onEdit, onOutcome, archive.mutateAsync],
  );
  const table = useServerListTable({ columns, page, params, getRowId: (agent) => String(agent.id) });
  const filtered = Boolean(params.q || params.filter('archived') || params.filter('kind'));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption="Agents"
        busy={busy}
        rowClassName={(agent) => (agent.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? 'No agent matches' : 'No agents yet'}>
            {filtered ? 'Clear the search or the filters.' : canEdit ? 'Add noise or a chemical with “Add agent”.' : 'A hygienist adds agents here.'}
          </EmptyState>
        }
      />
      <TablePager table={table} noun="agents" />
    </div>
  );
}
