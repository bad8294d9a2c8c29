import { describe, expect, it } from 'vitest';
import { complianceFromFlowBalance } from '../../../src/core/circuits';
import { createRng } from '../../../src/core/stats';

// Flow-driven circuit of physics.md §4.2, solved in closed form here:
// p(t) = Q0·R·(1 − e^(−t/τ)), Q_out = p/R, τ = R·C.
const R = 2e13;
const C = 1e-13;
const Q0 = 1e-10;
const TAU = R * C;

function synthetic(seed: number, pressureNoisePa: number, flowNoise: number) {
  const rng = createRng(seed);
  const n = 1000;
  const tS = new Float64Array(n);
  const p = new Float64Array(n);
  const qOut = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = (i * 5 * TAU) / (n - 1);
    const pTrue = Q0 * R * (1 - Math.exp(-t / TAU));
    tS[i] = t;
    p[i] = pTrue + pressureNoisePa * rng.normal();
    qOut[i] = pTrue / R + flowNoise * rng.normal();
  }
  return { tS, p, qOut };
}

describe('complianceFromFlowBalance', () => {
  it('complianceFromFlowBalance returns C exactly on noise-free data (trapezoid error only)', () => {
    // Mass balance of §4.2 [D]: C·Δp = ∫(Q_in − Q_out) dt; 1000 trapezoids over 5τ leave an error < 1e-4.
    const { tS, p, qOut } = synthetic(1, 0, 0);
    const out = complianceFromFlowBalance({ tS, pressurePa: p, flowInM3PerS: Q0, flowOutM3PerS: qOut });
    expect(out.complianceM3PerPa.value / C).toBeCloseTo(1, 4);
  });

  it('complianceFromFlowBalance gives a 95 % CI containing the true C on noisy logs (10 seeds)', () => {
    let covered = 0;
    for (let seed = 1; seed <= 10; seed++) {
      // 1 % pressure noise, 1 % flow noise relative to the step (a plausible sensor; common practice, no source)
      const { tS, p, qOut } = synthetic(seed, 20, 1e-12);
      const out = complianceFromFlowBalance({ tS, pressurePa: p, flowInM3PerS: Q0, flowOutM3PerS: qOut });
      const [lo, hi] = out.complianceM3PerPa.ci95;
      if (lo <= C && C <= hi) covered++;
      expect(Math.abs(out.complianceM3PerPa.value / C - 1)).toBeLessThan(0.1);
    }
    // Coverage bound: common practice, no source; with true 95 % coverage P(≥ 8 of 10) = 0.988 (binomial, scipy.stats.binom).
    expect(covered).toBeGreaterThanOrEqual(8);
  });

  it('complianceFromFlowBalance refuses series of different lengths', () => {
    expect(() =>
      complianceFromFlowBalance({ tS: new Float64Array(10), pressurePa: new Float64Array(9), flowInM3PerS: 0, flowOutM3PerS: 0 }),
    ).toThrow(/samples/);
  });
});

describe('complianceFromFlowBalance with flow-dominated noise', () => {
  it('complianceFromFlowBalance widens the CI for the random walk of integrated flow noise', () => {
    let covered = 0;
    for (let seed = 11; seed <= 20; seed++) {
      // 5 % flow noise, no pressure noise: the integrated flow wanders, residuals are autocorrelated
      const { tS, p, qOut } = synthetic(seed, 0, 5e-12);
      const out = complianceFromFlowBalance({ tS, pressurePa: p, flowInM3PerS: Q0, flowOutM3PerS: qOut });
      const [lo, hi] = out.complianceM3PerPa.ci95;
      if (lo <= C && C <= hi) covered++;
      // Integrated white flow noise is a random walk: residuals strongly autocorrelated [D]; 0.5 and n/3 are
      // thresholds of our own (common practice, no source). Coverage ≥ 8/10 as above.
      expect(out.residualLag1).toBeGreaterThan(0.5);
      expect(out.effectiveN).toBeLessThan(out.n / 3);
    }
    expect(covered).toBeGreaterThanOrEqual(8);
  });
});
