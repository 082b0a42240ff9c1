import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AgentKind, AveragingTime, ExposureUnit } from '@schema/agents';
import type { NoiseCriteriaSet } from '@schema/exposure-groups';
import { api, apiPath } from '@frontend/lib/api-client';
import type { EffectiveOel, PlanPick, PlanProgress } from '@frontend/lib/api-types';
import { orgKeys } from '@frontend/lib/query-keys';

/** What the printable field sheet shows (GET /api/orgs/:orgId/sampling-plans/:planId/field-sheet). */
export interface FieldSheet {
  generatedAt: string;
  organization: { name: string };
  site: { id: number; name: string };
  group: {
    id: number;
    name: string;
    processArea: string;
    jobTitles: string[];
    tasks: string;
    shiftHours: number;
    actionLevel: number | null;
    noiseCriteriaSet: NoiseCriteriaSet | null;
    oel: { value: number; unit: ExposureUnit; source: string; averagingTime: AveragingTime };
    effectiveOel: EffectiveOel;
  };
  agent: { id: number; name: string; kind: AgentKind; casNumber: string | null };
  plan: {
    id: number;
    title: string;
    startDate: string;
    endDate: string;
    targetCount: number;
    includeWeekends: boolean;
    seed: number;
    draw: number;
    progress: PlanProgress;
    warnings: string[];
  };
  rows: PlanPick[];
  /** Blank columns for the person who samples, by kind of agent. */
  fieldsToRecord: string[];
  instructions: string[];
  cautions: string[];
}

export function getFieldSheet(organizationId: string, planId: string, signal?: AbortSignal): Promise<FieldSheet> {
  return api.get<FieldSheet>(`${apiPath('/api/orgs', organizationId, 'sampling-plans', planId)}/field-sheet`, { signal });
}

export function fieldSheetQuery(organizationId: string, planId: string) {
  return queryOptions({
    queryKey: [...orgKeys.samplingPlans(organizationId), 'field-sheet', planId] as const,
    queryFn: ({ signal }) => getFieldSheet(organizationId, planId, signal),
  });
}

export function useFieldSheet(organizationId: string, planId: string) {
  return useQuery(fieldSheetQuery(organizationId, planId));
}
