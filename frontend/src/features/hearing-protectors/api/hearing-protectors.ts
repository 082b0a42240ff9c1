import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HearingProtectorCreate, HearingProtectorView, ProtectorAdequacy, ProtectorSettingsValues } from '@schema/hearing-protectors';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';

/*
 * Hearing protectors: the organization's list (GET/POST /hearing-protectors, archive), the protectors
 * in use in a noise group, their adequacy by method, and the verdict settings.
 */

export const protectorKeys = {
  all: (organizationId: string) => [...orgKeys.all(organizationId), 'hearing-protectors'] as const,
  settings: (organizationId: string) => [...orgKeys.all(organizationId), 'protector-settings'] as const,
};

const base = (organizationId: string) => apiPath('/api/orgs', organizationId);

/** GET /api/orgs/:orgId/hearing-protectors?archived= (org:read). */
export function hearingProtectorsQuery(organizationId: string, archived: 'false' | 'all' = 'false') {
  return queryOptions({
    queryKey: [...protectorKeys.all(organizationId), 'list', archived] as const,
    queryFn: ({ signal }) => api.get<HearingProtectorView[]>(`${base(organizationId)}/hearing-protectors?archived=${archived}`, { signal }),
  });
}
export function useHearingProtectors(organizationId: string, archived: 'false' | 'all' = 'false') {
  return useQuery(hearingProtectorsQuery(organizationId, archived));
}

/** POST /api/orgs/:orgId/hearing-protectors → 201; 400 names the rating out of range. */
export function useCreateHearingProtector(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    (protector: HearingProtectorCreate) => api.post<HearingProtectorView>(`${base(organizationId)}/hearing-protectors`, protector),
    [protectorKeys.all],
  );
}

/** POST …/hearing-protectors/:id/archive or /unarchive. */
export function useArchiveHearingProtector(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ protectorId, archived, reason }: { protectorId: number; archived: boolean; reason?: string }) =>
      setArchived<HearingProtectorView>(`${base(organizationId)}/hearing-protectors/${protectorId}`, archived, reason),
    [protectorKeys.all],
  );
}

/** GET /api/orgs/:orgId/protector-settings (org:read). */
export function useProtectorSettings(organizationId: string) {
  return useQuery(
    queryOptions({
      queryKey: protectorKeys.settings(organizationId),
      queryFn: ({ signal }) => api.get<ProtectorSettingsValues>(`${base(organizationId)}/protector-settings`, { signal }),
    }),
  );
}

/** PUT /api/orgs/:orgId/protector-settings (settings:manage). */
export function useUpdateProtectorSettings(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    (values: ProtectorSettingsValues) => api.put<ProtectorSettingsValues>(`${base(organizationId)}/protector-settings`, values),
    [protectorKeys.settings, protectorKeys.all],
  );
}

/** POST /api/orgs/:orgId/exposure-groups/:groupId/protectors (data:edit). */
export function useAddGroupProtector(organizationId: string, groupId: number) {
  return useOrganizationMutation(
    organizationId,
    (protectorId: number) => api.post<HearingProtectorView[]>(`${base(organizationId)}/exposure-groups/${groupId}/protectors`, { protectorId }),
    [protectorKeys.all],
  );
}

/** DELETE /api/orgs/:orgId/exposure-groups/:groupId/protectors/:protectorId (data:edit, audited). */
export function useRemoveGroupProtector(organizationId: string, groupId: number) {
  return useOrganizationMutation(
    organizationId,
    (protectorId: number) => api.delete<HearingProtectorView[]>(`${base(organizationId)}/exposure-groups/${groupId}/protectors/${protectorId}`),
    [protectorKeys.all],
  );
}

/** GET …/exposure-groups/:groupId/protector-adequacy?level=p95|typed&la&lc&assumedCMinusA (org:read). */
export function useProtectorAdequacy(organizationId: string, groupId: number, query: string) {
  return useQuery(
    queryOptions({
      queryKey: [...protectorKeys.all(organizationId), 'adequacy', groupId, query] as const,
      queryFn: ({ signal }) => api.get<ProtectorAdequacy>(`${base(organizationId)}/exposure-groups/${groupId}/protector-adequacy?${query}`, { signal }),
      retry: false,
    }),
  );
}
