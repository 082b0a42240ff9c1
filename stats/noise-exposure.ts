/**
 * As-logged and reviewed noise figures of an interval log: dose and TWA per criteria set, LAeq and
 * LEX,8h, with masked spans (PRODUCT.md, "Dose per criteria set" and "Masks").
 *
 * Per-interval weights (energy 10^(L/10) and, per criteria set, Δt/T(L)) are computed once by
 * {@link prepareNoiseExposure}; a mask edit then only sums arrays ({@link computeNoiseFigures}),
 * which keeps a recompute far below the 50 ms the review page needs.
 *
 * Caveat (REFERENCES.md, "Interval logs and wear"): applying a 5 dB exchange rate or a threshold
 * to interval LAeq values only approximates the slow-weighted integration a dosimeter does; the
 * error grows with the interval length. LAeq and LEX,8h (energy sums) are exact for the intervals.
 */
import { eightHoursSeconds, lex8hFromLaeq, noiseCriteriaSets, twaFromDose, type NoiseCriteriaSetName } from './noise-criteria';
import type { NoiseLog } from './noise-log';

/** A time span left out of the reviewed figures, seconds from the log start. */
export interface NoiseMaskSpan {
  readonly startS: number;
  readonly endS: number;
  readonly reason?: string;
}

/** Dose % and 8-hour TWA for one criteria set. */
export interface NoiseCriteriaFigures {
  /** Dose, %. null only for reviewed figures when every interval is masked. */
  readonly dose: number | null;
  /** TWA, dBA; null when the dose is 0 (or null). */
  readonly twa: number | null;
}

/** ISO 9612 figures. */
export interface NoiseIsoFigures {
  /** Energy mean of the interval levels, dB; null when every interval is masked. */
  readonly laeq: number | null;
  /** LEX,8h = LAeq + 10·lg(Te / 8 h), dB; null with laeq. */
  readonly lex8h: number | null;
}

/** One block of figures (as-logged or reviewed), in CLI key order. */
export interface NoiseFigures {
  readonly oshaPel: NoiseCriteriaFigures;
  readonly oshaHc: NoiseCriteriaFigures;
  readonly nioshRel: NoiseCriteriaFigures;
  readonly iso: NoiseIsoFigures;
}

/** Per-interval weights computed once per log. */
export interface NoiseExposureModel {
  readonly log: NoiseLog;
  /** Intervals × interval length, seconds. */
  readonly runSeconds: number;
  /** 10^(L/10) per interval. */
  readonly energy: Float64Array;
  /** Dose fraction Δt/T(L) per interval per criteria set (0 below the threshold). */
  readonly doseFractions: Readonly<Record<NoiseCriteriaSetName, Float64Array>>;
  /** Sums over every interval (the as-logged figures). */
  readonly totals: Readonly<NoiseIntervalSums>;
}

/** Sums of the per-interval weights over a set of intervals. */
export interface NoiseIntervalSums {
  count: number;
  energy: number;
  oshaPel: number;
  oshaHc: number;
  nioshRel: number;
}

/**
 * Precompute the per-interval weights of a log.
 * Method: OSHA 29 CFR 1910.95 App. A and NIOSH 98-126 (Δt/T(L) from the formula), ISO 9612:2009
 * (energy 10^(0.1·L)).
 */
export function prepareNoiseExposure(log: NoiseLog): NoiseExposureModel {
  const n = log.length;
  const interval = log.intervalSeconds;
  const energy = new Float64Array(n);
  const fractions = {} as Record<NoiseCriteriaSetName, Float64Array>;
  for (const criteria of noiseCriteriaSets) fractions[criteria.name] = new Float64Array(n);
  // Sets that share criterion level and exchange rate share 2^((L − Lc)/q) and differ only in the
  // threshold (oshaPel and oshaHc), so the power is computed once per group and interval; this
  // loop runs for every interval of the log and dominates the preparation time.
  const groups = new Map<string, { criterionLevelDb: number; exchangeRateDb: number; sets: { threshold: number; out: Float64Array }[] }>();
  for (const criteria of noiseCriteriaSets) {
    const key = `${criteria.criterionLevelDb}/${criteria.exchangeRateDb}`;
    const group = groups.get(key) ?? { criterionLevelDb: criteria.criterionLevelDb, exchangeRateDb: criteria.exchangeRateDb, sets: [] };
    group.sets.push({ threshold: criteria.thresholdDb, out: fractions[criteria.name] });
    groups.set(key, group);
  }
  const scale = interval / eightHoursSeconds; // Δt / 8 h
  for (let i = 0; i < n; i++) energy[i] = Math.pow(10, log.laeqDb[i] / 10);
  for (const group of groups.values()) {
    const lowest = Math.min(...group.sets.map((set) => set.threshold));
    for (let i = 0; i < n; i++) {
      const level = log.laeqDb[i];
      if (level < lowest) continue;
      // Δt / T(L) with T(L) = 8 h / 2^((L − Lc)/q): OSHA 29 CFR 1910.95 App. A; NIOSH 98-126.
      const fraction = scale * Math.pow(2, (level - group.criterionLevelDb) / group.exchangeRateDb);
      for (const set of group.sets) if (level >= set.threshold) set.out[i] = fraction;
    }
  }
  const partial = { log, runSeconds: n * interval, energy, doseFractions: fractions };
  return { ...partial, totals: sumIntervals(partial, () => true) };
}

/**
 * Check mask spans: finite numbers with endS > startS. Throws a RangeError naming the mask
 * (1-based) and the rule.
 */
export function validateMaskSpans(masks: readonly NoiseMaskSpan[]): void {
  masks.forEach((mask, index) => {
    if (typeof mask !== 'object' || mask === null || !Number.isFinite(mask.startS) || !Number.isFinite(mask.endS)) {
      throw new RangeError(`validateMaskSpans: mask ${index + 1} needs finite numbers startS and endS`);
    }
    if (!(mask.endS > mask.startS)) {
      throw new RangeError(`validateMaskSpans: mask ${index + 1} endS (${mask.endS}) must be greater than startS (${mask.startS})`);
    }
  });
}

/** Index range [first, last) of the intervals a span overlaps by a positive amount. */
export function maskedIndexRange(log: NoiseLog, mask: NoiseMaskSpan): { first: number; last: number } {
  const { tS, intervalSeconds } = log;
  // First interval whose end is after the span start (ends are increasing, so binary search).
  let low = 0;
  let high = log.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (tS[middle] + intervalSeconds > mask.startS) high = middle;
    else low = middle + 1;
  }
  let last = low;
  while (last < log.length && tS[last] < mask.endS) last++;
  return { first: low, last };
}

/**
 * Flags (1 = masked) for every interval that overlaps any span by a positive amount
 * (PRODUCT.md, "Masks"); overlapping spans mask an interval once.
 */
export function markMaskedIntervals(log: NoiseLog, masks: readonly NoiseMaskSpan[]): Uint8Array {
  validateMaskSpans(masks);
  const flags = new Uint8Array(log.length);
  for (const mask of masks) {
    const { first, last } = maskedIndexRange(log, mask);
    flags.fill(1, first, last);
  }
  return flags;
}

function emptySums(): NoiseIntervalSums {
  return { count: 0, energy: 0, oshaPel: 0, oshaHc: 0, nioshRel: 0 };
}

function sumIntervals(model: Omit<NoiseExposureModel, 'totals'>, include: (index: number) => boolean, from = 0, to = model.log.length): NoiseIntervalSums {
  const sums = emptySums();
  const { energy, doseFractions } = model;
  const pel = doseFractions.oshaPel;
  const hc = doseFractions.oshaHc;
  const rel = doseFractions.nioshRel;
  for (let i = from; i < to; i++) {
    if (!include(i)) continue;
    sums.count++;
    sums.energy += energy[i];
    sums.oshaPel += pel[i];
    sums.oshaHc += hc[i];
    sums.nioshRel += rel[i];
  }
  return sums;
}

/**
 * Figures from interval sums. The counted intervals stand for the whole run: dose is scaled by
 * run time / counted time (PRODUCT.md: reviewed dose = dose of unmasked × run time / unmasked
 * time), LAeq is their energy mean, LEX,8h uses Te = `exposureHours`.
 */
function figuresFromSums(sums: NoiseIntervalSums, model: NoiseExposureModel, exposureHours: number): NoiseFigures {
  const countedSeconds = sums.count * model.log.intervalSeconds;
  const criteria = (name: NoiseCriteriaSetName): NoiseCriteriaFigures => {
    if (sums.count === 0) return { dose: null, twa: null };
    const dose = (100 * sums[name] * model.runSeconds) / countedSeconds;
    return {
      dose,
      twa: twaFromDose(
        dose,
        noiseCriteriaSets.find((set) => set.name === name)!,
      ),
    };
  };
  const laeq = sums.count === 0 ? null : 10 * Math.log10(sums.energy / sums.count);
  return {
    oshaPel: criteria('oshaPel'),
    oshaHc: criteria('oshaHc'),
    nioshRel: criteria('nioshRel'),
    iso: { laeq, lex8h: laeq === null ? null : lex8hFromLaeq(laeq, exposureHours) },
  };
}

/** As-logged and reviewed figures for one set of masks. */
export interface NoiseFiguresResult {
  readonly maskedSeconds: number;
  readonly maskedIntervals: number;
  readonly asLogged: NoiseFigures;
  readonly reviewed: NoiseFigures;
  /** Masked flag per interval (1 = masked), for charts. */
  readonly masked: Uint8Array;
}

/**
 * As-logged figures (all intervals) and reviewed figures (unmasked intervals standing for the
 * run) for the given masks. `exposureHours` is Te for LEX,8h (shift hours, else run time).
 * Method: PRODUCT.md "Dose per criteria set" and "Masks"; OSHA 29 CFR 1910.95 App. A;
 * NIOSH 98-126; ISO 9612:2009.
 */
export function computeNoiseFigures(model: NoiseExposureModel, masks: readonly NoiseMaskSpan[], exposureHours: number): NoiseFiguresResult {
  if (!(exposureHours > 0) || !Number.isFinite(exposureHours)) {
    throw new RangeError(`computeNoiseFigures: exposure hours must be a finite number > 0, got ${exposureHours}`);
  }
  const masked = markMaskedIntervals(model.log, masks);
  const all = model.totals;
  const unmasked = masks.length === 0 ? all : sumIntervals(model, (i) => masked[i] === 0);
  const maskedIntervals = model.log.length - unmasked.count;
  return {
    maskedSeconds: maskedIntervals * model.log.intervalSeconds,
    maskedIntervals,
    asLogged: figuresFromSums(all, model, exposureHours),
    reviewed: figuresFromSums(unmasked, model, exposureHours),
    masked,
  };
}

/** How one mask on its own changes the reviewed figures (reviewed − as-logged). */
export interface NoiseMaskEffect {
  readonly startS: number;
  readonly endS: number;
  readonly maskedSeconds: number;
  /** Dose change in percentage points per criteria set; null when the mask covers the whole log. */
  readonly doseChange: Readonly<Record<NoiseCriteriaSetName, number | null>>;
  /** LAeq change, dB; null when the mask covers the whole log. */
  readonly laeqChangeDb: number | null;
}

/**
 * The change one mask alone makes to the dose and LAeq, from sums over only the intervals it
 * masks (fast for many proposed masks). Method: as {@link computeNoiseFigures}.
 */
export function noiseMaskEffect(model: NoiseExposureModel, mask: NoiseMaskSpan, exposureHours: number): NoiseMaskEffect {
  validateMaskSpans([mask]);
  const { first, last } = maskedIndexRange(model.log, mask);
  const all = model.totals;
  const inMask = sumIntervals(model, () => true, first, last);
  const remaining: NoiseIntervalSums = {
    count: all.count - inMask.count,
    energy: all.energy - inMask.energy,
    oshaPel: all.oshaPel - inMask.oshaPel,
    oshaHc: all.oshaHc - inMask.oshaHc,
    nioshRel: all.nioshRel - inMask.nioshRel,
  };
  const before = figuresFromSums(all, model, exposureHours);
  const after = figuresFromSums(remaining, model, exposureHours);
  const change = (a: number | null, b: number | null) => (a === null || b === null ? null : a - b);
  return {
    startS: mask.startS,
    endS: mask.endS,
    maskedSeconds: inMask.count * model.log.intervalSeconds,
    doseChange: {
      oshaPel: change(after.oshaPel.dose, before.oshaPel.dose),
      oshaHc: change(after.oshaHc.dose, before.oshaHc.dose),
      nioshRel: change(after.nioshRel.dose, before.nioshRel.dose),
    },
    laeqChangeDb: change(after.iso.laeq, before.iso.laeq),
  };
}
