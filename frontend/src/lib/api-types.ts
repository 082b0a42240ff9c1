import type { Agent, AgentKind, ExposureUnit } from '@schema/agents';
import type { ExposureGroup } from '@schema/exposure-groups';
import type { samplingGuidance, SamplingPlan } from '@schema/sampling-plans';
import type { ShiftResult, ShiftResultDetails } from '@schema/shift-results';
import type { GroupMembership } from '@schema/workers';

/*
 * Answer shapes that more than one feature shows (the group page composes several features).
 * They mirror what backend/src/services/*.ts return; the browser never imports the backend, so
 * they are written out here on top of the row types in schema/ (type-only imports).
 */

/** A worker inside another record: the code always, the name only for roles that may see names. */
export interface WorkerReference {
  id: number;
  code: string;
  jobTitle: string;
  /** Absent when the role may not see names (then `nameHidden` is true); null when none was recorded. */
  name?: string | null;
  nameHidden?: true;
}

/** One period of a worker in a group, as the group's member list sends it. */
export interface GroupMember {
  id: number;
  exposureGroupId: number;
  fromDate: string;
  toDate: string | null;
  /** Covers the server's today. */
  current: boolean;
  worker: WorkerReference & { archived: boolean };
}

/** One period of a group in a worker's history (GET /workers/:id). */
export type WorkerMembership = Omit<GroupMembership, 'organizationId'> & { groupName: string; current: boolean };

/** The limit a group is judged against, after any extended-shift adjustment. */
export interface EffectiveOel {
  value: number;
  unit: ExposureUnit;
  baseValue: number;
  reductionFactor: number;
  method: 'none' | 'brief-scala';
  statement: string;
}

/** An exposure group as lists and pages show it. */
export type ExposureGroupView = ExposureGroup & {
  siteName: string;
  agentName: string;
  agentKind: AgentKind;
  memberCount: number;
  validResultCount: number;
  voidResultCount: number;
  effectiveOel: EffectiveOel;
};

/** Why a plan asks for 6 shifts, with its sources (GET /sampling-guidance). */
export type SamplingGuidance = typeof samplingGuidance;

export interface PlanPick {
  id: number;
  position: number;
  date: string;
  weekday: string;
  worker: WorkerReference;
  /** A valid result exists for this worker and date in the group. */
  done: boolean;
  resultId: number | null;
}

export interface PlanProgress {
  targetCount: number;
  picked: number;
  done: number;
  remaining: number;
  percentOfTarget: number;
  validResultsInWindow: number;
  unplannedResultsInWindow: number;
}

export type PlanSummary = Omit<SamplingPlan, 'organizationId'> & { exposureGroupName: string; progress: PlanProgress; warnings: string[] };
export type PlanView = PlanSummary & { picks: PlanPick[]; guidance: SamplingGuidance };

/** A shift result as the API sends it. */
export type ShiftResultView = Omit<ShiftResult, 'organizationId' | 'details'> & {
  /** How the value was reached (the select schema types this JSON column loosely). */
  details: ShiftResultDetails | null;
  worker: WorkerReference;
  exposureGroupName: string;
  agentName: string;
  createdBy: { id: number; name: string } | null;
  voidedBy: { id: number; name: string } | null;
};

/** The agent as the group page shows it. */
export type GroupAgent = Pick<Agent, 'id' | 'name' | 'kind' | 'casNumber' | 'molecularWeight'>;
