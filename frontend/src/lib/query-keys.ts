/**
 * Cache keys of the organization's records, in one place so that a change made through one
 * feature refreshes what other features show (features do not import each other). Every key
 * starts with ['orgs', orgId], so signing out or switching organization can drop them together.
 * A list key is a prefix of its queries' keys (which add their filters), so invalidating it
 * refreshes every page, sort and filter of that list.
 */
export const orgKeys = {
  all: (organizationId: string) => ['orgs', organizationId] as const,
  summary: (organizationId: string) => ['orgs', organizationId, 'summary'] as const,
  sites: (organizationId: string) => ['orgs', organizationId, 'sites'] as const,
  agents: (organizationId: string) => ['orgs', organizationId, 'agents'] as const,
  oelEntries: (organizationId: string) => ['orgs', organizationId, 'oel-entries'] as const,
  exposureGroups: (organizationId: string) => ['orgs', organizationId, 'exposure-groups'] as const,
  workers: (organizationId: string) => ['orgs', organizationId, 'workers'] as const,
  shiftResults: (organizationId: string) => ['orgs', organizationId, 'shift-results'] as const,
  samplingPlans: (organizationId: string) => ['orgs', organizationId, 'sampling-plans'] as const,
  labImports: (organizationId: string) => ['orgs', organizationId, 'lab-imports'] as const,
  samplingGuidance: (organizationId: string) => ['orgs', organizationId, 'sampling-guidance'] as const,
  decisionRecords: (organizationId: string) => ['orgs', organizationId, 'decision-records'] as const,
  dashboard: (organizationId: string) => ['orgs', organizationId, 'dashboard'] as const,
  noiseEstimates: (organizationId: string) => ['orgs', organizationId, 'noise-estimates'] as const,
};

/**
 * What a change to shift results makes stale: the result lists, the groups (counts, data version), the
 * plans' progress, and the decision records and dashboard (their "out of date" marks).
 */
export const resultChangeKeys = [orgKeys.shiftResults, orgKeys.exposureGroups, orgKeys.samplingPlans, orgKeys.decisionRecords, orgKeys.dashboard] as const;
