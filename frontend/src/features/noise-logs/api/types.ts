import type { NoiseColumnMapping, NoiseLogStatus, NoiseLogStoredMetadata, NoiseMaskOrigin } from '@schema/noise-logs';

/** Dose % and TWA of one criteria set (null when not computable). */
export interface CriteriaFigures {
  dose: number | null;
  twa: number | null;
}
/** One block of figures, as stats/noise-exposure.ts computes them. */
export interface NoiseFigureBlock {
  oshaPel: CriteriaFigures;
  oshaHc: CriteriaFigures;
  nioshRel: CriteriaFigures;
  iso: { laeq: number | null; lex8h: number | null };
}

/** A noise log in lists (GET /noise-logs). */
export interface NoiseLogListItem {
  id: number;
  exposureGroupId: number;
  workerId: number;
  instrument: string;
  shiftDate: string;
  fileName: string;
  fileSize: number;
  sha256: string;
  format: 'v1' | 'mapped';
  intervalSeconds: number;
  runSeconds: number;
  summary: {
    asLogged: NoiseFigureBlock;
    maxLcPeakDb: number | null;
    calibrationDriftDb: number | null;
    stillStretchCount: number | null;
    longestStillStretchSeconds: number | null;
    knockCount: number | null;
  };
  status: NoiseLogStatus;
  shiftResultId: number | null;
  createdAt: string;
  workerCode: string;
  exposureGroupName: string;
  uploadedBy: string | null;
}

export interface NoiseMaskView {
  id: number;
  startS: number;
  endS: number;
  reason: string;
  origin: NoiseMaskOrigin;
  author: string | null;
  createdAt: string;
  updatedAt: string;
  effect: {
    maskedSeconds: number;
    doseChange: Record<'oshaPel' | 'oshaHc' | 'nioshRel', number | null>;
    laeqChangeDb: number | null;
  };
}

/** One log as the review page gets it (GET /noise-logs/:logId; services/noise-logs.ts getNoiseLog). */
export interface NoiseLogDetail extends NoiseLogListItem {
  metadata: NoiseLogStoredMetadata;
  mapping: NoiseColumnMapping | null;
  settings: Record<string, number>;
  intervalCount: number;
  acceptedAt: string | null;
  group: {
    id: number;
    name: string;
    noiseCriteriaSet: 'oshaPel' | 'oshaHc' | 'nioshRel' | 'iso' | null;
    oelUnit: string;
    oelValue: number;
    dataVersion: number;
  };
  figures: {
    runSeconds: number;
    intervalSeconds: number;
    maskedSeconds: number;
    asLogged: NoiseFigureBlock;
    reviewed: NoiseFigureBlock;
    maxLcPeakDb: number | null;
    calibrationDriftDb: number | null;
  };
  stillStretches: Array<{ startS: number; endS: number }> | null;
  knocks: Array<{ tS: number; peakMg: number }> | null;
  wearCheckAvailable: boolean;
  knockCheckAvailable: boolean;
  longestStillStretchSeconds: number | null;
  stillStretchNotice: boolean;
  calibration: { referenceDb: number | null; beforeDb: number | null; afterDb: number | null; driftDb: number | null; limitDb: number; exceedsLimit: boolean };
  actionLevel: { dosePercent: 50; twaDb: 85; asLoggedReached: boolean; reviewedReached: boolean | null };
  peakOver140Db: boolean | null;
  exposureHours: number;
  exposureHoursSource: 'option' | 'file' | 'run time';
  pauseCount: number;
  pauseSeconds: number;
  startS: number;
  endS: number;
  masks: NoiseMaskView[];
}

/** Chart data (GET /noise-logs/:logId/channels). */
export interface NoiseChannelData {
  fromS: number;
  toS: number;
  intervalSeconds: number;
  downsampled: boolean;
  intervals: number;
  tS: number[];
  laeqDb: number[];
  peak: { tS: number[]; lcPeakDb: number[] } | null;
}
