import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { ListPage } from '@schema/list-query';
import { ArchivableListTable, type ArchivableRecordKind } from '@frontend/components/archivable-list-table';
import type { ListTableFeatures } from '@frontend/components/data-table';
import { formatDate } from '@frontend/lib/format';
import type { ListParams } from '@frontend/lib/list-params';
import type { SiteView } from '../api/get-sites';
import { useArchiveSite } from '../api/update-site';

const column = createColumnHelper<ListTableFeatures, SiteView>();

const columns = column.columns([
  column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-slate-900">{info.getValue()}</span> }),
  column.accessor('description', {
    header: 'Description',
    enableSorting: false,
    cell: (info) => <span className="line-clamp-2 max-w-md text-slate-700">{info.getValue() || '—'}</span>,
  }),
  column.accessor('exposureGroupCount', {
    header: 'Groups in use',
    enableSorting: false,
    cell: (info) => <span className="tabular-nums">{info.getValue()}</span>,
  }),
  column.accessor('updatedAt', { header: 'Changed', cell: (info) => <span className="text-slate-600 tabular-nums">{formatDate(info.getValue())}</span> }),
]);

/** The sites list: sort by name or last change, page through; edit and archive for editors. */
export function SitesTable({
  organizationId,
  ...props
}: {
  organizationId: string;
  page: ListPage<SiteView>;
  params: ListParams;
  busy: boolean;
  canEdit: boolean;
  onOutcome: (message: string) => void;
  onEdit: (site: SiteView) => void;
}) {
  const { mutateAsync } = useArchiveSite(organizationId);
  const kind = useMemo<ArchivableRecordKind<SiteView>>(
    () => ({
      what: 'site',
      plural: 'sites',
      consequence: 'It leaves the pick lists; its exposure groups and their results stay. A site with groups in use cannot be archived.',
      nameOf: (site) => site.name,
      archive: (site, archived, reason) => mutateAsync({ siteId: site.id, archived, reason }),
      addHint: 'Add the first site with “Add site”.',
      readerHint: 'A hygienist adds sites here.',
    }),
    [mutateAsync],
  );
  return <ArchivableListTable kind={kind} columns={columns} caption="Sites" filterKeys={['archived']} {...props} />;
}
