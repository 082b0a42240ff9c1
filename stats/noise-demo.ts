/**
 * Seeded generator of invented noise logs in our format version 1, for the demo organizations
 * (Ridgeback Timber Co. sawmill, Slate Harbor Stoneworks) and for tests and benchmarks.
 *
 * A shift is a sequence of activities: walking between stations, machine work (cuts at a high
 * level alternating with positioning at a lower one), breaks, optionally a stretch where the meter
 * lies on a bench (constant acceleration vector: a still stretch) and a pause in the log. A few
 * knocks give a high apeak_mg with a level and peak spike. The calibrator reading drifts slightly.
 * All numbers are invented; the levels are typical of the trades only in broad terms.
 */
import { formatNoiseLog } from './noise-log-write';
import { noiseLogFromChannels, type NoiseLog, type NoiseLogMetadata } from './noise-log';
import { createRandom, type RandomSource } from './random';

/** Which invented workplace the log comes from. */
export type NoiseDemoScenario = 'sawmill' | 'stoneworks';

/** Options for {@link generateNoiseDemoLog}. Only `seed` is required. */
export interface NoiseDemoOptions {
  /** Seed of the random source (integer 1 … 4294967295). */
  readonly seed: number;
  readonly scenario?: NoiseDemoScenario;
  /** Length of the log, hours (0.5–48; the demo uses 8–12). Default 8. */
  readonly hours?: number;
  /** interval_s (0.125–60). Default 1. */
  readonly intervalSeconds?: number;
  /** Worker code. Default "RT-014" (sawmill) or "SH-007" (stoneworks). */
  readonly worker?: string;
  /** ISO 8601 start with offset. Default 2025-03-04T06:30:00-08:00. */
  readonly start?: string;
  /** Minutes the meter lies on a bench in the afternoon (0 = never). Default 0. */
  readonly benchMinutes?: number;
  /** Number of knocks. Default 3. */
  readonly knockCount?: number;
  /** Calibration drift after − before, dB. Default: 0.1–0.4 dB from the seed. */
  readonly calibrationDriftDb?: number;
  /** Write a `moving` column as well as the acceleration columns. Default false. */
  readonly movingColumn?: boolean;
  /** Minutes the log is paused during the lunch break (0 = no pause). Default 0. */
  readonly pauseMinutes?: number;
  /** Added to every activity level, dB (−15 to +15), to vary workers of one group. Default 0. */
  readonly levelOffsetDb?: number;
}

/** Ground truth of a generated log, for tests. */
export interface NoiseDemoTruth {
  /** t_s of each knock interval. */
  readonly knockTimesS: readonly number[];
  /** Span the meter lay on the bench, or null. */
  readonly bench: { readonly startS: number; readonly endS: number } | null;
  /** Span the log was paused, or null. */
  readonly pause: { readonly startS: number; readonly endS: number } | null;
}

/** A generated log as file text and as the parsed structure, with its ground truth. */
export interface NoiseDemoLog {
  readonly text: string;
  readonly log: NoiseLog;
  readonly truth: NoiseDemoTruth;
}

type Activity = 'walk' | 'cut' | 'position' | 'break' | 'bench';

interface ActivityProfile {
  /** Mean interval level, dBA. */
  levelDb: number;
  /** Spread of the level around the mean, dB. */
  levelSpreadDb: number;
  /** Spread of the mean acceleration per axis around the wearing orientation, mg. */
  accelerationSpreadMg: number;
  /** Extra acceleration magnitude on top of gravity for apeak_mg, mg (typical). */
  peakExtraMg: number;
  /** How far LCpeak sits above LAeq, dB (typical). */
  crestDb: number;
}

const scenarios: Record<NoiseDemoScenario, { instrument: string; worker: string; site: string; task: string; profiles: Record<Activity, ActivityProfile> }> = {
  sawmill: {
    instrument: 'RT-DOS-07 (class 2 dosimeter, invented)',
    worker: 'RT-014',
    site: 'Ridgeback Timber Co., sawmill',
    task: 'head sawyer',
    profiles: {
      walk: { levelDb: 83, levelSpreadDb: 2.5, accelerationSpreadMg: 70, peakExtraMg: 450, crestDb: 17 },
      cut: { levelDb: 96, levelSpreadDb: 2, accelerationSpreadMg: 14, peakExtraMg: 120, crestDb: 19 },
      position: { levelDb: 89, levelSpreadDb: 2, accelerationSpreadMg: 18, peakExtraMg: 160, crestDb: 18 },
      break: { levelDb: 66, levelSpreadDb: 3, accelerationSpreadMg: 8, peakExtraMg: 40, crestDb: 15 },
      bench: { levelDb: 86, levelSpreadDb: 1.5, accelerationSpreadMg: 0.6, peakExtraMg: 3, crestDb: 16 },
    },
  },
  stoneworks: {
    instrument: 'SH-DOS-03 (class 2 dosimeter, invented)',
    worker: 'SH-007',
    site: 'Slate Harbor Stoneworks, fabrication shop',
    task: 'cutter',
    profiles: {
      walk: { levelDb: 80, levelSpreadDb: 2.5, accelerationSpreadMg: 70, peakExtraMg: 420, crestDb: 16 },
      cut: { levelDb: 94, levelSpreadDb: 2, accelerationSpreadMg: 16, peakExtraMg: 140, crestDb: 18 },
      position: { levelDb: 87, levelSpreadDb: 2, accelerationSpreadMg: 20, peakExtraMg: 180, crestDb: 17 },
      break: { levelDb: 64, levelSpreadDb: 3, accelerationSpreadMg: 8, peakExtraMg: 40, crestDb: 15 },
      bench: { levelDb: 82, levelSpreadDb: 1.5, accelerationSpreadMg: 0.6, peakExtraMg: 3, crestDb: 16 },
    },
  },
};

interface Segment {
  activity: Activity;
  seconds: number;
}

/** The day plan: work blocks of machine cycles and walks, separated by breaks (every 3rd is lunch). */
function planShift(random: RandomSource, totalSeconds: number): Segment[] {
  const segments: Segment[] = [{ activity: 'walk', seconds: 300 + random.integer(300) }];
  let used = segments[0].seconds;
  let breaks = 0;
  const add = (activity: Activity, seconds: number) => {
    const length = Math.min(seconds, totalSeconds - used);
    if (length > 0) segments.push({ activity, seconds: length });
    used += length;
  };
  while (used < totalSeconds) {
    const blockEnd = used + 5400 + random.integer(2400); // 90–130 min of work
    while (used < Math.min(blockEnd, totalSeconds)) {
      if (random.uniform() < 0.08) add('walk', 60 + random.integer(240));
      add('cut', 40 + random.integer(90));
      add('position', 20 + random.integer(50));
    }
    breaks++;
    add('walk', 60 + random.integer(120));
    add('break', breaks % 3 === 2 ? 1800 : 900);
    add('walk', 60 + random.integer(120));
  }
  return segments;
}

function round(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor + 0; // + 0 turns −0 into 0, as the file writes it
}

/**
 * Generate an invented noise log. Same options and seed → the same text, byte for byte.
 * Throws a RangeError for options out of range.
 */
export function generateNoiseDemoLog(options: NoiseDemoOptions): NoiseDemoLog {
  const scenario = scenarios[options.scenario ?? 'sawmill'];
  if (!scenario) throw new RangeError(`generateNoiseDemoLog: unknown scenario "${String(options.scenario)}"`);
  const hours = options.hours ?? 8;
  const interval = options.intervalSeconds ?? 1;
  const benchMinutes = options.benchMinutes ?? 0;
  const pauseMinutes = options.pauseMinutes ?? 0;
  const knockCount = options.knockCount ?? 3;
  const levelOffsetDb = options.levelOffsetDb ?? 0;
  if (!(levelOffsetDb >= -15 && levelOffsetDb <= 15)) {
    throw new RangeError(`generateNoiseDemoLog: levelOffsetDb must be −15 to 15 dB, got ${levelOffsetDb}`);
  }
  if (!(hours >= 0.5 && hours <= 48)) throw new RangeError(`generateNoiseDemoLog: hours must be 0.5–48, got ${hours}`);
  if (!(interval >= 0.125 && interval <= 60)) {
    throw new RangeError(`generateNoiseDemoLog: intervalSeconds must be 0.125–60, got ${interval}`);
  }
  if (!(benchMinutes >= 0 && benchMinutes * 60 <= hours * 3600 * 0.3)) {
    throw new RangeError('generateNoiseDemoLog: benchMinutes must be ≥ 0 and at most 30 % of the log');
  }
  if (!(pauseMinutes >= 0 && pauseMinutes <= 30)) throw new RangeError('generateNoiseDemoLog: pauseMinutes must be 0–30');
  if (!Number.isInteger(knockCount) || knockCount < 0 || knockCount > 50) {
    throw new RangeError('generateNoiseDemoLog: knockCount must be an integer 0–50');
  }
  const random = createRandom(options.seed);
  const totalSeconds = hours * 3600;
  const plan = planShift(random, totalSeconds);

  // Activity per interval, by the interval's start time.
  const slots = Math.floor(totalSeconds / interval);
  const activity: Activity[] = new Array<Activity>(slots);
  let segmentIndex = 0;
  let segmentEnd = plan[0].seconds;
  let lunch: { startS: number; endS: number } | null = null;
  let cursor = 0;
  for (const segment of plan) {
    if (segment.activity === 'break' && segment.seconds === 1800 && !lunch) lunch = { startS: cursor, endS: cursor + segment.seconds };
    cursor += segment.seconds;
  }
  for (let i = 0; i < slots; i++) {
    const t = i * interval;
    while (t >= segmentEnd && segmentIndex < plan.length - 1) segmentEnd += plan[++segmentIndex].seconds;
    activity[i] = plan[segmentIndex].activity;
  }
  let bench: NoiseDemoTruth['bench'] = null;
  if (benchMinutes > 0) {
    // The meter is put down on a bench about 60 % into the log (after a break, in practice).
    const first = Math.floor((totalSeconds * 0.6) / interval);
    const count = Math.ceil((benchMinutes * 60) / interval);
    for (let i = first; i < Math.min(slots, first + count); i++) activity[i] = 'bench';
    bench = { startS: round(first * interval, 6), endS: round(Math.min(slots, first + count) * interval, 6) };
  }
  let pause: NoiseDemoTruth['pause'] = null;
  if (pauseMinutes > 0 && lunch) {
    const startS = lunch.startS + 300;
    pause = { startS, endS: startS + pauseMinutes * 60 };
  }

  // Knocks during machine work (not on the bench).
  const knockSlots = new Set<number>();
  for (let attempt = 0; knockSlots.size < knockCount && attempt < knockCount * 1000; attempt++) {
    const i = random.integer(slots);
    const t = i * interval;
    const paused = pause && t + interval > pause.startS && t < pause.endS;
    if ((activity[i] === 'cut' || activity[i] === 'position') && !paused) knockSlots.add(i);
  }

  const tS: number[] = [];
  const laeq: number[] = [];
  const peak: number[] = [];
  const ax: number[] = [];
  const ay: number[] = [];
  const az: number[] = [];
  const apeak: number[] = [];
  const moving: number[] = [];
  const wornOrientation = [40 + 30 * random.normal(), -150 + 30 * random.normal(), 985];
  const benchOrientation = [6, -3, 1001];
  const correlation = Math.exp(-interval / 10); // level fluctuations last about 10 s
  let fluctuation = 0;
  let previous = wornOrientation;
  for (let i = 0; i < slots; i++) {
    const t = i * interval;
    if (pause && t + interval > pause.startS && t < pause.endS) continue;
    const profile = scenario.profiles[activity[i]];
    fluctuation = correlation * fluctuation + Math.sqrt(1 - correlation * correlation) * random.normal();
    let level = profile.levelDb + levelOffsetDb + profile.levelSpreadDb * fluctuation;
    let crest = profile.crestDb + 3 * random.normal();
    const base = activity[i] === 'bench' ? benchOrientation : wornOrientation;
    const spread = profile.accelerationSpreadMg;
    const vector = base.map((component) => component + spread * random.normal());
    let peakMg = 1000 + profile.peakExtraMg * (0.5 + random.uniform());
    if (knockSlots.has(i)) {
      level = Math.max(level, 108 + 8 * random.uniform());
      crest = 20 + 6 * random.uniform();
      peakMg = 3500 + 5500 * random.uniform();
    }
    tS.push(round(t, 6));
    laeq.push(round(level, 1));
    peak.push(round(Math.min(level + Math.max(crest, 8), 150), 1));
    ax.push(round(vector[0], 0));
    ay.push(round(vector[1], 0));
    az.push(round(vector[2], 0));
    apeak.push(round(peakMg, 0));
    const change = Math.hypot(vector[0] - previous[0], vector[1] - previous[1], vector[2] - previous[2]);
    moving.push(i > 0 && change >= 30 ? 1 : 0);
    previous = vector;
  }

  const before = round(114 + 0.1 * random.normal(), 1);
  const drift = options.calibrationDriftDb ?? round(0.1 + 0.3 * random.uniform(), 1);
  const metadata: NoiseLogMetadata = {
    version: 1,
    intervalSeconds: interval,
    instrument: scenario.instrument,
    worker: options.worker ?? scenario.worker,
    start: options.start ?? '2025-03-04T06:30:00-08:00',
    // shift_hours is at most 24 in format v1; a multi-day benchmark log leaves it out.
    shiftHours: hours <= 24 ? round(hours, 2) : null,
    calibrationReferenceDb: 114,
    calibrationBeforeDb: before,
    calibrationAfterDb: round(before + drift, 2),
    other: { site: scenario.site, task: scenario.task },
  };
  const log = noiseLogFromChannels({
    metadata,
    tS: Float64Array.from(tS),
    laeqDb: Float64Array.from(laeq),
    lcPeakDb: Float64Array.from(peak),
    acceleration: { xMg: Float64Array.from(ax), yMg: Float64Array.from(ay), zMg: Float64Array.from(az) },
    apeakMg: Float64Array.from(apeak),
    moving: options.movingColumn ? Uint8Array.from(moving) : null,
  });
  const knockTimesS = [...knockSlots].sort((a, b) => a - b).map((i) => round(i * interval, 6));
  return { text: formatNoiseLog(log), log, truth: { knockTimesS, bench, pause } };
}
