/**
 * The whole noise-log computation behind `npm run -s noise` and the review page: wear check,
 * proposed masks, as-logged and reviewed figures, peak and calibration drift
 * (PRODUCT.md, "Noise log format, version 1" and "Command-line contracts").
 *
 * For the review page: {@link prepareNoiseAnalysis} once per log (weights, wear check), then
 * {@link analyzePreparedNoiseLog} after every mask edit (sums only).
 */
import { noiseLogLimits, noiseLogRunSeconds, noiseLogTimeToleranceSeconds, type NoiseLog } from './noise-log';
import {
  computeNoiseFigures,
  noiseMaskEffect,
  prepareNoiseExposure,
  type NoiseExposureModel,
  type NoiseFigures,
  type NoiseMaskEffect,
  type NoiseMaskSpan,
} from './noise-exposure';
import { resolveNoiseSettings, type NoiseSettings } from './noise-settings';
import { runWearCheck, type NoiseMotionSource, type NoiseWearCheck } from './noise-wear-check';

/** Options for {@link analyzeNoiseLog}. */
export interface NoiseAnalysisOptions {
  /** Organization settings; missing ones take the PRODUCT.md defaults. */
  readonly settings?: Partial<NoiseSettings>;
  /** Masks for the reviewed figures. When given (even empty) they replace the proposed masks. */
  readonly masks?: readonly NoiseMaskSpan[];
  /** Shift hours for LEX,8h; overrides the file's shift_hours. Never changes the dose. */
  readonly shiftHours?: number | null;
}

/** Calibration check of the log, with the drift flag. */
export interface NoiseCalibrationCheck {
  readonly referenceDb: number | null;
  readonly beforeDb: number | null;
  readonly afterDb: number | null;
  /** after − before, dB; null unless both are given. */
  readonly driftDb: number | null;
  readonly limitDb: number;
  /** True when |drift| exceeds the limit (ISO 9612 discard rule, from memory; see settings). */
  readonly exceedsLimit: boolean;
}

/** Figures for the review page that the command line does not print. */
export interface NoiseAnalysisDetails {
  readonly settings: NoiseSettings;
  /** Te used for LEX,8h, hours, and where it came from. */
  readonly exposureHours: number;
  readonly exposureHoursSource: 'option' | 'file' | 'run time';
  /** Whether the reviewed figures use the proposed masks or masks given by the caller. */
  readonly masksSource: 'proposed' | 'given';
  readonly masksUsed: readonly NoiseMaskSpan[];
  readonly maskedIntervals: number;
  /** Masked flag per interval (1 = masked), for the chart. */
  readonly masked: Uint8Array;
  readonly wearCheckAvailable: boolean;
  readonly motionSource: NoiseMotionSource | null;
  /** Motion flag per interval; null when the wear check is unavailable. */
  readonly moving: Uint8Array | null;
  /** False when there is no apeak_mg column (or no wear check): knocks could not be looked for. */
  readonly knockCheckAvailable: boolean;
  readonly longestStillStretchSeconds: number | null;
  /** What each proposed mask alone would change (dose in percentage points, LAeq in dB). */
  readonly proposedMaskEffects: readonly (NoiseMaskEffect & { readonly reason: string })[];
  /** What each mask in use alone changes. */
  readonly maskEffects: readonly NoiseMaskEffect[];
  readonly calibration: NoiseCalibrationCheck;
  /**
   * Hearing-conservation trigger, shown wherever noise results are: OSHA 29 CFR 1910.95(c) action
   * level, 85 dBA TWA = 50 % dose on the oshaHc set (80 dB threshold). null when the dose is null.
   */
  readonly actionLevel: {
    readonly dosePercent: 50;
    readonly twaDb: 85;
    readonly asLoggedReached: boolean;
    readonly reviewedReached: boolean | null;
  };
  /**
   * True when the highest C-weighted peak exceeds 140 dB (OSHA 1910.95(b)(1): impulse "should not
   * exceed 140 dB peak"; Directive 2003/10/EC Art. 3 limit 140 dB(C)); null without lcpeak_db.
   */
  readonly peakOver140Db: boolean | null;
  /** Pauses (jumps in t_s): how many and their total length, s. */
  readonly pauseCount: number;
  readonly pauseSeconds: number;
  /** First interval start and last interval end, s. */
  readonly startS: number;
  readonly endS: number;
}

/** The command-line document (PRODUCT.md key order) plus `details` for the interface. */
export interface NoiseAnalysis {
  readonly runSeconds: number;
  readonly intervalSeconds: number;
  readonly maskedSeconds: number;
  readonly asLogged: NoiseFigures;
  readonly reviewed: NoiseFigures;
  readonly stillStretches: { startS: number; endS: number }[] | null;
  readonly knocks: { tS: number; peakMg: number }[] | null;
  readonly proposedMasks: { startS: number; endS: number; reason: string }[];
  readonly maxLcPeakDb: number | null;
  readonly calibrationDriftDb: number | null;
  readonly details: NoiseAnalysisDetails;
}

/** The document `npm run -s noise` prints: the analysis without `details`. */
export type NoiseCliReport = Omit<NoiseAnalysis, 'details'>;

/** Everything about a log that does not depend on the masks. */
export interface PreparedNoiseAnalysis {
  readonly log: NoiseLog;
  readonly settings: NoiseSettings;
  readonly exposure: NoiseExposureModel;
  readonly wearCheck: NoiseWearCheck;
  readonly exposureHours: number;
  readonly exposureHoursSource: NoiseAnalysisDetails['exposureHoursSource'];
  /** Fixed part of the result. */
  readonly fixed: Omit<NoiseAnalysis, 'maskedSeconds' | 'reviewed' | 'details'> & {
    readonly details: Omit<NoiseAnalysisDetails, 'masksSource' | 'masksUsed' | 'maskedIntervals' | 'masked' | 'maskEffects' | 'actionLevel'>;
  };
}

function maxOf(values: Float64Array | null): number | null {
  if (!values || values.length === 0) return null;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i] > max) max = values[i];
  return max;
}

/** Dose ≥ 50 %, allowing 1e-9 relative for summation rounding (8 h at 85 dBA sums to 49.999…). */
function reachesActionLevel(dosePercent: number): boolean {
  return dosePercent >= 50 * (1 - 1e-9);
}

/**
 * Calibration drift = after − before (null unless both), flagged when |drift| exceeds the limit.
 * The comparison allows 1e-9 dB so that 94.5 − 94.0 read from text is not flagged at a 0.5 limit
 * by binary rounding.
 */
export function checkCalibration(log: NoiseLog, limitDb: number): NoiseCalibrationCheck {
  const { calibrationReferenceDb, calibrationBeforeDb, calibrationAfterDb } = log.metadata;
  const driftDb = calibrationBeforeDb !== null && calibrationAfterDb !== null ? calibrationAfterDb - calibrationBeforeDb : null;
  return {
    referenceDb: calibrationReferenceDb,
    beforeDb: calibrationBeforeDb,
    afterDb: calibrationAfterDb,
    driftDb,
    limitDb,
    exceedsLimit: driftDb !== null && Math.abs(driftDb) > limitDb + 1e-9,
  };
}

/**
 * Work that does not depend on the masks: settings, Te, per-interval weights, wear check,
 * effects of the proposed masks, peak and calibration. Throws a RangeError for bad options.
 */
export function prepareNoiseAnalysis(log: NoiseLog, options: Omit<NoiseAnalysisOptions, 'masks'> = {}): PreparedNoiseAnalysis {
  const settings = resolveNoiseSettings(options.settings);
  const runSeconds = noiseLogRunSeconds(log);
  const optionHours = options.shiftHours ?? null;
  if (optionHours !== null && !(optionHours > noiseLogLimits.shiftHours.min && optionHours <= noiseLogLimits.shiftHours.max)) {
    throw new RangeError(`prepareNoiseAnalysis: shiftHours must be > 0 and ≤ 24, got ${optionHours}`);
  }
  const exposureHoursSource = optionHours !== null ? 'option' : log.metadata.shiftHours !== null ? 'file' : 'run time';
  const exposureHours = optionHours ?? log.metadata.shiftHours ?? runSeconds / 3600;
  const exposure = prepareNoiseExposure(log);
  const wearCheck = runWearCheck(log, settings);
  const calibration = checkCalibration(log, settings.driftLimitDb);

  let pauseCount = 0;
  let pauseSeconds = 0;
  for (let i = 1; i < log.length; i++) {
    const gap = log.tS[i] - (log.tS[i - 1] + log.intervalSeconds);
    if (gap > noiseLogTimeToleranceSeconds) {
      pauseCount++;
      pauseSeconds += gap;
    }
  }
  const stretches = wearCheck.stillStretches;
  const longestStillStretchSeconds = stretches ? stretches.reduce((longest, s) => Math.max(longest, s.endS - s.startS), 0) || null : null;

  return {
    log,
    settings,
    exposure,
    wearCheck,
    exposureHours,
    exposureHoursSource,
    fixed: {
      runSeconds,
      intervalSeconds: log.intervalSeconds,
      asLogged: computeNoiseFigures(exposure, [], exposureHours).asLogged,
      stillStretches: stretches ? stretches.map(({ startS, endS }) => ({ startS, endS })) : null,
      knocks: wearCheck.knocks ? wearCheck.knocks.map(({ tS, peakMg }) => ({ tS, peakMg })) : null,
      proposedMasks: wearCheck.proposedMasks.map(({ startS, endS, reason }) => ({ startS, endS, reason })),
      maxLcPeakDb: maxOf(log.lcPeakDb),
      calibrationDriftDb: calibration.driftDb,
      details: {
        settings,
        exposureHours,
        exposureHoursSource,
        wearCheckAvailable: wearCheck.available,
        motionSource: wearCheck.motionSource,
        moving: wearCheck.moving,
        knockCheckAvailable: wearCheck.knocks !== null,
        longestStillStretchSeconds,
        proposedMaskEffects: wearCheck.proposedMasks.map((mask) => ({
          ...noiseMaskEffect(exposure, mask, exposureHours),
          reason: mask.reason,
        })),
        calibration,
        peakOver140Db: log.lcPeakDb ? maxOf(log.lcPeakDb)! > 140 : null,
        pauseCount,
        pauseSeconds,
        startS: log.tS[0],
        endS: log.tS[log.length - 1] + log.intervalSeconds,
      },
    },
  };
}

/**
 * Reviewed figures for a set of masks on a prepared log (the fast path after a mask edit).
 * `masks` undefined → the proposed masks; given (even []) → they replace the proposed masks.
 */
export function analyzePreparedNoiseLog(prepared: PreparedNoiseAnalysis, masks?: readonly NoiseMaskSpan[]): NoiseAnalysis {
  const given = masks !== undefined;
  const masksUsed: readonly NoiseMaskSpan[] = given ? masks : prepared.wearCheck.proposedMasks.map(({ startS, endS, reason }) => ({ startS, endS, reason }));
  const figures = computeNoiseFigures(prepared.exposure, masksUsed, prepared.exposureHours);
  const { fixed } = prepared;
  // Key order follows the PRODUCT.md command-line contract.
  return {
    runSeconds: fixed.runSeconds,
    intervalSeconds: fixed.intervalSeconds,
    maskedSeconds: figures.maskedSeconds,
    asLogged: fixed.asLogged,
    reviewed: figures.reviewed,
    stillStretches: fixed.stillStretches,
    knocks: fixed.knocks,
    proposedMasks: fixed.proposedMasks,
    maxLcPeakDb: fixed.maxLcPeakDb,
    calibrationDriftDb: fixed.calibrationDriftDb,
    details: {
      ...fixed.details,
      masksSource: given ? 'given' : 'proposed',
      masksUsed,
      maskedIntervals: figures.maskedIntervals,
      masked: figures.masked,
      maskEffects: masksUsed.map((mask) => noiseMaskEffect(prepared.exposure, mask, prepared.exposureHours)),
      actionLevel: {
        dosePercent: 50,
        twaDb: 85,
        asLoggedReached: reachesActionLevel(fixed.asLogged.oshaHc.dose!),
        reviewedReached: figures.reviewed.oshaHc.dose === null ? null : reachesActionLevel(figures.reviewed.oshaHc.dose),
      },
    },
  };
}

/**
 * Analyse a noise log: wear check, proposed masks, as-logged and reviewed dose/TWA for oshaPel,
 * oshaHc and nioshRel, LAeq and LEX,8h, highest C-weighted peak and calibration drift.
 * Methods: OSHA 29 CFR 1910.95 App. A; NIOSH 98-126; ISO 9612:2009; PRODUCT.md definitions.
 */
export function analyzeNoiseLog(log: NoiseLog, options: NoiseAnalysisOptions = {}): NoiseAnalysis {
  return analyzePreparedNoiseLog(prepareNoiseAnalysis(log, options), options.masks);
}

/** The exact command-line document: PRODUCT.md keys in order, without `details`. */
export function noiseCliReport(analysis: NoiseAnalysis): NoiseCliReport {
  const { details: _details, ...report } = analysis;
  return report;
}
