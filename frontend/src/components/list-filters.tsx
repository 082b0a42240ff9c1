import type { ReactNode } from 'react';
import type { ListParams } from '@frontend/lib/list-params';
import { SelectField } from './form-field';
import { SearchField } from './search-field';

/** A select bound to one filter of a list's address (`?kind=noise`); '' removes the filter. */
export function FilterSelect({
  params,
  name,
  label,
  options,
  className = 'w-44',
}: {
  params: ListParams;
  name: string;
  label: string;
  options: ReadonlyArray<{ value: string; label: string }>;
  className?: string;
}) {
  return (
    <SelectField
      label={label}
      className={className}
      options={options}
      value={params.filter(name) ?? ''}
      onChange={(event) => params.update({ [name]: event.target.value })}
    />
  );
}

const archivedOptions = [
  { value: '', label: 'In use' },
  { value: 'true', label: 'Archived' },
  { value: 'all', label: 'In use and archived' },
];

/** Search box plus "Show: in use / archived / all" (unless `archivable` is false), and any other filters, above a list. */
export function ListToolbar({
  params,
  searchLabel,
  label,
  archivable = true,
  children,
}: {
  params: ListParams;
  searchLabel: string;
  label: string;
  archivable?: boolean;
  children?: ReactNode;
}) {
  return (
    <div className="flex flex-wrap items-start gap-3" role="search" aria-label={label}>
      <SearchField label={searchLabel} value={params.q} onSearch={(q) => params.update({ q }, { replace: true })} />
      {children}
      {archivable && <FilterSelect params={params} name="archived" label="Show" options={archivedOptions} className="w-48" />}
    </div>
  );
}
