import type { SiteCreate } from '@schema/sites';
import { api, apiPath } from '@frontend/lib/api-client';
import { useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { SiteView } from './get-sites';

/** POST /api/orgs/:orgId/sites → 201; 409 when the name is taken. */
export function createSite(organizationId: string, site: SiteCreate): Promise<SiteView> {
  return api.post<SiteView>(`${apiPath('/api/orgs', organizationId)}/sites`, site);
}

export function useCreateSite(organizationId: string) {
  return useOrganizationMutation(organizationId, (site: SiteCreate) => createSite(organizationId, site), [orgKeys.sites, orgKeys.summary]);
}
