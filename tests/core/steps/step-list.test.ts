/**
 * parseStepList / stepsFromProgram: our own step-list format. Unit factors checked against
 * physics.md §5 (1 µL/min = 1.666667e-11 m³/s, 1 mbar = 100 Pa, exact).
 */
import { describe, expect, it } from 'vitest';
import { parseStepList } from '../../../src/core/steps/step-list';
import { rampsFromProgram, stepsFromProgram } from '../../../src/core/steps/program';
import { inputErrorOf } from '../../helpers/error-of';

const errorOf = inputErrorOf;

describe('parseStepList', () => {
  it('parseStepList(flow_setpoint[uL/min]) converts to m³/s and skips comments and blank lines', () => {
    const list = parseStepList('# pump programme, chip M-07\n\ntime_s,flow_setpoint[uL/min]\n0,0\n60,10\n120.5,2.5\n', 'prog.csv');
    expect(list.quantity).toBe('flow_setpoint');
    expect(list.entries.map((e) => e.timeS)).toEqual([0, 60, 120.5]);
    // physics.md §5 gives 1 µL/min = 1.666667e-11 m³/s to 7 digits.
    expect(list.entries[1]!.value / 1.666667e-11).toBeCloseTo(10, 5);
    expect(list.entries[2]!.value / 1.666667e-11).toBeCloseTo(2.5, 5);
  });

  it('parseStepList(time[min], value[mbar]) takes the quantity from the unit and scales time', () => {
    const list = parseStepList('time[min];value[mbar]\r\n0;0\r\n1.5;250\r\n', 'p.csv');
    expect(list.quantity).toBe('pressure_setpoint');
    expect(list.entries).toEqual([
      { timeS: 0, value: 0 },
      { timeS: 90, value: 25_000 },
    ]);
  });

  it('parseStepList(bare value) keeps SI values and leaves the quantity to the setup', () => {
    expect(parseStepList('time_s,value\n0,1e-10\n5,2e-10\n', 'x.csv')).toEqual({
      quantity: null,
      entries: [
        { timeS: 0, value: 1e-10 },
        { timeS: 5, value: 2e-10 },
      ],
    });
  });

  it('parseStepList(ramp_s column) marks ramp rows; an empty cell is a step', () => {
    const list = parseStepList('time_s,flow[uL/min],ramp_s\n0,2\n15,5,\n75,10,3\n', 'p.csv');
    expect(list.quantity).toBe('flow_setpoint');
    expect(list.entries.map((e) => e.rampS ?? 0)).toEqual([0, 0, 3]);
    const e = errorOf(() => parseStepList('time_s,value,ramp_s\n0,0\n5,1,-2\n', 'r.csv'));
    expect(e.code).toBe('step-list-bad-ramp');
    expect(e.location).toEqual({ file: 'r.csv', line: 3, column: 5 });
    expect(errorOf(() => parseStepList('time_s,value,speed\n0,0\n5,1\n', 'r.csv')).code).toBe('step-list-bad-ramp-header');
  });

  it('parseStepList(bad number) throws a located InputError with line and column', () => {
    const e = errorOf(() => parseStepList('time_s,flow_setpoint[uL/min]\n0,0\n60,ten\n', 'prog.csv'));
    expect(e.code).toBe('step-list-bad-value');
    expect(e.location).toEqual({ file: 'prog.csv', line: 3, column: 4 });
    expect(e.message).toMatch(/^prog\.csv:3:4: 'ten' is not a number\./);
  });

  it('parseStepList(times not increasing) throws at the offending line', () => {
    const e = errorOf(() => parseStepList('time_s,value\n0,0\n60,1\n60,2\n', 'prog.csv'));
    expect(e.code).toBe('step-list-time-order');
    expect(e.location.line).toBe(4);
  });

  it('parseStepList(unknown unit, wrong kind, bad header, missing rows) throws InputErrors', () => {
    expect(errorOf(() => parseStepList('time_s,flow_setpoint[furlong/fortnight]\n0,0\n1,1\n', 'a')).code).toBe('step-list-unknown-unit');
    expect(errorOf(() => parseStepList('time_s,flow_setpoint[mbar]\n0,0\n1,1\n', 'a')).code).toBe('step-list-unit-mismatch');
    expect(errorOf(() => parseStepList('when,flow_setpoint\n0,0\n1,1\n', 'a')).code).toBe('step-list-bad-time-header');
    expect(errorOf(() => parseStepList('time_s,temperature[K]\n0,0\n', 'a')).code).toBe('step-list-bad-value-header');
    expect(errorOf(() => parseStepList('time_s,value\n0,0\n', 'a')).code).toBe('step-list-too-short');
    expect(errorOf(() => parseStepList('# nothing\n', 'a')).code).toBe('step-list-empty');
    expect(errorOf(() => parseStepList('time_s,value\n0,0,7\n', 'a')).code).toBe('step-list-column-count');
  });
});

describe('stepsFromProgram', () => {
  it('stepsFromProgram(ramp rows) makes no step of a ramp, which ends the previous window; rampsFromProgram lists it', () => {
    const entries = [
      { timeS: 0, value: 2 },
      { timeS: 15, value: 5 },
      { timeS: 75, value: 10, rampS: 3 },
      { timeS: 105, value: 2 },
    ];
    const steps = stepsFromProgram(entries, 'flow_setpoint', 200);
    expect(steps.map((s) => [s.onsetS, s.windowEndS, s.drive.before, s.drive.after])).toEqual([
      [15, 75, 2, 5],
      [105, 200, 10, 2],
    ]);
    expect(rampsFromProgram(entries, 200)).toEqual([{ startS: 75, endS: 78, before: 5, after: 10 }]);
  });

  it('stepsFromProgram(entries) makes a step per change, windows to the next change or the end', () => {
    const steps = stepsFromProgram(
      [
        { timeS: 0, value: 0 },
        { timeS: 60, value: 10 },
        { timeS: 90, value: 10 }, // unchanged: not a step
        { timeS: 120, value: 4 },
        { timeS: 500, value: 8 }, // after the end of the log: left out
      ],
      'flow_setpoint',
      300,
    );
    expect(steps).toEqual([
      { index: 0, onsetS: 60, drive: { channel: null, quantity: 'flow_setpoint', before: 0, after: 10 }, direction: 'up', windowEndS: 120, origin: 'user' },
      { index: 1, onsetS: 120, drive: { channel: null, quantity: 'flow_setpoint', before: 10, after: 4 }, direction: 'down', windowEndS: 300, origin: 'user' },
    ]);
  });
});
