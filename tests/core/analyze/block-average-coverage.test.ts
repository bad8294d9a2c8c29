/**
 * Block averaging of long windows (windows.ts) must keep the reported 95 % CI honest: over seeded
 * first-order step responses (closed form, physics.md §4.2) sampled at 1 kHz and averaged 10:1, the
 * true τ lies inside the CI about 95 % of the time. With 40 logs and p = 0.95, fewer than 34 hits has
 * binomial probability 0.34 % (our computation; 38 of 40 measured), so the test fails only if the CIs are too narrow.
 */
import { describe, expect, it } from 'vitest';
import { analyzeRecording } from '../../../src/core/analyze/analyze';
import { defaultFitter } from '../../../src/core/analyze/default-fitter';
import { stepsFromProgram } from '../../../src/core/steps/program';
import { syntheticLog, UL_PER_MIN } from '../steps/synthetic-logs';

describe('analyzeRecording with block averaging', () => {
  it('analyzeRecording(maxFitPoints 2000 on 20 000-sample windows) keeps τ inside the 95 % CI in ≥ 34 of 40 logs', () => {
    const tau = 2;
    const program = [
      { timeS: 0, value: 0 },
      { timeS: 5.0005, value: 10 * UL_PER_MIN },
    ];
    let hits = 0;
    let averaged = 0;
    for (let seed = 100; seed < 140; seed++) {
      const rec = syntheticLog({
        sampleRateHz: 1000,
        durationS: 25,
        program,
        driveQuantity: 'flow_setpoint',
        responseQuantity: 'pressure',
        gain: 6e13,
        tauS: tau,
        responseNoise: 500, // Pa: 5 % of the 10 000 Pa step per sample
        includeDrive: false,
        seed,
      });
      const a = analyzeRecording(
        rec,
        { setup: 'flow-driven', steps: stepsFromProgram(program, 'flow_setpoint', 25), fit: { terms: 1 }, maxFitPoints: 2000, sharedFits: false },
        defaultFitter,
      );
      const s = a.steps[0]!;
      if (s.fit!.samples_per_point === 10) averaged++;
      const [lo, hi] = s.terms[0]!.tau_ci95_s;
      if (lo! < tau && tau < hi!) hits++;
    }
    expect(averaged).toBe(40);
    expect(hits).toBeGreaterThanOrEqual(34);
  });
});
