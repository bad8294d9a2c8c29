/**
 * detectSteps on seeded synthetic logs. The responses are the closed-form first-order step responses
 * of physics.md §4.1/§4.2 (p(t) = Q·R·(1 − e^{−t/τ}) after a flow step); the thresholds tested
 * (8 σ default step size, dwell) are our own documented choices (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { detectSteps } from '../../../src/core/steps/detect';
import { InputError } from '../../../src/core/errors';
import { syntheticLog, UL_PER_MIN, type SyntheticLogSpec } from './synthetic-logs';

/** 10 mbar/(µL/min) = 6e13 Pa·s/m³ (physics.md §5: 1 mbar/(µL/min) = 6.0e12 Pa·s/m³). */
const R = 6e13;

const program = [
  { timeS: 0, value: 0 },
  { timeS: 40.005, value: 10 * UL_PER_MIN },
  { timeS: 100.005, value: 20 * UL_PER_MIN },
  { timeS: 160.005, value: 5 * UL_PER_MIN },
  { timeS: 220.005, value: 15 * UL_PER_MIN },
];
const base: SyntheticLogSpec = {
  sampleRateHz: 100,
  durationS: 280,
  program,
  driveQuantity: 'flow_setpoint',
  responseQuantity: 'pressure',
  gain: R,
  tauS: 2,
  responseNoise: 50, // Pa; steps of 10 µL/min give 10 000 Pa: 200 σ
  seed: 11,
};
/** First sample at or after each programme change at 100 Hz (programme times are between samples). */
const firstSamples = [40.01, 100.01, 160.01, 220.01];

describe('detectSteps', () => {
  it('detectSteps(clean flow setpoint) finds each step at the first sample at the new level with exact levels', () => {
    const d = detectSteps(syntheticLog(base));
    expect(d.origin).toBe('drive');
    expect(d.quantity).toBe('flow_setpoint');
    expect(d.noiseSigma).toBe(0);
    expect(d.steps.map((s) => s.onsetS)).toEqual(firstSamples.map((t) => expect.closeTo(t, 9)));
    expect(d.steps.map((s) => s.direction)).toEqual(['up', 'up', 'down', 'up']);
    expect(d.steps.map((s) => s.drive.before / UL_PER_MIN)).toEqual([0, 10, 20, 5].map((v) => expect.closeTo(v, 9)));
    expect(d.steps.map((s) => s.drive.after / UL_PER_MIN)).toEqual([10, 20, 5, 15].map((v) => expect.closeTo(v, 9)));
    // Windows run to the next step, the last to the end of the record.
    expect(d.steps.map((s) => s.windowEndS)).toEqual([...firstSamples.slice(1), 279.99].map((t) => expect.closeTo(t, 9)));
    expect(d.ramps).toEqual([]);
  });

  it('detectSteps(noisy measured pump flow, no setpoint) finds the steps to the sample', () => {
    const rec = syntheticLog({ ...base, driveQuantity: 'flow', driveNoise: 0.25 * UL_PER_MIN, seed: 12 });
    const d = detectSteps(rec, { setup: 'flow-driven' });
    expect(d.quantity).toBe('flow');
    // σ from the MAD of first differences recovers the simulated 0.25 µL/min within 5 % (20 000 samples).
    expect(d.noiseSigma / UL_PER_MIN).toBeGreaterThan(0.2375);
    expect(d.noiseSigma / UL_PER_MIN).toBeLessThan(0.2625);
    expect(d.steps.map((s) => s.onsetS)).toEqual(firstSamples.map((t) => expect.closeTo(t, 6)));
    for (const [i, s] of d.steps.entries()) {
      // Median of ≥ 100 samples: standard error ≈ 1.25·σ/√100 ≈ 0.03 µL/min; allow 0.1.
      expect(Math.abs(s.drive.after / UL_PER_MIN - [10, 20, 5, 15][i]!)).toBeLessThan(0.1);
    }
  });

  it('detectSteps(response only, noisy, drifting, spiky) finds every step on the response', () => {
    const rec = syntheticLog({
      ...base,
      includeDrive: false,
      responseDriftPerS: 0.5, // Pa/s: 140 Pa over the record
      spikeFraction: 0.01,
      spikeSize: 5000, // Pa: half a step, 100 σ
      seed: 13,
    });
    const d = detectSteps(rec);
    expect(d.origin).toBe('response');
    expect(d.steps).toHaveLength(4);
    for (const [i, s] of d.steps.entries()) {
      const truth = program[i + 1]!.timeS;
      // Onset is placed where the response leaves the old level (≥ true onset, within 0.3 τ = 0.6 s).
      expect(s.onsetS).toBeGreaterThanOrEqual(truth);
      expect(s.onsetS).toBeLessThan(truth + 0.6);
      expect(s.shape).toBe('gradual');
      // Settled level after: R·Q (closed form, §4.2) plus the drift at that time (< 140 Pa), noise ≪ 50 Pa.
      expect(Math.abs(s.drive.after - R * program[i + 1]!.value)).toBeLessThan(200);
    }
    expect(d.steps.map((s) => s.direction)).toEqual(['up', 'up', 'down', 'up']);
  });

  it('detectSteps(response through two equal lags, S-shaped start) still reports steps, not ramps', () => {
    // Two equal lags: (t90 − t50)/(t50 − t10) = 1.93 ≥ 1.5 (derivation in level-changes.ts).
    const rec = syntheticLog({ ...base, includeDrive: false, tauS: 1.5, secondTauS: 1.5, seed: 21 });
    const d = detectSteps(rec);
    expect(d.ramps).toEqual([]);
    expect(d.steps).toHaveLength(4);
    for (const [i, s] of d.steps.entries()) {
      expect(s.onsetS).toBeGreaterThanOrEqual(program[i + 1]!.timeS);
      expect(s.onsetS).toBeLessThan(program[i + 1]!.timeS + 1.5);
    }
  });

  it('detectSteps(response only, no steps) reports none despite drift and spikes', () => {
    const rec = syntheticLog({
      ...base,
      program: [{ timeS: 0, value: 10 * UL_PER_MIN }],
      includeDrive: false,
      responseDriftPerS: 2, // Pa/s: 560 Pa = 11 σ over the record, far slower than any step
      spikeFraction: 0.02,
      spikeSize: 20_000,
      seed: 14,
    });
    const d = detectSteps(rec);
    expect(d.steps).toEqual([]);
    expect(d.ramps).toEqual([]);
  });

  it('detectSteps(spiky measured drive) ignores isolated spikes', () => {
    const rec = syntheticLog({ ...base, driveQuantity: 'flow', driveNoise: 0.1 * UL_PER_MIN, seed: 15 });
    const drive = rec.channels[0]!.values;
    // Two-sample spikes of 30 µL/min every 7 s: larger than any step, shorter than the spike filter.
    for (let i = 350; i < drive.length - 1; i += 700) {
      drive[i] = drive[i]! + 30 * UL_PER_MIN;
      drive[i + 1] = drive[i + 1]! + 30 * UL_PER_MIN;
    }
    const d = detectSteps(rec, { setup: 'flow-driven' });
    expect(d.steps.map((s) => s.onsetS)).toEqual(firstSamples.map((t) => expect.closeTo(t, 6)));
  });

  it('detectSteps(setpoint ramp programme) flags a ramp and reports no step for it', () => {
    const rec = syntheticLog({
      ...base,
      program: [
        { timeS: 0, value: 0 },
        { timeS: 200.005, value: 5 * UL_PER_MIN },
      ],
      ramps: [{ startS: 50, endS: 80, from: 0, to: 20 * UL_PER_MIN }],
      seed: 16,
    });
    // The programme holds 20 µL/min after the ramp until the step to 5 µL/min at 200 s.
    const d = detectSteps(rec);
    expect(d.ramps).toHaveLength(1);
    expect(d.ramps[0]!.startS).toBeGreaterThan(49);
    expect(d.ramps[0]!.endS).toBeLessThan(81);
    expect(d.steps.map((s) => s.onsetS)).toEqual([expect.closeTo(200.01, 6)]);
    expect(d.steps[0]!.drive.before / UL_PER_MIN).toBeCloseTo(20, 9);
    expect(d.warnings.map((w) => w.code)).toContain('ramp-not-analysed');
  });

  it('detectSteps(staircase setpoint ramp, 0.1 s stairs) flags a ramp, not 100 steps', () => {
    const stairs = Array.from({ length: 100 }, (_, k) => ({ timeS: 50 + 0.1 * k + 0.005, value: (0.2 * (k + 1)) * UL_PER_MIN }));
    const rec = syntheticLog({ ...base, program: [{ timeS: 0, value: 0 }, ...stairs], seed: 17 });
    const d = detectSteps(rec);
    expect(d.steps).toEqual([]);
    expect(d.ramps).toHaveLength(1);
  });

  it('detectSteps(response to a linear pressure ramp, no drive) reports no step', () => {
    const rec = syntheticLog({
      ...base,
      program: [{ timeS: 0, value: 0 }],
      ramps: [{ startS: 60, endS: 160, from: 0, to: 20 * UL_PER_MIN }],
      includeDrive: false,
      seed: 18,
    });
    const d = detectSteps(rec);
    expect(d.steps).toEqual([]);
  });

  it('detectSteps(minStepSize) leaves out smaller changes', () => {
    const rec = syntheticLog({
      ...base,
      program: [
        { timeS: 0, value: 0 },
        { timeS: 40.005, value: 2 * UL_PER_MIN },
        { timeS: 100.005, value: 12 * UL_PER_MIN },
        { timeS: 160.005, value: 14 * UL_PER_MIN },
      ],
      seed: 19,
    });
    expect(detectSteps(rec).steps).toHaveLength(3);
    const d = detectSteps(rec, { minStepSize: 5 * UL_PER_MIN });
    expect(d.minStepSize).toBe(5 * UL_PER_MIN);
    expect(d.steps.map((s) => s.onsetS)).toEqual([expect.closeTo(100.01, 6)]);
  });

  it('detectSteps(minDwellS) does not count a level that does not hold for the dwell', () => {
    const rec = syntheticLog({
      ...base,
      program: [
        { timeS: 0, value: 0 },
        { timeS: 40.005, value: 10 * UL_PER_MIN },
        { timeS: 41.505, value: 0 }, // held 1.5 s
        { timeS: 100.005, value: 10 * UL_PER_MIN },
      ],
      seed: 20,
    });
    expect(detectSteps(rec, { minDwellS: 1 }).steps).toHaveLength(3);
    const d = detectSteps(rec, { minDwellS: 3 });
    expect(d.minDwellS).toBe(3);
    expect(d.steps.map((s) => s.onsetS)).toEqual([expect.closeTo(100.01, 6)]);
    expect(d.steps[0]!.drive.before).toBe(0);
  });

  it('detectSteps(unknown channel) throws an InputError naming the channels', () => {
    const rec = syntheticLog(base);
    expect(() => detectSteps(rec, { channel: 'nope' })).toThrow(InputError);
    expect(() => detectSteps(rec, { channel: 'nope' })).toThrow(/flow_setpoint_si, pressure_si/);
  });

  it('detectSteps(all-NaN channel) returns no steps with a warning', () => {
    const rec = syntheticLog({ ...base, durationS: 10 });
    rec.channels[0]!.values.fill(Number.NaN);
    const d = detectSteps(rec);
    expect(d.steps).toEqual([]);
    expect(d.warnings.map((w) => w.code)).toEqual(['too-few-samples']);
  });
});

describe('detectSteps with a ramp right after a step', () => {
  // Programme: 2 → 5 µL/min at 15 s, 5 → 10 at 45 s, then a ramp 10 → 5 over 75–95 s, a step to 2 at 120 s.
  // Source: the programme's own setpoints (the plateau held from 45 s to 75 s is 10 µL/min exactly).
  const rampSpec: SyntheticLogSpec = {
    ...base,
    durationS: 160,
    program: [
      { timeS: 0, value: 2 * UL_PER_MIN },
      { timeS: 15.005, value: 5 * UL_PER_MIN },
      { timeS: 45.005, value: 10 * UL_PER_MIN },
      { timeS: 120.005, value: 2 * UL_PER_MIN },
    ],
    ramps: [{ startS: 75, endS: 95, from: 10 * UL_PER_MIN, to: 5 * UL_PER_MIN }],
    seed: 31,
  };

  it('detectSteps(clean setpoint, step then ramp) takes the after-level from the plateau before the ramp and ends the window at the ramp start', () => {
    const d = detectSteps(syntheticLog(rampSpec));
    const step = d.steps.find((s) => Math.abs(s.onsetS - 45.01) < 0.02);
    expect(step).toBeDefined();
    expect(step!.drive.after / UL_PER_MIN).toBeCloseTo(10, 9);
    expect(d.ramps).toHaveLength(1);
    // The ramp leaves 10 µL/min at 75 s: the first sample below it is 75.01 s at 100 Hz.
    expect(d.ramps[0]!.startS).toBeGreaterThan(74.9);
    expect(d.ramps[0]!.startS).toBeLessThan(75.1);
    expect(d.ramps[0]!.before / UL_PER_MIN).toBeCloseTo(10, 9);
    expect(step!.windowEndS).toBeCloseTo(d.ramps[0]!.startS, 9);
    expect(d.steps.map((s) => s.onsetS)).toEqual([15.01, 45.01, 120.01].map((t) => expect.closeTo(t, 6)));
  });

  it('detectSteps(noisy measured flow, step then a 3 s ramp) gives the plateau level within noise', () => {
    // A 3 s ramp: on a noisy drive the detector sees a ramp only when it changes by ≥ minStep/2 (here 8σ/2 =
    // 1 µL/min) within one dwell (1 s); the 20 s ramp above changes by 0.25 µL/min per dwell.
    const spec: SyntheticLogSpec = { ...rampSpec, driveQuantity: 'flow', driveNoise: 0.25 * UL_PER_MIN, seed: 32 };
    spec.ramps = [{ startS: 75, endS: 78, from: 10 * UL_PER_MIN, to: 5 * UL_PER_MIN }];
    const d = detectSteps(syntheticLog(spec), { setup: 'flow-driven' });
    const step = d.steps.find((s) => Math.abs(s.onsetS - 45.01) < 0.05);
    expect(step).toBeDefined();
    // Median of ≥ 100 samples: SE ≈ 1.25·0.25/√100 ≈ 0.03 µL/min; allow 0.1 (as above).
    expect(Math.abs(step!.drive.after / UL_PER_MIN - 10)).toBeLessThan(0.1);
    expect(d.ramps).toHaveLength(1);
    expect(Math.abs(d.ramps[0]!.startS - 75)).toBeLessThan(1);
    expect(step!.windowEndS).toBeLessThan(75.5);
  });
});
