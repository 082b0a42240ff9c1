import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventView, AuditFilterOptions } from '@schema/audit';
import type { ListPage } from '@schema/list-query';
import { api, apiPath } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

/** The audit trail's filters as they go into the query string (the CSV export uses the same). */
export interface AuditFilters {
  person?: string;
  entityType?: string;
  from?: string;
  to?: string;
}

export const auditFilterNames = ['person', 'entityType', 'from', 'to'] as const;

/** `person=3&from=2025-01-01` from the filters that are set (plus paging when given). */
export function auditQueryString(filters: AuditFilters, paging?: { page: number; pageSize: number }): string {
  const query = new URLSearchParams();
  for (const name of auditFilterNames) {
    const value = filters[name];
    if (value) query.set(name, value);
  }
  if (paging) {
    query.set('page', String(paging.page));
    query.set('pageSize', String(paging.pageSize));
  }
  return query.toString();
}

const auditKey = (organizationId: string) => [...orgKeys.all(organizationId), 'audit'] as const;

/** GET /api/orgs/:orgId/audit-events (audit:read), newest first. */
export function auditEventsQuery(organizationId: string, query: string) {
  return queryOptions({
    queryKey: [...auditKey(organizationId), 'events', query] as const,
    queryFn: ({ signal }) => api.get<ListPage<AuditEventView>>(`${apiPath('/api/orgs', organizationId)}/audit-events?${query}`, { signal }),
    placeholderData: keepPreviousData,
  });
}

export function useAuditEvents(organizationId: string, query: string) {
  return useQuery(auditEventsQuery(organizationId, query));
}

/** GET /api/orgs/:orgId/audit-filters: the people and entity types to filter by. */
export function useAuditFilterOptions(organizationId: string) {
  return useQuery({
    queryKey: [...auditKey(organizationId), 'filters'] as const,
    queryFn: ({ signal }) => api.get<AuditFilterOptions>(`${apiPath('/api/orgs', organizationId)}/audit-filters`, { signal }),
  });
}

/** The CSV export's address for the same filters (a plain download; the session cookie goes with it). */
export function auditCsvUrl(organizationId: string, filters: AuditFilters): string {
  const query = auditQueryString(filters);
  return `${apiPath('/api/orgs', organizationId)}/audit-events.csv${query ? `?${query}` : ''}`;
}
