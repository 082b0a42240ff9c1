import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MixtureCreate, MixturePlan, MixtureUpdate, MixtureView } from '@schema/mixtures';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys, resultChangeKeys } from '@frontend/lib/query-keys';

/* Mixtures of agents with similar effects, and the mixture index results of a mixture group. */

const mixtureKeys = (organizationId: string) => [...orgKeys.all(organizationId), 'mixtures'] as const;
const base = (organizationId: string) => apiPath('/api/orgs', organizationId);

/** GET /api/orgs/:orgId/mixtures (org:read). */
export function useMixtures(organizationId: string) {
  return useQuery(
    queryOptions({
      queryKey: mixtureKeys(organizationId),
      queryFn: ({ signal }) => api.get<MixtureView[]>(`${base(organizationId)}/mixtures`, { signal }),
    }),
  );
}

/** POST /api/orgs/:orgId/mixtures → 201 (data:edit); also refreshes the agents (a mixture is an agent). */
export function useCreateMixture(organizationId: string) {
  return useOrganizationMutation(organizationId, (mixture: MixtureCreate) => api.post<MixtureView>(`${base(organizationId)}/mixtures`, mixture), [
    mixtureKeys,
    orgKeys.agents,
  ]);
}

/** PATCH /api/orgs/:orgId/mixtures/:mixtureId (data:edit); components only while the mixture has no valid results (else 409). */
export function useUpdateMixture(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ mixtureId, changes }: { mixtureId: number; changes: MixtureUpdate }) => api.patch<MixtureView>(`${base(organizationId)}/mixtures/${mixtureId}`, changes),
    [mixtureKeys, orgKeys.agents, orgKeys.exposureGroups],
  );
}

/** POST …/mixtures/:mixtureId/archive | unarchive (data:edit); 409 while a group in use has the mixture. */
export function useArchiveMixture(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ mixtureId, archived, reason }: { mixtureId: number; archived: boolean; reason?: string }) =>
      setArchived<MixtureView>(`${base(organizationId)}/mixtures/${mixtureId}`, archived, reason),
    [mixtureKeys, orgKeys.agents],
  );
}

/** GET …/exposure-groups/:groupId/mixture-preview (org:read): what computing would write, skip and replace. */
export function useMixturePreview(organizationId: string, groupId: number) {
  return useQuery(
    queryOptions({
      queryKey: [...mixtureKeys(organizationId), 'preview', groupId] as const,
      queryFn: ({ signal }) => api.get<MixturePlan>(`${base(organizationId)}/exposure-groups/${groupId}/mixture-preview`, { signal }),
      retry: false,
    }),
  );
}

/** POST …/exposure-groups/:groupId/mixture-results (data:edit): writes the results in one transaction. */
export function useComputeMixtureResults(organizationId: string, groupId: number) {
  return useOrganizationMutation(
    organizationId,
    () => api.post<MixturePlan & { written: number; voided: number }>(`${base(organizationId)}/exposure-groups/${groupId}/mixture-results`, {}),
    [mixtureKeys, ...resultChangeKeys, orgKeys.summary],
  );
}
