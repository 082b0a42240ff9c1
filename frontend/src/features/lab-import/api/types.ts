import type { ExposureUnit } from '@schema/agents';
import type { ImportBatchSummary, LabImportPreview, LabImportProblem } from '@schema/lab-imports';
import { isApiError } from '@frontend/lib/api-client';

export type { ImportBatchSummary, LabImportPreview, LabImportProblem };

/** What the upload answers: the stored batch, its preview and warnings (e.g. the same file committed before). */
export interface LabUpload {
  batch: ImportBatchSummary;
  preview: LabImportPreview;
  warnings?: string[];
}

/** One shift result a check says the import would store. */
export interface PlannedResult {
  rows: number[];
  workerCode: string;
  date: string;
  exposureGroupId: number;
  exposureGroupName: string;
  value: number;
  unit: ExposureUnit;
  nonDetect: boolean;
  detectionLimit: number | null;
  sampleId: string | null;
  statement: string;
  flags: string[];
}

export interface LabImportCheck {
  batch: ImportBatchSummary;
  resultCount: number;
  results: PlannedResult[];
}

/**
 * Every problem of a refused upload, check or commit (400 `details.problems`), or null when the
 * error is of another kind. The server lists them all, by row and column; nothing was stored.
 */
export function importProblems(error: unknown): LabImportProblem[] | null {
  if (!isApiError(error, 400)) return null;
  const problems = (error.details as { problems?: unknown } | undefined)?.problems;
  return Array.isArray(problems) ? (problems as LabImportProblem[]) : null;
}
