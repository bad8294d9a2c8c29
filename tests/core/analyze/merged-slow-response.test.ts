/**
 * A response logged by a slower logger and merged onto a faster logger's time base is fitted on its own
 * samples, not on the interpolated ones: interpolated points are not independent measurements, and
 * counting them would shrink the confidence intervals by about √(rate ratio) (common practice, no source:
 * the standard error of a least-squares estimate scales as 1/√n for independent samples).
 * Closed-form first-order response: physics.md §4.2.
 */
import { describe, expect, it } from 'vitest';
import { analyzeRecording } from '../../../src/core/analyze/analyze';
import { defaultFitter } from '../../../src/core/analyze/default-fitter';
import { mergeRecordings } from '../../../src/core/recording/merge';
import type { Recording } from '../../../src/core/recording/types';
import { syntheticLog, UL_PER_MIN, MBAR } from '../steps/synthetic-logs';

const R = 6e13; // 10 mbar/(µL/min) (physics.md §5)
const C = 5e-14;
const TAU = R * C; // 3 s
const program = [
  { timeS: 0, value: 0 },
  { timeS: 40.05, value: 10 * UL_PER_MIN },
  { timeS: 90.05, value: 20 * UL_PER_MIN },
];

function twoLoggers(seed: number): Recording {
  const base = { durationS: 140, program, driveQuantity: 'flow_setpoint' as const, responseQuantity: 'pressure' as const, gain: R, tauS: TAU, responseNoise: 0.5 * MBAR, seed };
  const pump = syntheticLog({ ...base, sampleRateHz: 100 });
  pump.channels = pump.channels.filter((c) => c.quantity === 'flow_setpoint');
  pump.sources = ['pump.csv'];
  const gauge = syntheticLog({ ...base, sampleRateHz: 10, includeDrive: false });
  gauge.sources = ['gauge.csv'];
  return mergeRecordings([pump, gauge], { offsetsS: [0] });
}

describe('analyzeRecording on merged logs', () => {
  it('analyzeRecording fits a response merged from a 10 Hz logger on its 10 Hz samples, not the 100 Hz interpolation', () => {
    const merged = twoLoggers(5);
    const pressure = merged.channels.find((c) => c.quantity === 'pressure');
    expect(pressure?.native?.values.length).toBe(1400);
    const a = analyzeRecording(merged, { fit: { terms: 1 }, sharedFits: false }, defaultFitter);
    expect(a.steps).toHaveLength(2);
    for (const s of a.steps) {
      // 50 s windows at 10 Hz: about 500 samples (5000 if the interpolated points were fitted).
      expect(s.fit!.n).toBeGreaterThan(480);
      expect(s.fit!.n).toBeLessThan(520);
    }
  });

  it('analyzeRecording on merged logs keeps honest τ intervals over seeds (≥ 16 of 20 steps covered)', () => {
    let covered = 0;
    let total = 0;
    for (let seed = 100; seed < 110; seed++) {
      const a = analyzeRecording(twoLoggers(seed), { fit: { terms: 1 }, sharedFits: false }, defaultFitter);
      for (const s of a.steps) {
        const [lo, hi] = s.terms[0]!.tau_ci95_s;
        total++;
        if (lo! < TAU && hi! > TAU) covered++;
      }
    }
    expect(total).toBe(20);
    expect(covered).toBeGreaterThanOrEqual(16);
  });
});
