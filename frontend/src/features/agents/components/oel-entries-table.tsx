import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { averagingTimeLabels, exposureUnitLabels } from '@schema/agents';
import type { ListPage } from '@schema/list-query';
import { ArchivableListTable, type ArchivableRecordKind } from '@frontend/components/archivable-list-table';
import type { ListTableFeatures } from '@frontend/components/data-table';
import { formatNumber } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { OelEntryView } from '../api/get-oel-entries';
import { useArchiveOelEntry } from '../api/update-oel-entry';

const column = createColumnHelper<ListTableFeatures, OelEntryView>();

const columns = column.columns([
  column.accessor('agentName', { header: 'Agent', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
  column.accessor('source', { header: 'Source', cell: (info) => <span className="block max-w-sm text-slate-700">{info.getValue()}</span> }),
  column.accessor('value', {
    header: 'Limit',
    cell: (info) => <span className="font-medium whitespace-nowrap tabular-nums">{formatNumber(info.getValue(), 6)}</span>,
  }),
  column.accessor('unit', { header: 'Unit', cell: (info) => exposureUnitLabels[info.getValue()] }),
  column.accessor('averagingTime', { header: 'Averaging time', cell: (info) => averagingTimeLabels[info.getValue()] }),
]);

/** The organization's OEL list: agent × source × value × unit × averaging time. */
export function OelEntriesTable({
  organizationId,
  ...props
}: {
  organizationId: string;
  page: ListPage<OelEntryView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (entry: OelEntryView) => void;
}) {
  const { mutateAsync } = useArchiveOelEntry(organizationId);
  const kind = useMemo<ArchivableRecordKind<OelEntryView>>(
    () => ({
      what: 'limit',
      plural: 'limits',
      consequence: 'It leaves the list offered when setting up a group; groups that took this limit keep their copy.',
      nameOf: (entry) => `${entry.agentName}, ${formatNumber(entry.value, 6)} ${exposureUnitLabels[entry.unit]} (${entry.source})`,
      archive: (entry, archived, reason) => mutateAsync({ entryId: entry.id, archived, reason }),
      addHint: 'Add the limits your organization uses with “Add limit”.',
      readerHint: 'A hygienist adds limits here.',
    }),
    [mutateAsync],
  );
  return <ArchivableListTable kind={kind} columns={columns} caption="OEL list" filterKeys={['archived', 'agentId']} {...props} />;
}
