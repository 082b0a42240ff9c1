/**
 * ISO 9612:2009 task-based strategy (clause 9): the nominal day is divided into tasks m of
 * duration T_m; each task's level L_p,A,eqT,m is the energy mean of at least 3 measurements;
 * LEX,8h is the energy sum over the tasks; the uncertainty follows Annex C (C.2).
 */
import { energyMeanLevel } from './noise-criteria';
import {
  combineContributions,
  coverageFactor,
  instrumentUncertainty,
  iso9612InstrumentLabels,
  microphonePositionUncertaintyDb,
  referenceHours,
  requireFiniteNumber,
  requirePositive,
  taskSpreadUncertainty,
  type Iso9612Instrument,
  type Iso9612Result,
  type UncertaintyBudgetLine,
} from './iso9612-uncertainty';

/** Fewest measurements per task (ISO 9612:2009, 9.3: at least three). */
export const taskMinimumMeasurements = 3;

/** A spread of the task's measurements at or above this asks for more of them (ISO 9612:2009, 9.3), dB. */
export const taskSpreadLimitDb = 3;

/**
 * Shortest measurement when the task lasts longer (ISO 9612:2009, 9.3: at least 5 min, or the
 * whole task when it is shorter), minutes — from memory, checked only as a warning.
 */
export const taskMinimumMeasurementMinutes = 5;

export interface TaskMeasurement {
  /** LAeq of the measurement, dB. */
  readonly laeqDb: number;
  /** Measured duration, minutes (optional; used for the 5-minute check only). */
  readonly durationMinutes?: number;
}

export interface TaskInput {
  readonly name: string;
  /** Duration of the task in the nominal day T_m, hours. */
  readonly hours: number;
  /** Standard uncertainty of T_m, u1b,m, hours (optional; 0 leaves the duration term out). */
  readonly durationUncertaintyHours?: number;
  readonly measurements: readonly TaskMeasurement[];
}

export interface TaskBasedInput {
  readonly tasks: readonly TaskInput[];
  /** Instrument kind of Table C.5 (u2, the same for every task). */
  readonly instrument: string;
}

/** Per-task figures of the task-based strategy. */
export interface TaskFigures {
  readonly name: string;
  readonly hours: number;
  /** L_p,A,eqT,m: energy mean of the task's measurements, dB (equation 7). */
  readonly laeqDb: number;
  /** Contribution of the task to LEX,8h: (T_m/T0)·10^(0.1·L_m), as a share of the total (0–1). */
  readonly energyShare: number;
  /** Highest minus lowest measurement, dB. */
  readonly spreadDb: number;
  /** u1a,m, dB (equation C.5). */
  readonly spreadUncertainty: number;
  /** c1a,m (equation C.7). */
  readonly levelSensitivity: number;
  /** u1b,m, hours (0 when not given). */
  readonly durationUncertaintyHours: number;
  /** c1b,m, dB per hour (equation C.8). */
  readonly durationSensitivity: number;
}

export interface TaskBasedResult extends Iso9612Result {
  readonly tasks: readonly TaskFigures[];
  /** u(LEX,8h) without the duration terms, dB. */
  readonly combinedUncertaintyWithoutDuration: number;
  /** U without the duration terms, dB (ISO 9612:2009 Annex D prints both). */
  readonly expandedUncertaintyWithoutDuration: number;
}

function checkTask(name: string, task: TaskInput, index: number, seen: Set<string>): void {
  const label = typeof task.name === 'string' ? task.name.trim() : '';
  if (label === '') throw new RangeError(`${name}: task ${index + 1} needs a name`);
  if (seen.has(label)) throw new RangeError(`${name}: task '${label}' is listed twice; give each task one row`);
  seen.add(label);
  requireFiniteNumber(name, `task '${label}' duration (hours)`, task.hours);
  if (!(task.hours > 0)) throw new RangeError(`${name}: task '${label}' duration must be greater than 0 h, got ${task.hours}`);
  if (task.durationUncertaintyHours !== undefined) {
    requireFiniteNumber(name, `task '${label}' duration uncertainty (hours)`, task.durationUncertaintyHours);
    if (task.durationUncertaintyHours < 0) {
      throw new RangeError(`${name}: task '${label}' duration uncertainty must be ≥ 0 h, got ${task.durationUncertaintyHours}`);
    }
  }
  const count = task.measurements?.length ?? 0;
  if (count < taskMinimumMeasurements) {
    throw new RangeError(
      `${name}: task '${label}' has ${count} measurement${count === 1 ? '' : 's'}; ISO 9612 task-based needs at least ${taskMinimumMeasurements}`,
    );
  }
  task.measurements.forEach((measurement, row) => {
    requireFiniteNumber(name, `task '${label}' measurement ${row + 1} LAeq (dB)`, measurement.laeqDb);
    if (measurement.laeqDb < 0 || measurement.laeqDb > 200) {
      throw new RangeError(`${name}: task '${label}' measurement ${row + 1} LAeq must lie between 0 and 200 dB, got ${measurement.laeqDb}`);
    }
    if (measurement.durationMinutes !== undefined) {
      requirePositive(name, `task '${label}' measurement ${row + 1} duration (minutes)`, measurement.durationMinutes);
    }
  });
}

/**
 * LEX,8h with its uncertainty budget by the task-based strategy.
 *
 * Method: ISO 9612:2009 clause 9 and Annex C (C.2), equations as we know them:
 * - (7) L_p,A,eqT,m = 10·lg((1/I)·Σ_i 10^(0.1·L_m,i))
 * - (8)/(9) LEX,8h = 10·lg(Σ_m (T_m/T0)·10^(0.1·L_m)), Te = Σ T_m, T0 = 8 h
 * - (C.5) u1a,m = √(1/(I(I−1))·Σ_i (L_m,i − L̄_m)²)
 * - (C.6) u²(LEX,8h) = Σ_m c1a,m²·(u1a,m² + u2,m² + u3²) + Σ_m (c1b,m·u1b,m)²
 * - (C.7) c1a,m = (T_m/T0)·10^(0.1·(L_m − LEX,8h))
 * - (C.8) c1b,m = 4.34·c1a,m / T_m
 * - U = 1.65·u.
 * Throws a RangeError naming the task and the rule for a blank or repeated name, a duration ≤ 0,
 * fewer than 3 measurements, a level that is not finite, a day of more than 24 h or an unknown
 * instrument. Warns (ISO 9612:2009, 9.3) when a task's measurements span ≥ 3 dB with fewer than
 * 6 of them, and when a measurement is shorter than 5 min but the task is longer.
 */
export function taskBasedEstimate(input: TaskBasedInput): TaskBasedResult {
  const name = 'taskBasedEstimate';
  if (!(input.tasks?.length > 0)) throw new RangeError(`${name}: needs at least one task`);
  const u2 = instrumentUncertainty(name, input.instrument);
  const seen = new Set<string>();
  input.tasks.forEach((task, index) => checkTask(name, task, index, seen));
  const effectiveHours = input.tasks.reduce((sum, task) => sum + task.hours, 0);
  if (effectiveHours > 24) throw new RangeError(`${name}: the task durations add up to ${effectiveHours} h; a day has at most 24 h`);

  const levels = input.tasks.map((task) => energyMeanLevel(task.measurements.map((measurement) => measurement.laeqDb)));
  const energies = input.tasks.map((task, index) => (task.hours / referenceHours) * Math.pow(10, levels[index] / 10));
  const totalEnergy = energies.reduce((sum, energy) => sum + energy, 0);
  const lex8h = 10 * Math.log10(totalEnergy);

  const tasks: TaskFigures[] = [];
  const levelLines: UncertaintyBudgetLine[] = [];
  const durationLines: UncertaintyBudgetLine[] = [];
  const warnings: string[] = [];
  input.tasks.forEach((task, index) => {
    const label = task.name.trim();
    const measured = task.measurements.map((measurement) => measurement.laeqDb);
    const spreadDb = Math.max(...measured) - Math.min(...measured);
    const spreadUncertainty = taskSpreadUncertainty(measured);
    const levelSensitivity = (task.hours / referenceHours) * Math.pow(10, 0.1 * (levels[index] - lex8h)); // (C.7)
    const durationSensitivity = (4.34 * levelSensitivity) / task.hours; // (C.8)
    const durationUncertaintyHours = task.durationUncertaintyHours ?? 0;
    tasks.push({
      name: label,
      hours: task.hours,
      laeqDb: levels[index],
      energyShare: energies[index] / totalEnergy,
      spreadDb,
      spreadUncertainty,
      levelSensitivity,
      durationUncertaintyHours,
      durationSensitivity,
    });
    levelLines.push(
      {
        label: `Task '${label}': spread of the measurements (u1a)`,
        standardUncertainty: spreadUncertainty,
        sensitivity: levelSensitivity,
        contribution: levelSensitivity * spreadUncertainty,
        source: 'ISO 9612:2009 C.5, C.7',
      },
      {
        label: `Task '${label}': instrument, ${iso9612InstrumentLabels[input.instrument as Iso9612Instrument]} (u2)`,
        standardUncertainty: u2,
        sensitivity: levelSensitivity,
        contribution: levelSensitivity * u2,
        source: 'ISO 9612:2009 Table C.5, C.7',
      },
      {
        label: `Task '${label}': microphone position (u3)`,
        standardUncertainty: microphonePositionUncertaintyDb,
        sensitivity: levelSensitivity,
        contribution: levelSensitivity * microphonePositionUncertaintyDb,
        source: 'ISO 9612:2009 C.6, C.7',
      },
    );
    if (durationUncertaintyHours > 0) {
      durationLines.push({
        label: `Task '${label}': duration (u1b, hours)`,
        standardUncertainty: durationUncertaintyHours,
        sensitivity: durationSensitivity,
        contribution: durationSensitivity * durationUncertaintyHours,
        source: 'ISO 9612:2009 C.8',
      });
    }
    if (spreadDb >= taskSpreadLimitDb && measured.length < 2 * taskMinimumMeasurements) {
      warnings.push(
        `Task '${label}': the measurements span ${spreadDb.toFixed(1)} dB (3 dB or more): ISO 9612 asks for at least 3 more measurements or splitting the task`,
      );
    }
    const minutesInTask = task.hours * 60;
    task.measurements.forEach((measurement, row) => {
      if (
        measurement.durationMinutes !== undefined &&
        measurement.durationMinutes < taskMinimumMeasurementMinutes &&
        minutesInTask > taskMinimumMeasurementMinutes
      ) {
        warnings.push(
          `Task '${label}' measurement ${row + 1} lasted ${measurement.durationMinutes} min: measure at least 5 min, or the whole task when it is shorter`,
        );
      }
    });
  });
  const budget = [...levelLines, ...durationLines];
  const combinedUncertainty = combineContributions(budget); // (C.6)
  const combinedUncertaintyWithoutDuration = combineContributions(levelLines);
  return {
    lex8h,
    laeqTe: lex8h - 10 * Math.log10(effectiveHours / referenceHours),
    effectiveHours,
    budget,
    combinedUncertainty,
    expandedUncertainty: coverageFactor * combinedUncertainty,
    combinedUncertaintyWithoutDuration,
    expandedUncertaintyWithoutDuration: coverageFactor * combinedUncertaintyWithoutDuration,
    warnings,
    tasks,
  };
}
