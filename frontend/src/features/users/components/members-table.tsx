import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_equals,
  filterFn_equalsString,
  filterFn_includesString,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
  type Header,
} from '@tanstack/react-table';
import { useState } from 'react';
import { roleLabels, roles, type Role } from '@schema/permissions';
import { Button } from '@frontend/components/button';
import { SelectField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { EmptyState } from '@frontend/components/states';
import { formatDate } from '@frontend/lib/format';
import type { Member } from '../api/get-members';
import { useUpdateMember } from '../api/update-member';

/** What the cells need besides the row: who is looking, and how to change a membership. */
interface MembersTableMeta {
  currentUserId: Member['userId'];
  pendingMemberId: Member['id'] | null;
  changeRole: (member: Member, role: Role) => void;
  setActive: (member: Member, active: boolean) => void;
}

// Client-side sorting, filtering and paging: an organization has tens of members, not
// thousands, and the API returns them all. Features and columns live at module scope so
// the table's row models are not rebuilt on every render (TanStack Table v9 guidance).
const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString, equals: filterFn_equals },
  tableMeta: {} as MembersTableMeta,
});

const column = createColumnHelper<typeof features, Member>();

const columns = column.columns([
  column.accessor('name', {
    header: 'Name',
    sortFn: 'alphanumeric',
    cell: (info) => {
      const member = info.row.original;
      const isYou = String(member.userId) === String(info.table.options.meta?.currentUserId);
      return (
        <span className="font-medium text-slate-900">
          {member.name || '—'}
          {isYou && <span className="ml-1.5 rounded bg-slate-100 px-1 py-0.5 text-[11px] font-normal text-slate-600">you</span>}
        </span>
      );
    },
  }),
  column.accessor('email', { header: 'E-mail', sortFn: 'alphanumeric', cell: (info) => <span className="text-slate-700">{info.getValue()}</span> }),
  column.accessor('role', {
    header: 'Role',
    sortFn: 'alphanumeric',
    filterFn: 'equalsString',
    enableGlobalFilter: false,
    cell: (info) => {
      const member = info.row.original;
      const meta = info.table.options.meta;
      return (
        <select
          aria-label={`Role of ${member.name || member.email}`}
          value={member.role}
          disabled={meta?.pendingMemberId === member.id || !member.active}
          onChange={(event) => meta?.changeRole(member, event.target.value as Role)}
          className="rounded border border-slate-300 bg-white py-0.5 pr-7 pl-1.5 text-sm hover:border-slate-400 disabled:bg-slate-50 disabled:text-slate-500"
        >
          {roles.map((role) => (
            <option key={role} value={role}>
              {roleLabels[role]}
            </option>
          ))}
        </select>
      );
    },
  }),
  column.accessor('active', {
    header: 'Status',
    sortFn: 'basic',
    filterFn: 'equals',
    enableGlobalFilter: false,
    cell: (info) =>
      info.getValue() ? (
        <span className="inline-flex items-center gap-1.5 text-sm text-slate-800">
          <span aria-hidden="true" className="size-2 rounded-full bg-emerald-600" />
          Active
        </span>
      ) : (
        <span className="inline-flex items-center gap-1.5 text-sm text-slate-500">
          <span aria-hidden="true" className="size-2 rounded-full border border-slate-400" />
          Deactivated
        </span>
      ),
  }),
  column.accessor('createdAt', {
    header: 'Member since',
    sortFn: 'basic',
    enableGlobalFilter: false,
    cell: (info) => <span className="text-slate-600 tabular-nums">{formatDate(info.getValue())}</span>,
  }),
  column.display({
    id: 'actions',
    header: () => <span className="sr-only">Actions</span>,
    cell: (info) => {
      const member = info.row.original;
      const meta = info.table.options.meta;
      const pending = meta?.pendingMemberId === member.id;
      const who = member.name || member.email;
      return member.active ? (
        <Button size="sm" variant="danger" pending={pending} aria-label={`Deactivate ${who}`} onClick={() => meta?.setActive(member, false)}>
          Deactivate
        </Button>
      ) : (
        <Button size="sm" pending={pending} aria-label={`Reactivate ${who}`} onClick={() => meta?.setActive(member, true)}>
          Reactivate
        </Button>
      );
    },
  }),
]);

const pageSizes = [10, 25, 50] as const;
const roleFilterOptions = [{ value: '', label: 'All roles' }, ...roles.map((role) => ({ value: role, label: roleLabels[role] }))];
const statusFilterOptions = [
  { value: '', label: 'Any status' },
  { value: 'active', label: 'Active' },
  { value: 'inactive', label: 'Deactivated' },
];

/**
 * The organization's members: search by name or e-mail, filter by role and status, sort by
 * any column, page through, change a role or (de)activate a membership in place. The server
 * refuses to remove the last active admin (409); its message appears above the table.
 */
export function MembersTable({ organizationId, members, currentUserId }: { organizationId: string; members: Member[]; currentUserId: Member['userId'] }) {
  const update = useUpdateMember(organizationId);
  const [outcome, setOutcome] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);

  function run(member: Member, input: { role?: Role; active?: boolean }, done: string) {
    setOutcome(null);
    update.mutate(
      { membershipId: member.id, input },
      {
        onSuccess: () => setOutcome({ tone: 'success', text: done }),
        onError: (error) => setOutcome({ tone: 'error', text: error.message }),
      },
    );
  }

  const table = useTable({
    features,
    columns,
    data: members,
    getRowId: (member) => String(member.id),
    globalFilterFn: 'includesString',
    initialState: { sorting: [{ id: 'name', desc: false }], pagination: { pageIndex: 0, pageSize: 10 } },
    meta: {
      currentUserId,
      pendingMemberId: update.isPending ? (update.variables?.membershipId ?? null) : null,
      changeRole: (member, role) => run(member, { role }, `${member.name || member.email} is now ${roleLabels[role]}.`),
      setActive: (member, active) => run(member, { active }, `${member.name || member.email} is ${active ? 'active again' : 'deactivated'}.`),
    },
  });

  const { pagination, globalFilter } = table.state;
  const roleFilter = (table.getColumn('role')?.getFilterValue() as string | undefined) ?? '';
  const statusFilterValue = table.getColumn('active')?.getFilterValue() as boolean | undefined;
  const statusFilter = statusFilterValue === undefined ? '' : statusFilterValue ? 'active' : 'inactive';
  const filteredCount = table.getFilteredRowModel().rows.length;
  const rows = table.getRowModel().rows;
  const first = filteredCount === 0 ? 0 : pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(filteredCount, (pagination.pageIndex + 1) * pagination.pageSize);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-start gap-3" role="search" aria-label="Filter members">
        <TextField
          label="Search name or e-mail"
          type="search"
          className="min-w-56 flex-1"
          value={(globalFilter as string | undefined) ?? ''}
          onChange={(event) => table.setGlobalFilter(event.target.value)}
        />
        <SelectField
          label="Role"
          className="w-40"
          options={roleFilterOptions}
          value={roleFilter}
          onChange={(event) => table.getColumn('role')?.setFilterValue(event.target.value || undefined)}
        />
        <SelectField
          label="Status"
          className="w-36"
          options={statusFilterOptions}
          value={statusFilter}
          onChange={(event) => table.getColumn('active')?.setFilterValue(event.target.value === '' ? undefined : event.target.value === 'active')}
        />
      </div>

      {outcome && <Notice tone={outcome.tone}>{outcome.text}</Notice>}

      <div className="card overflow-x-auto">
        <table className="table-dense w-full">
          <caption className="sr-only">Members, sorted by the column marked as sorted</caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <th key={header.id} scope="col" aria-sort={ariaSort(header)}>
                    {header.isPlaceholder ? null : header.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 uppercase hover:text-slate-900"
                      >
                        <table.FlexRender header={header} />
                        <SortMark direction={header.column.getIsSorted()} />
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className={row.original.active ? undefined : 'bg-slate-50/60'}>
                {row.getAllCells().map((cell) => (
                  <td key={cell.id}>
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length === 0 && (
          <EmptyState title={members.length === 0 ? 'No members yet' : 'No one matches these filters'} className="m-3">
            {members.length === 0 ? 'Invite someone below.' : 'Clear the search or choose another role or status.'}
          </EmptyState>
        )}
      </div>

      <div className="flex flex-wrap items-center justify-between gap-3 text-sm text-slate-600">
        <p aria-live="polite">
          {filteredCount === 0 ? 'No rows' : `Rows ${first}–${last} of ${filteredCount}`}
          {filteredCount !== members.length && ` (filtered from ${members.length})`}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-1.5">
            Rows per page
            <select
              className="rounded border border-slate-300 bg-white px-1.5 py-0.5 text-sm"
              value={pagination.pageSize}
              onChange={(event) => table.setPageSize(Number(event.target.value))}
            >
              {pageSizes.map((size) => (
                <option key={size} value={size}>
                  {size}
                </option>
              ))}
            </select>
          </label>
          <Button size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </Button>
          <span className="tabular-nums">
            Page {table.getPageCount() === 0 ? 0 : pagination.pageIndex + 1} of {table.getPageCount()}
          </span>
          <Button size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </Button>
        </div>
      </div>
    </div>
  );
}

function ariaSort(header: Header<typeof features, Member, unknown>): 'ascending' | 'descending' | 'none' | undefined {
  if (!header.column.getCanSort()) return undefined;
  const sorted = header.column.getIsSorted();
  return sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none';
}

function SortMark({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <span aria-hidden="true" className={`text-[10px] ${direction ? 'text-primary-700' : 'text-slate-300'}`}>
      {direction === 'desc' ? '▼' : direction === 'asc' ? '▲' : '↕'}
    </span>
  );
}
