import type { SiteUpdate } from '@schema/sites';
import { api, apiPath } from '@frontend/lib/api-client';
import { setArchived, useOrganizationMutation } from '@frontend/lib/org-mutation';
import { orgKeys } from '@frontend/lib/query-keys';
import type { SiteView } from './get-sites';

// Groups show their site's name, so a site change refreshes the group lists too.
const touches = [orgKeys.sites, orgKeys.exposureGroups, orgKeys.summary];

/** PATCH /api/orgs/:orgId/sites/:siteId. */
export function updateSite(organizationId: string, siteId: number, changes: SiteUpdate): Promise<SiteView> {
  return api.patch<SiteView>(apiPath('/api/orgs', organizationId, 'sites', siteId), changes);
}

export function useUpdateSite(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ siteId, changes }: { siteId: number; changes: SiteUpdate }) => updateSite(organizationId, siteId, changes),
    touches,
  );
}

/** POST …/sites/:siteId/archive | unarchive `{ reason? }`; 409 while a group of the site is in use. */
export function useArchiveSite(organizationId: string) {
  return useOrganizationMutation(
    organizationId,
    ({ siteId, archived, reason }: { siteId: number; archived: boolean; reason?: string }) =>
      setArchived<SiteView>(apiPath('/api/orgs', organizationId, 'sites', siteId), archived, reason),
    touches,
  );
}
