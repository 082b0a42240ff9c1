import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import type { ListParams } from '@frontend/lib/list-params';
import { DataTable, TablePager, useServerListTable, type ListColumns, type ListTableFeatures } from './data-table';
import { RecordActions } from './record-actions';
import { EmptyState } from './states';
import { ArchivedBadge } from './status-badge';

/** A row of a list whose records are archived rather than deleted (sites, agents, limits, workers). */
export interface ArchivableRow {
  id: number;
  archived: boolean;
}

/** How one kind of record is named, archived and described when the list is empty. */
export interface ArchivableRecordKind<TData extends ArchivableRow> {
  /** "agent": used in the buttons' labels and the archive dialog. */
  what: string;
  /** Plural for the pager and the caption's noun ("agents"). */
  plural: string;
  /** What archiving does, shown in the archive dialog. */
  consequence: string;
  /** The row's name in labels and dialogs. */
  nameOf: (row: TData) => string;
  archive: (row: TData, archived: boolean, reason: string | undefined) => Promise<unknown>;
  /** Empty-list hint for editors ("Add noise or a chemical with “Add agent”."). */
  addHint: string;
  /** Empty-list hint for everyone else ("A hygienist adds agents here."). */
  readerHint: string;
}

/**
 * The list of an archivable record kind: the record's own columns, then Status and (for editors) Edit and
 * Archive / Bring back; sorted and paged by the server; archived rows dimmed; an empty state that says
 * whether the search or filters hid everything. `columns` must be memoized by the caller.
 */
export function ArchivableListTable<TData extends ArchivableRow>({
  kind,
  columns,
  page,
  params,
  filterKeys,
  caption,
  busy,
  canEdit,
  onEdit,
  onOutcome,
}: {
  kind: ArchivableRecordKind<TData>;
  columns: ListColumns<TData>;
  page: ListPage<TData>;
  params: ListParams;
  /** The list filters that, when set, make an empty list "no match" rather than "none yet". */
  filterKeys: readonly string[];
  caption: string;
  busy: boolean;
  canEdit: boolean;
  onEdit: (row: TData) => void;
  onOutcome: (message: string) => void;
}) {
  const { what, plural, consequence, nameOf, archive } = kind;
  const allColumns = useMemo(() => {
    const column = createColumnHelper<ListTableFeatures, TData>();
    const status = column.display({ id: 'status', header: 'Status', cell: (info) => <ArchivedBadge archived={info.row.original.archived} /> });
    const actions = column.display({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      cell: (info) => {
        const row = info.row.original;
        return (
          <RecordActions
            name={nameOf(row)}
            what={what}
            archived={row.archived}
            consequence={consequence}
            onDone={onOutcome}
            onEdit={() => onEdit(row)}
            onArchive={(archived, reason) => archive(row, archived, reason)}
          />
        );
      },
    });
    return [...columns, status, ...(canEdit ? [actions] : [])] as ListColumns<TData>;
  }, [columns, canEdit, what, consequence, nameOf, archive, onEdit, onOutcome]);
  const table = useServerListTable({ columns: allColumns, page, params, getRowId: (row) => String(row.id) });
  const filtered = Boolean(params.q || filterKeys.some((key) => params.filter(key)));
  return (
    <div className="space-y-3">
      <DataTable
        table={table}
        caption={caption}
        busy={busy}
        rowClassName={(row) => (row.archived ? 'bg-slate-50/60 text-slate-500' : undefined)}
        empty={
          <EmptyState title={filtered ? `No ${what} matches` : `No ${plural} yet`}>
            {filtered ? 'Clear the search or the filters.' : canEdit ? kind.addHint : kind.readerHint}
          </EmptyState>
        }
      />
      <TablePager table={table} noun={plural} />
    </div>
  );
}
