/**
 * A seeded synthetic flow-driven log with a known first-order response (physics.md §4.2: a pump sets
 * Q into a compliant node C drained through R, so p(t) = p₀ + ΔQ·R·(1 − e^(−t/τ)), τ = R·C).
 * Written as a lab logger would: comment lines, semicolons, units in brackets.
 */
import { createRng } from '../../src/core/stats/rng';

export interface SyntheticRun {
  text: string;
  tauS: number;
  resistanceMbarPerUlMin: number;
  /** Onsets of the flow steps, s. */
  onsetsS: number[];
  /** Flow levels, µL/min (before the first step, then after each). */
  levelsUlMin: number[];
}

/** τ = 4 s, R = 5 mbar/(µL/min), 10 Hz, steps every 60 s (15 τ: settled), noise σ = 0.4 mbar. */
export function flowDrivenRun(seed = 20261201): SyntheticRun {
  const tauS = 4;
  const r = 5;
  const rateHz = 10;
  const dwellS = 60;
  const levels = [0, 10, 20, 30, 20, 10, 0];
  const onsets = levels.slice(1).map((_, i) => (i + 1) * dwellS - 30);
  const endS = onsets[onsets.length - 1]! + dwellS;
  const rng = createRng(seed);
  const lines = ['# Lab: invented demo lab (Lagbench synthetic test data)', '# Chip: PDMS mixer M-07 (invented)', 'time [s];flow setpoint [uL/min];pressure [mbar]'];
  let p = 0;
  let k = 0;
  const n = Math.round(endS * rateHz);
  for (let i = 0; i <= n; i++) {
    const t = i / rateHz;
    while (k < onsets.length && t >= onsets[k]!) k++;
    const q = levels[k]!;
    // Exact first-order response from the previous level, piecewise: integrate step by step.
    const target = r * q;
    p = i === 0 ? target : target + (p - target) * Math.exp(-1 / rateHz / tauS);
    const noisy = p + 0.4 * rng.normal();
    lines.push(`${t.toFixed(2)};${q.toFixed(3)};${noisy.toFixed(4)}`);
  }
  return { text: `${lines.join('\n')}\n`, tauS, resistanceMbarPerUlMin: r, onsetsS: onsets, levelsUlMin: levels };
}
