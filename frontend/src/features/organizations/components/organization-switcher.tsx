import { useId } from 'react';
import { roleLabels, type Role } from '@schema/permissions';

export interface OrganizationChoice {
  organizationId: number | string;
  organizationName: string;
  role: Role;
}

/**
 * Which organization the pages show. People with one membership see its name; people with
 * several (consultants, mostly) get a select. Changing it calls `onSelect`; the caller
 * navigates, so the choice is in the URL and links stay shareable.
 */
export function OrganizationSwitcher({
  memberships,
  currentOrganizationId,
  onSelect,
}: {
  memberships: readonly OrganizationChoice[];
  currentOrganizationId: string | undefined;
  onSelect: (organizationId: string) => void;
}) {
  const id = useId();
  const current = memberships.find((m) => String(m.organizationId) === currentOrganizationId);

  if (memberships.length <= 1) {
    return current ? (
      <div>
        <p className="text-[11px] font-medium tracking-wide text-slate-400 uppercase">Organization</p>
        <p className="mt-0.5 font-medium text-white">{current.organizationName}</p>
        <p className="text-xs text-slate-400">{roleLabels[current.role]}</p>
      </div>
    ) : null;
  }

  return (
    <div>
      <label htmlFor={id} className="text-[11px] font-medium tracking-wide text-slate-400 uppercase">
        Organization
      </label>
      <select
        id={id}
        value={currentOrganizationId ?? ''}
        onChange={(event) => onSelect(event.target.value)}
        className="mt-1 block w-full rounded border border-slate-600 bg-slate-800 px-2 py-1.5 text-sm text-white hover:border-slate-500"
      >
        {currentOrganizationId === undefined && <option value="">Choose…</option>}
        {memberships.map((m) => (
          <option key={String(m.organizationId)} value={String(m.organizationId)}>
            {m.organizationName}
          </option>
        ))}
      </select>
      {current && <p className="mt-1 text-xs text-slate-400">{roleLabels[current.role]}</p>}
    </div>
  );
}
