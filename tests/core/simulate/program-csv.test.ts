import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { parseProgramCsv } from '../../../src/core/simulate/program-csv';

function err(text: string): InputError {
  try {
    parseProgramCsv(text, 'p.csv');
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('accepted');
}

describe('parseProgramCsv', () => {
  it('parseProgramCsv(flow in µL/min with a ramp) converts to SI (1 µL/min = 1.666667e-11 m³/s, physics.md §5)', () => {
    const p = parseProgramCsv('# demo\ntime_s,flow[uL/min],ramp_s\n0,0\n10,5\n60,20,4\n', 'p.csv');
    expect(p.channels).toHaveLength(1);
    const ch = p.channels[0]!;
    expect(ch.quantity).toBe('flow');
    expect(ch.points.map((x) => x.timeS)).toEqual([0, 10, 60]);
    expect(ch.points[1]!.valueSI).toBeCloseTo(5 * 1.666667e-11, 16);
    expect(ch.points[2]!.rampS).toBe(4);
  });

  it('parseProgramCsv(pressure in mbar, time in min, empty cells) keeps levels and converts (1 mbar = 100 Pa)', () => {
    const p = parseProgramCsv('time[min],pressure[mbar],pressure_2[kPa]\r\n0,100,1\r\n1,,2\r\n2,300,\r\n', 'p.csv');
    // 100 mbar = 1e4 Pa (physics.md §5, exact), 1 min = 60 s, 1 kPa = 1e3 Pa; an empty cell keeps no point (our format).
    expect(p.channels.map((c) => c.name)).toEqual(['pressure', 'pressure_2']);
    expect(p.channels[0]!.points.map((x) => [x.timeS, x.valueSI])).toEqual([[0, 10_000], [120, 30_000]]);
    expect(p.channels[1]!.points.map((x) => [x.timeS, x.valueSI])).toEqual([[0, 1000], [60, 2000]]);
  });

  it('parseProgramCsv(bad inputs) gives located errors', () => {
    // Our own program format (docs); line:column positions counted in each text.
    expect(err('').code).toBe('program-empty');
    expect(err('time_s,flow[uL/min]\n').code).toBe('program-empty');
    expect(err('time_s,flow\n0,1\n').message).toMatch(/^p\.csv:1:8: setpoint column 'flow' has no unit/);
    expect(err('time_s,flow[bar]\n0,1\n').message).toMatch(/'bar' is not a flow unit/);
    expect(err('time_s,flow[uL/min]\n5,1\n').code).toBe('program-start');
    expect(err('time_s,flow[uL/min]\n0,1\n3,abc\n').message).toMatch(/^p\.csv:3:3: 'abc' is not a number/);
    expect(err('time_s,flow[uL/min]\n0,1\n3,2\n2,1\n').code).toBe('program-order');
    expect(err('time_s,flow[uL/min],ramp_s\n0,1\n3,2,10\n5,1\n').message).toMatch(/while its ramp from 3 s runs until 13 s/);
    expect(err('time_s,temperature[C]\n0,1\n').code).toBe('program-header');
    expect(err('time_s,flow[uL/min]\n0,1,2\n').code).toBe('program-ragged');
  });
});
