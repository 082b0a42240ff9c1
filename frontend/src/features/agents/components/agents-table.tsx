import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import { ArchivableListTable, type ArchivableRecordKind } from '@frontend/components/archivable-list-table';
import type { ListTableFeatures } from '@frontend/components/data-table';
import { formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { AgentView } from '../api/get-agents';
import { useArchiveAgent } from '../api/update-agent';

const column = createColumnHelper<ListTableFeatures, AgentView>();

const columns = column.columns([
  column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
  column.accessor('kind', { header: 'Kind', cell: (info) => ({ noise: 'Noise', chemical: 'Chemical', mixture: 'Mixture' })[info.getValue()] }),
  column.accessor('casNumber', { header: 'CAS number', cell: (info) => <span className="tabular-nums">{info.getValue() ?? '—'}</span> }),
  column.accessor('molecularWeight', {
    header: 'Mol. weight',
    enableSorting: false,
    cell: (info) => <span className="tabular-nums">{info.getValue() === null ? '—' : `${formatNumber(info.getValue(), 6)} g/mol`}</span>,
  }),
  column.accessor('oelEntryCount', { header: 'Limits', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  column.accessor('exposureGroupCount', { header: 'Groups', enableSorting: false, cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
]);

/** Agents: noise and chemicals, with CAS number and molecular weight; sorted and paged by the server. */
export function AgentsTable({
  organizationId,
  ...props
}: {
  organizationId: string;
  page: ListPage<AgentView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (agent: AgentView) => void;
}) {
  const { mutateAsync } = useArchiveAgent(organizationId);
  const kind = useMemo<ArchivableRecordKind<AgentView>>(
    () => ({
      what: 'agent',
      plural: 'agents',
      consequence: 'It leaves the pick lists; groups, limits and results that use it stay. An agent of a group in use cannot be archived.',
      nameOf: (agent) => agent.name,
      archive: (agent, archived, reason) => mutateAsync({ agentId: agent.id, archived, reason }),
      addHint: 'Add noise or a chemical with “Add agent”.',
      readerHint: 'A hygienist adds agents here.',
    }),
    [mutateAsync],
  );
  return <ArchivableListTable kind={kind} columns={columns} caption="Agents" filterKeys={['archived', 'kind']} {...props} />;
}
