/**
 * analyzeRecording end to end on seeded synthetic logs whose responses are the closed-form
 * first-order step responses of physics.md §4.2 (flow source → C → R: p(t) = Q·R·(1 − e^{−t/τ}),
 * τ = R·C) and §4.3 (pressure source, outlet flow Q₂(t) = Δp/(R₁+R₂)·(1 − e^{−t/τ})).
 */
import { describe, expect, it } from 'vitest';
import { analyzeRecording } from '../../../src/core/analyze/analyze';
import { defaultFitter } from '../../../src/core/analyze/default-fitter';
import { InputError } from '../../../src/core/errors';
import { stepsFromProgram } from '../../../src/core/steps/program';
import { syntheticLog, UL_PER_MIN, MBAR, type SyntheticLogSpec } from '../steps/synthetic-logs';

/** R = 10 mbar/(µL/min) = 6e13 Pa·s/m³ (physics.md §5), C = 5e-14 m³/Pa → τ = R·C = 3 s (§4.2). */
const R = 6e13;
const C = 5e-14;
const TAU = R * C;
const program = [
  { timeS: 0, value: 0 },
  { timeS: 40.01, value: 10 * UL_PER_MIN },
  { timeS: 90.01, value: 20 * UL_PER_MIN },
  { timeS: 140.01, value: 5 * UL_PER_MIN },
];
const flowDriven: SyntheticLogSpec = {
  sampleRateHz: 50,
  durationS: 190,
  program,
  driveQuantity: 'flow_setpoint',
  responseQuantity: 'pressure',
  gain: R,
  tauS: TAU,
  responseNoise: 0.5 * MBAR,
  seed: 31,
};

describe('analyzeRecording', () => {
  it('analyzeRecording(flow-driven log, known τ) recovers τ = R·C inside every reported 95 % CI', () => {
    const a = analyzeRecording(syntheticLog(flowDriven), { fit: { terms: 1 } }, defaultFitter);
    expect(a.setup).toBe('flow-driven');
    expect(a.setup_reason).toMatch(/flow setpoint/);
    expect(a.steps).toHaveLength(3);
    for (const [i, s] of a.steps.entries()) {
      expect(s.terms).toHaveLength(1);
      const [lo, hi] = s.terms[0]!.tau_ci95_s;
      expect(lo).toBeLessThan(TAU);
      expect(hi).toBeGreaterThan(TAU);
      expect(s.fit!.converged).toBe(true);
      // Plateau Q·R (closed form §4.2) inside the CI of y∞.
      const plateau = R * program[i + 1]!.value;
      expect(s.y_inf_ci95[0]!).toBeLessThan(plateau);
      expect(s.y_inf_ci95[1]!).toBeGreaterThan(plateau);
      // 50 s windows cover 16.7 τ: settled; t63 = τ within the CI width (physics.md §4.1: 63.2 % at τ).
      expect(s.settled).toBe(true);
      expect(s.window_in_taus!).toBeGreaterThan(15);
      expect(Math.abs(s.t63_s! - TAU)).toBeLessThan(hi! - lo!);
      expect(s.inconclusive).toBe(false);
    }
    expect(a.steps.map((s) => s.direction)).toEqual(['up', 'up', 'down']);
    expect(a.steps.map((s) => [s.drive.before! / UL_PER_MIN, s.drive.after! / UL_PER_MIN])).toEqual([
      [expect.closeTo(0, 9), expect.closeTo(10, 9)],
      [expect.closeTo(10, 9), expect.closeTo(20, 9)],
      [expect.closeTo(20, 9), expect.closeTo(5, 9)],
    ]);
  });

  it('analyzeRecording(result) has every documented JSON field and survives JSON round-trip unchanged', () => {
    const a = analyzeRecording(syntheticLog(flowDriven), { software: { name: 'lagbench', version: '9.9.9' } }, defaultFitter);
    expect(JSON.parse(JSON.stringify(a))).toEqual(a);
    expect(Object.keys(a).sort()).toEqual(
      ['detection', 'files', 'noise_sigma', 'ramps', 'setup', 'setup_reason', 'shared_fits', 'software', 'steps', 'warnings'].sort(),
    );
    expect(a.software).toEqual({ name: 'lagbench', version: '9.9.9' });
    const s = a.steps[0]!;
    for (const key of ['index', 'start_s', 'end_s', 'drive', 'response', 'terms', 'y_inf', 'dead_time_s', 'settled', 'window_in_taus', 't63_s', 't95_s', 't99_s', 'fit', 'warnings']) {
      expect(s).toHaveProperty(key);
    }
    expect(Object.keys(s.drive).sort()).toEqual(['after', 'before', 'channel', 'quantity', 'unit']);
    expect(s.response).toEqual({ quantity: 'pressure', channel: 'pressure_si', unit: 'Pa' });
    expect(Object.keys(s.terms[0]!).sort()).toEqual(['amplitude', 'amplitude_ci95', 'amplitude_se', 'tau_ci95_s', 'tau_s', 'tau_se_s']);
    for (const key of ['rmse', 'r2', 'converged', 'stop_reason', 'iterations', 'n', 'flags', 'order_selection']) {
      expect(s.fit).toHaveProperty(key);
    }
    expect(s.dead_time_s).toBeNull(); // not fitted unless asked
    // Noise σ of the response from the MAD of first differences: simulated 50 Pa, within 5 %.
    expect(a.noise_sigma.response_unit).toBe('Pa');
    expect(Math.abs(a.noise_sigma.response! / 50 - 1)).toBeLessThan(0.05);
  });

  it('analyzeRecording(user steps on a response-only log) fits the listed windows', () => {
    const rec = syntheticLog({ ...flowDriven, includeDrive: false, seed: 32 });
    const steps = stepsFromProgram(program, 'flow_setpoint', 190);
    const a = analyzeRecording(rec, { steps, setup: 'flow-driven', fit: { terms: 1 } }, defaultFitter);
    expect(a.detection.origin).toBe('user');
    expect(a.steps.map((s) => s.start_s)).toEqual([40.01, 90.01, 140.01]);
    for (const s of a.steps) {
      expect(s.terms[0]!.tau_ci95_s[0]!).toBeLessThan(TAU);
      expect(s.terms[0]!.tau_ci95_s[1]!).toBeGreaterThan(TAU);
    }
  });

  it('analyzeRecording(pressure-driven log) picks the flow as response from the pressure setpoint', () => {
    // §4.3 check values: R1 = 1e13, R2 = 2e13 Pa·s/m³, C = 1e-13 m³/Pa → τ = 0.6667 s; outlet flow = Δp/(R1+R2)·(1 − e^{−t/τ}).
    const tau = (1e-13 * 1e13 * 2e13) / 3e13;
    const rec = syntheticLog({
      sampleRateHz: 100,
      durationS: 60,
      program: [
        { timeS: 0, value: 0 },
        { timeS: 15.005, value: 100 * MBAR },
        { timeS: 35.005, value: 300 * MBAR },
      ],
      driveQuantity: 'pressure_setpoint',
      responseQuantity: 'flow',
      gain: 1 / 3e13,
      tauS: tau,
      responseNoise: 0.05 * UL_PER_MIN,
      seed: 33,
    });
    const a = analyzeRecording(rec, { fit: { terms: 1 } }, defaultFitter);
    expect(a.setup).toBe('pressure-driven');
    expect(a.steps).toHaveLength(2);
    for (const s of a.steps) {
      expect(s.response.quantity).toBe('flow');
      expect(s.response.unit).toBe('m3_per_s');
      expect(s.terms[0]!.tau_ci95_s[0]!).toBeLessThan(tau);
      expect(s.terms[0]!.tau_ci95_s[1]!).toBeGreaterThan(tau);
    }
  });

  it('analyzeRecording(repeated steps) adds shared-τ fits of same-direction same-level steps, τ inside the CI', () => {
    const repeated = [
      { timeS: 0, value: 0 },
      { timeS: 30.01, value: 10 * UL_PER_MIN },
      { timeS: 60.01, value: 0 },
      { timeS: 90.01, value: 10 * UL_PER_MIN },
      { timeS: 120.01, value: 0 },
    ];
    const rec = syntheticLog({ ...flowDriven, program: repeated, durationS: 150, seed: 34 });
    const a = analyzeRecording(rec, { fit: { terms: 1 } }, defaultFitter);
    expect(a.steps).toHaveLength(4);
    expect(a.shared_fits.map((g) => [g.direction, g.step_indices])).toEqual([
      ['up', [0, 2]],
      ['down', [1, 3]],
    ]);
    for (const g of a.shared_fits) {
      expect(g.converged).toBe(true);
      expect(g.terms).toHaveLength(1);
      expect(g.terms[0]!.tau_ci95_s[0]!).toBeLessThan(TAU);
      expect(g.terms[0]!.tau_ci95_s[1]!).toBeGreaterThan(TAU);
      expect(g.windows.map((w) => w.step_index)).toEqual(g.step_indices);
    }
    expect(analyzeRecording(rec, { fit: { terms: 1 }, sharedFits: false }, defaultFitter).shared_fits).toEqual([]);
  });

  it('analyzeRecording(no response channel) throws an InputError naming the channels', () => {
    const rec = syntheticLog({ ...flowDriven, durationS: 20 });
    rec.channels.pop();
    expect(() => analyzeRecording(rec, { setup: 'flow-driven' }, defaultFitter)).toThrow(InputError);
    expect(() => analyzeRecording(rec, { setup: 'flow-driven' }, defaultFitter)).toThrow(/no pressure channel.*flow_setpoint_si/);
  });

  it('analyzeRecording(log without steps) returns no steps and a no-steps warning', () => {
    const rec = syntheticLog({ ...flowDriven, program: [{ timeS: 0, value: 10 * UL_PER_MIN }], durationS: 60 });
    const a = analyzeRecording(rec, {}, defaultFitter);
    expect(a.steps).toEqual([]);
    expect(a.warnings.map((w) => w.code)).toContain('no-steps');
  });

  it('analyzeRecording(onProgress) reports increasing fractions from 0 to 1', () => {
    const fractions: number[] = [];
    analyzeRecording(syntheticLog(flowDriven), { fit: { terms: 1 }, onProgress: (f) => fractions.push(f) }, defaultFitter);
    expect(fractions[0]).toBe(0);
    expect(fractions[fractions.length - 1]).toBe(1);
    for (let i = 1; i < fractions.length; i++) expect(fractions[i]!).toBeGreaterThanOrEqual(fractions[i - 1]!);
  });
});

describe('analyzeRecording with a ramp after a step', () => {
  it('analyzeRecording(step at 45 s then a ramp at 75 s) fits the step to the ramp start against the held plateau', () => {
    // Programme: 2 → 5 µL/min at 15 s, 5 → 10 at 45 s, ramp 10 → 5 over 75–95 s, step to 2 at 130 s
    // (the programme's own setpoints are the truth); R = 6e13 Pa·s/m³, τ = 3 s: the 30 s window is 10 τ.
    const rec = syntheticLog({
      ...flowDriven,
      durationS: 170,
      program: [
        { timeS: 0, value: 2 * UL_PER_MIN },
        { timeS: 15.01, value: 5 * UL_PER_MIN },
        { timeS: 45.01, value: 10 * UL_PER_MIN },
        { timeS: 130.01, value: 2 * UL_PER_MIN },
      ],
      ramps: [{ startS: 75, endS: 95, from: 10 * UL_PER_MIN, to: 5 * UL_PER_MIN }],
      seed: 41,
    });
    const a = analyzeRecording(rec, { fit: { terms: 1 } }, defaultFitter);
    const s = a.steps.find((x) => Math.abs(x.start_s - 45.02) < 0.05)!;
    expect(s).toBeDefined();
    expect(s.drive.after! / UL_PER_MIN).toBeCloseTo(10, 9);
    // The window ends where the ramp leaves 10 µL/min (75 s, to the 20 ms sample).
    expect(Math.abs(s.end_s - 75)).toBeLessThan(0.03);
    // y∞ = R·Q (closed form §4.2) inside its CI; the drive change is 5 µL/min, so R = Δy∞/ΔQ is unbiased.
    const plateau = R * 10 * UL_PER_MIN;
    expect(s.y_inf_ci95[0]!).toBeLessThan(plateau);
    expect(s.y_inf_ci95[1]!).toBeGreaterThan(plateau);
    expect(s.fit!.flags.map((f) => f.code)).not.toContain('residual-structure');
  });
});
