/**
 * ISO 9612:2009 strategies: refusals of impossible input (each naming the task, row or rule) and
 * properties that hold by the equations (ISO 9612:2009 equations 7, 9, C.5–C.8; clause 10–11).
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { fullDayEstimate } from '@stats/iso9612-full-day';
import { jobBasedEstimate } from '@stats/iso9612-job-based';
import { taskBasedEstimate, type TaskInput } from '@stats/iso9612-task-based';
import { compareWithValues, noiseValuesInForce } from '@stats/iso9612-verdict';

const three = (a: number, b: number, c: number) => [a, b, c].map((laeqDb) => ({ laeqDb }));

describe('task-based refusals', () => {
  test('a task with 2 measurements is refused, naming the task and the rule', () => {
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ name: 'Edging', hours: 4, measurements: [{ laeqDb: 90 }, { laeqDb: 91 }] }] })).toThrow(
      new RangeError("taskBasedEstimate: task 'Edging' has 2 measurements; ISO 9612 task-based needs at least 3"),
    );
  });

  test('a negative or zero duration is refused, naming the task', () => {
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ name: 'Edging', hours: -1, measurements: three(90, 91, 92) }] })).toThrow(
      /task 'Edging' duration must be greater than 0 h, got -1/,
    );
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ name: 'Edging', hours: 0, measurements: three(90, 91, 92) }] })).toThrow(RangeError);
  });

  test('a negative duration uncertainty, a NaN level, a repeated task name and more than 24 h are refused', () => {
    const base: TaskInput = { name: 'Edging', hours: 4, measurements: three(90, 91, 92) };
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ ...base, durationUncertaintyHours: -0.1 }] })).toThrow(
      /duration uncertainty must be ≥ 0/,
    );
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ ...base, measurements: three(90, Number.NaN, 92) }] })).toThrow(
      /task 'Edging' measurement 2 LAeq \(dB\) must be a finite number/,
    );
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [base, base] })).toThrow(/task 'Edging' is listed twice/);
    expect(() =>
      taskBasedEstimate({
        instrument: 'dosimeter',
        tasks: [
          { ...base, hours: 20 },
          { ...base, name: 'Other', hours: 5 },
        ],
      }),
    ).toThrow(/add up to 25 h/);
  });

  test('an unknown instrument and an empty task list are refused', () => {
    expect(() => taskBasedEstimate({ instrument: 'phone app', tasks: [{ name: 'A', hours: 1, measurements: three(80, 81, 82) }] })).toThrow(
      /instrument must be one of/,
    );
    expect(() => taskBasedEstimate({ instrument: 'dosimeter', tasks: [] })).toThrow(/needs at least one task/);
  });
});

describe('task-based warnings (ISO 9612:2009, 9.3)', () => {
  test('measurements spanning 3 dB or more ask for 3 more or a split of the task', () => {
    const result = taskBasedEstimate({ instrument: 'dosimeter', tasks: [{ name: 'Edging', hours: 4, measurements: three(88, 91, 89) }] });
    expect(result.warnings).toEqual([
      "Task 'Edging': the measurements span 3.0 dB (3 dB or more): ISO 9612 asks for at least 3 more measurements or splitting the task",
    ]);
    const six = taskBasedEstimate({
      instrument: 'dosimeter',
      tasks: [{ name: 'Edging', hours: 4, measurements: [...three(88, 91, 89), ...three(88, 90, 89)] }],
    });
    expect(six.warnings).toEqual([]);
  });

  test('a measurement under 5 min in a longer task is flagged', () => {
    const result = taskBasedEstimate({
      instrument: 'dosimeter',
      tasks: [{ name: 'Edging', hours: 4, measurements: [{ laeqDb: 88, durationMinutes: 2 }, { laeqDb: 88 }, { laeqDb: 89 }] }],
    });
    expect(result.warnings[0]).toMatch(/measurement 1 lasted 2 min/);
  });
});

describe('job-based and full-day refusals and warnings', () => {
  const samples = (levels: number[], minutes?: number) => levels.map((laeqDb) => ({ laeqDb, durationMinutes: minutes }));

  test('fewer than 5 job-based samples are refused', () => {
    expect(() => jobBasedEstimate({ samples: samples([85, 86, 87, 88]), effectiveHours: 8, instrument: 'dosimeter', groupSize: 4 })).toThrow(
      'jobBasedEstimate: 4 samples given; the ISO 9612 job-based strategy needs at least 5',
    );
  });

  test('fewer than 3 full days are refused; Te must be in (0, 24] h', () => {
    expect(() => fullDayEstimate({ days: samples([85, 86]), effectiveHours: 8, instrument: 'dosimeter' })).toThrow(/needs at least 3/);
    expect(() => fullDayEstimate({ days: samples([85, 86, 87]), effectiveHours: -8, instrument: 'dosimeter' })).toThrow(/Te \(hours\) must be greater than 0/);
    expect(() => fullDayEstimate({ days: samples([85, 86, 87]), effectiveHours: 25, instrument: 'dosimeter' })).toThrow(/at most 24 hours/);
  });

  test('a cumulative duration below Table 1 is a warning naming the minimum; missing durations are a warning too', () => {
    const short = jobBasedEstimate({ samples: samples([85, 86, 87, 88, 86], 30), effectiveHours: 8, instrument: 'dosimeter', groupSize: 10 });
    expect(short.cumulativeHours).toBe(2.5);
    expect(short.warnings).toContain('The samples add up to 2.50 h, below the ISO 9612 Table 1 minimum of 7.5 h for a group of 10: take more samples');
    const unknown = jobBasedEstimate({ samples: samples([85, 86, 87, 88, 86]), effectiveHours: 8, instrument: 'dosimeter', groupSize: 10 });
    expect(unknown.cumulativeHours).toBeNull();
    expect(unknown.warnings[0]).toMatch(/Give every sample's duration/);
  });

  test('a wide spread of samples gives c1·u1 above 3.5 dB and the advice to revise the plan', () => {
    const result = jobBasedEstimate({ samples: samples([75, 95, 80, 98, 78], 120), effectiveHours: 8, instrument: 'dosimeter', groupSize: 3 });
    expect(result.budget[0].contribution).toBeGreaterThan(3.5);
    expect(result.warnings.some((warning) => /above 3.5 dB: ISO 9612 asks to revise the plan/.test(warning))).toBe(true);
  });
});

const level = fc.double({ min: 60, max: 115, noNaN: true });
const taskArbitrary = fc.record({
  hours: fc.double({ min: 0.1, max: 3, noNaN: true }),
  levels: fc.array(level, { minLength: 3, maxLength: 6 }),
  durationUncertaintyHours: fc.double({ min: 0, max: 0.5, noNaN: true }),
});
const toTasks = (tasks: { hours: number; levels: number[]; durationUncertaintyHours: number }[], shift = 0): TaskInput[] =>
  tasks.map((task, index) => ({
    name: `Task ${index + 1}`,
    hours: task.hours,
    durationUncertaintyHours: task.durationUncertaintyHours,
    measurements: task.levels.map((laeqDb) => ({ laeqDb: laeqDb + shift })),
  }));

describe('task-based properties (by the equations)', () => {
  test('the sensitivity coefficients c1a,m sum to 1 (C.7 with the energy sum of equation 9)', () => {
    fc.assert(
      fc.property(fc.array(taskArbitrary, { minLength: 1, maxLength: 5 }), (tasks) => {
        const result = taskBasedEstimate({ instrument: 'class1-meter', tasks: toTasks(tasks) });
        expect(result.tasks.reduce((sum, task) => sum + task.levelSensitivity, 0)).toBeCloseTo(1, 9);
      }),
    );
  });

  test('raising every measurement by the same amount raises LEX,8h by it and leaves u unchanged', () => {
    fc.assert(
      fc.property(fc.array(taskArbitrary, { minLength: 1, maxLength: 4 }), fc.double({ min: -10, max: 10, noNaN: true }), (tasks, shift) => {
        const base = taskBasedEstimate({ instrument: 'dosimeter', tasks: toTasks(tasks) });
        const shifted = taskBasedEstimate({ instrument: 'dosimeter', tasks: toTasks(tasks, shift) });
        expect(shifted.lex8h - base.lex8h).toBeCloseTo(shift, 8);
        expect(shifted.combinedUncertainty).toBeCloseTo(base.combinedUncertainty, 8);
      }),
    );
  });

  test('adding a task never lowers LEX,8h (it only adds sound energy to the day)', () => {
    fc.assert(
      fc.property(fc.array(taskArbitrary, { minLength: 1, maxLength: 4 }), taskArbitrary, (tasks, extra) => {
        const before = taskBasedEstimate({ instrument: 'dosimeter', tasks: toTasks(tasks) });
        const after = taskBasedEstimate({ instrument: 'dosimeter', tasks: toTasks([...tasks, extra]) });
        expect(after.lex8h).toBeGreaterThanOrEqual(before.lex8h - 1e-9);
      }),
    );
  });

  test('the duration terms only ever add to U', () => {
    fc.assert(
      fc.property(fc.array(taskArbitrary, { minLength: 1, maxLength: 4 }), (tasks) => {
        const result = taskBasedEstimate({ instrument: 'dosimeter', tasks: toTasks(tasks) });
        expect(result.expandedUncertainty).toBeGreaterThanOrEqual(result.expandedUncertaintyWithoutDuration - 1e-12);
      }),
    );
  });
});

describe('job-based property', () => {
  test('LEX,8h − 10·lg(Te/8) lies between the lowest and highest sample, and U ≥ 1.65·√(u2² + u3²)', () => {
    fc.assert(
      fc.property(fc.array(level, { minLength: 5, maxLength: 8 }), fc.double({ min: 1, max: 12, noNaN: true }), (levels, hours) => {
        const result = jobBasedEstimate({
          samples: levels.map((laeqDb) => ({ laeqDb, durationMinutes: 120 })),
          effectiveHours: hours,
          instrument: 'dosimeter',
          groupSize: 5,
        });
        expect(result.laeqTe).toBeGreaterThanOrEqual(Math.min(...levels) - 1e-9);
        expect(result.laeqTe).toBeLessThanOrEqual(Math.max(...levels) + 1e-9);
        expect(result.expandedUncertainty).toBeGreaterThanOrEqual(1.65 * Math.sqrt(1.5 ** 2 + 1) - 1e-9);
      }),
      { numRuns: 40 },
    );
  });
});

describe('values in force and the LEX,8h + U verdict (stats/iso9612-verdict.ts)', () => {
  const group = { oelValue: 100, oelUnit: 'dose-percent', oelSource: 'Demo', actionLevel: 50 };

  test('the ISO set (or none) gives Directive 2003/10/EC Art. 3: 80 and 85 dB(A) action values, 87 dB(A) limit', () => {
    const values = noiseValuesInForce({ ...group, noiseCriteriaSet: 'iso' });
    expect(values.map((value) => [value.kind, value.valueDb])).toEqual([
      ['action', 80],
      ['action', 85],
      ['limit', 87],
    ]);
    expect(noiseValuesInForce({ ...group, noiseCriteriaSet: null }).map((value) => value.valueDb)).toEqual([80, 85, 87]);
  });

  test('an OSHA set gives the 85 dBA action level and the 90 dBA PEL, with the exchange-rate caveat; the group’s 50 % dose is 85 dB(A) there', () => {
    const values = noiseValuesInForce({ ...group, noiseCriteriaSet: 'oshaHc' });
    expect(values.filter((value) => value.source.startsWith('OSHA')).map((value) => value.valueDb)).toEqual([85, 90]);
    expect(values.every((value) => value.note !== null)).toBe(true);
    // OSHA 1910.95 App. A: D = 100·2^((L − 90)/5) → 50 % at 85 dBA, 100 % at 90 dBA.
    expect(values.find((value) => value.label.startsWith('group action level'))!.valueDb).toBeCloseTo(85, 12);
    expect(values.find((value) => value.label.startsWith('group OEL'))!.valueDb).toBeCloseTo(90, 12);
  });

  test('under NIOSH (85 dBA, 3 dB) the group’s 50 % dose is 82 dB(A) and the REL is 85 dBA', () => {
    const values = noiseValuesInForce({ ...group, noiseCriteriaSet: 'nioshRel' });
    expect(values.map((value) => value.valueDb)).toEqual([82, 85, 85]);
  });

  test('a group OEL in dB(A) is compared as it is', () => {
    const values = noiseValuesInForce({ noiseCriteriaSet: 'iso', oelValue: 87, oelUnit: 'dBA', oelSource: 'Local regulation', actionLevel: 83 });
    expect(values.find((value) => value.label === 'group action level')).toMatchObject({ valueDb: 83, source: 'Local regulation' });
  });

  test('the sentence says above, reaches or below by LEX,8h + U, rounded to 0.1 dB for display', () => {
    const values = noiseValuesInForce({ ...group, noiseCriteriaSet: 'iso' });
    const [lower, upperAction, limit] = compareWithValues(86.5, 3.1, values);
    expect(upperAction.sentence).toBe('LEX,8h + U = 89.6 dB(A) is above the upper exposure action value 85 dB(A)');
    expect(limit).toMatchObject({ lexPlusUAbove: true, lexAbove: false });
    expect(lower.lexAbove).toBe(true);
    expect(compareWithValues(84, 1, values)[1].sentence).toBe('LEX,8h + U = 85.0 dB(A) reaches the upper exposure action value 85 dB(A)');
    expect(compareWithValues(70, 2, values)[0]).toMatchObject({
      lexPlusUAbove: false,
      sentence: 'LEX,8h + U = 72.0 dB(A) is below the lower exposure action value 80 dB(A)',
    });
    expect(() => compareWithValues(Number.NaN, 1, values)).toThrow(RangeError);
    expect(() => compareWithValues(85, -1, values)).toThrow(/U must be a finite number ≥ 0/);
  });
});
