import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AssessmentRefusalDetails, GroupAssessmentResponse, PriorName } from '@schema/assessment';
import { api, apiPath, isApiError } from '@frontend/lib/api-client';
import { orgKeys } from '@frontend/lib/query-keys';

export type { AssessmentRefusalDetails, GroupAssessmentResponse, PriorName } from '@schema/assessment';

/** What a run of the assessment varies: results left out (what-if) and the Bayesian prior. */
export interface AssessmentVariant {
  /** Result ids left out, sorted ascending (the key must not depend on the order they were ticked). */
  exclude: readonly number[];
  prior: PriorName;
}

/** Under the group's key, so anything that refreshes the organization's groups refreshes its assessments too. */
export const assessmentKey = (organizationId: string, groupId: string, variant: AssessmentVariant) =>
  [...orgKeys.exposureGroups(organizationId), 'one', groupId, 'assessment', { exclude: [...variant.exclude], prior: variant.prior }] as const;

/** GET /api/orgs/:orgId/exposure-groups/:groupId/assessment?exclude=…&prior=… (org:read; variations need stats:run). */
export function getAssessment(organizationId: string, groupId: string, variant: AssessmentVariant, signal?: AbortSignal): Promise<GroupAssessmentResponse> {
  const search = new URLSearchParams();
  if (variant.exclude.length > 0) search.set('exclude', variant.exclude.join(','));
  if (variant.prior !== 'reference') search.set('prior', variant.prior);
  const query = search.size > 0 ? `?${search.toString()}` : '';
  return api.get<GroupAssessmentResponse>(`${apiPath('/api/orgs', organizationId, 'exposure-groups', groupId, 'assessment')}${query}`, { signal });
}

export function assessmentQuery(organizationId: string, groupId: string, variant: AssessmentVariant) {
  return queryOptions({
    queryKey: assessmentKey(organizationId, groupId, variant),
    queryFn: ({ signal }) => getAssessment(organizationId, groupId, variant, signal),
    // The same data give the same figures (the server caches them by the data hash): no refetch on focus.
    staleTime: 5 * 60_000,
    // "Cannot be assessed" is an answer, not a glitch: do not retry it.
    retry: (failures, error) => !isApiError(error, 422) && !isApiError(error, 400) && !isApiError(error, 403) && !isApiError(error, 404) && failures < 2,
  });
}

/**
 * The assessment for a variant. While a new variant computes, the previous figures stay on screen
 * (`isPlaceholderData` is true), so ticking "leave out" never blanks the page.
 */
export function useAssessment(organizationId: string, groupId: string, variant: AssessmentVariant, options: { enabled?: boolean } = {}) {
  return useQuery({ ...assessmentQuery(organizationId, groupId, variant), placeholderData: keepPreviousData, enabled: options.enabled });
}

/** The 422 details of a group that cannot be assessed (the rule and what can still be shown), else null. */
export function assessmentRefusal(error: unknown): (AssessmentRefusalDetails & { message: string }) | null {
  if (!isApiError(error, 422) || typeof error.details !== 'object' || error.details === null) return null;
  const details = error.details as AssessmentRefusalDetails;
  return typeof details.rule === 'string' && details.group && details.data ? { ...details, message: error.message } : null;
}
