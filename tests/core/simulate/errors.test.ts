import { describe, expect, it } from 'vitest';
import { simulate } from '../../../src/core/simulate/simulate';
import type { Network, Program } from '../../../src/core/simulate/types';
import { inputErrorOf } from '../../helpers/error-of';

const base: Network = {
  nodes: [{ id: 'n', complianceM3PerPa: 1e-13 }],
  resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: 1e13 }],
  flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }],
  pressureSources: [],
  heads: [],
  ambientPressurePa: 101325,
};
const prog: Program = { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 1e-10, rampS: 0 }] }] };

const errorOf = inputErrorOf;

// The refusals and their wording are rules of our own (DEVELOPERS.md: InputError says what and where);
// numbers here are test inputs, not reference values.
describe('simulate refuses bad networks and programs', () => {
  it('simulate(resistor to an unknown end) names the resistor and the end', () => {
    const e = errorOf(() => simulate({ ...base, resistors: [{ id: 'r', from: 'n', to: 'drain', resistancePaSPerM3: 1e13 }] }, prog, { sampleRateHz: 1, durationS: 1 }));
    expect(e.message).toMatch(/resistor 'r' connects to 'drain'/);
  });

  it('simulate(node without a path to the outlet) has no steady state', () => {
    const e = errorOf(() => simulate({ ...base, resistors: [] }, prog, { sampleRateHz: 1, durationS: 1 }));
    expect(e.code).toBe('no-steady-state');
  });

  it("simulate(node without a path to the outlet, initial 'rest') integrates the pump flow: p = Q·t/C", () => {
    // Derived here: C·dp/dt = Q with no outflow.
    const res = simulate({ ...base, resistors: [] }, prog, { sampleRateHz: 1, durationS: 3, initial: 'rest' });
    expect(res.nodePressurePa.n![3]).toBeCloseTo((1e-10 * 3) / 1e-13, 6);
  });

  it('simulate(program not starting at 0, ramps overlapping) is refused with the channel named', () => {
    const late: Program = { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 1, valueSI: 0, rampS: 0 }] }] };
    expect(errorOf(() => simulate(base, late, { sampleRateHz: 1, durationS: 1 })).code).toBe('program-start');
    const overlap: Program = { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 0, rampS: 0 }, { timeS: 1, valueSI: 1e-10, rampS: 5 }, { timeS: 3, valueSI: 0, rampS: 0 }] }] };
    expect(errorOf(() => simulate(base, overlap, { sampleRateHz: 1, durationS: 1 })).message).toMatch(/row 3 at 3 s starts before/);
  });

  it('simulate(source driven by a missing program channel) says which column to add', () => {
    const e = errorOf(() => simulate(base, { channels: [] }, { sampleRateHz: 1, durationS: 1 }));
    expect(e.message).toMatch(/add a 'flow' column/);
  });

  it('simulate(duplicate ids, zero compliance, bad sample rate) is refused', () => {
    expect(errorOf(() => simulate({ ...base, nodes: [{ id: 'r', complianceM3PerPa: 1e-13 }] }, prog, { sampleRateHz: 1, durationS: 1 })).message).toMatch(/used twice/);
    expect(errorOf(() => simulate({ ...base, nodes: [{ id: 'n', complianceM3PerPa: 0 }] }, prog, { sampleRateHz: 1, durationS: 1 })).message).toMatch(/compliance > 0/);
    expect(errorOf(() => simulate(base, prog, { sampleRateHz: 0, durationS: 1 })).code).toBe('bad-sample-rate');
  });
});
