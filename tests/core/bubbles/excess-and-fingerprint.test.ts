import { describe, expect, it } from 'vitest';
import { airVolumeFromExcess, excessCompliance, linearTrend, pressureFingerprint } from '../../../src/core/bubbles';
import { createRng } from '../../../src/core/stats';

const ATM = 101325; // Pa (ISO 2533 standard atmosphere)

describe('excessCompliance and airVolumeFromExcess (physics.md §3.4)', () => {
  it('excessCompliance combines the fit SE with the nominal range as a uniform distribution, u = width/√12 (GUM §4.3.7)', () => {
    const fitted = { value: 3e-13, standardError: 1e-14, ci95: [2.8e-13, 3.2e-13] as [number, number], inconclusive: false };
    const out = excessCompliance(fitted, { valueM3PerPa: 1e-13, rangeM3PerPa: [0.8e-13, 1.2e-13] }, 1000);
    expect(out.excessM3PerPa.value).toBeCloseTo(2e-13, 25);
    expect(out.nominalStandardUncertaintyM3PerPa).toBeCloseTo(0.4e-13 / Math.sqrt(12), 25);
    expect(out.excessM3PerPa.standardError).toBeCloseTo(Math.hypot(1e-14, 0.4e-13 / Math.sqrt(12)), 25);
  });

  it('airVolumeFromExcess turns 9.869e-14 m³/Pa of excess at 1 atm into 10 µL (§3.3 check, isothermal)', () => {
    const fitted = { value: 9.869e-14 + 5e-14, standardError: 1e-16, ci95: [0, 0] as [number, number], inconclusive: false };
    const excess = excessCompliance(fitted, { valueM3PerPa: 5e-14, rangeM3PerPa: [5e-14, 5e-14] }, 1000);
    const out = airVolumeFromExcess(excess, { pressureAbsPa: ATM, ambientPressurePa: ATM });
    expect(out.volumeM3AtAtm! / 10e-9).toBeCloseTo(1, 3);
    expect(out.evidenceOfGas).toBe(true);
    // adiabatic upper bound V = γ·ΔC·p (§3.3): 14 µL
    expect(out.adiabaticUpperBoundM3AtAtm / 14e-9).toBeCloseTo(1, 3);
  });

  it('airVolumeFromExcess converts gauge working pressure to atmosphere by Boyle (V_atm = V·p_abs/p_atm)', () => {
    // 1 bar gauge → p_abs = 201325 Pa; gas volume V = ΔC·p_abs; at atmosphere V·p_abs/p_atm
    const dc = 5e-14;
    const fitted = { value: dc, standardError: 1e-16, ci95: [0, 0] as [number, number], inconclusive: false };
    const excess = excessCompliance(fitted, { valueM3PerPa: 0, rangeM3PerPa: [0, 0] }, 1000);
    const pAbs = ATM + 1e5;
    const out = airVolumeFromExcess(excess, { pressureAbsPa: pAbs, ambientPressurePa: ATM });
    expect(out.volumeM3AtWorkingPressure / (dc * pAbs)).toBeCloseTo(1, 12);
    expect(out.volumeM3AtAtm! / ((dc * pAbs * pAbs) / ATM)).toBeCloseTo(1, 12);
  });

  it('airVolumeFromExcess says "no evidence of trapped gas" when the excess is within the nominal range', () => {
    const fitted = { value: 1.05e-13, standardError: 1e-15, ci95: [0, 0] as [number, number], inconclusive: false };
    const excess = excessCompliance(fitted, { valueM3PerPa: 1e-13, rangeM3PerPa: [0.6e-13, 1.6e-13] }, 1000);
    const out = airVolumeFromExcess(excess, { pressureAbsPa: ATM, ambientPressurePa: ATM });
    expect(out.evidenceOfGas).toBe(false);
    expect(out.ci95![0]).toBeLessThanOrEqual(0);
    expect(out.statement).toMatch(/^No evidence of trapped gas/);
  });
});

/** Synthetic compliances from C = C_rigid + V_atm·p_atm/p² (Boyle, §3.3) with seeded 2 % noise. */
function fingerprintData(vAtm: number, cRigid: number, gaugeLevelsPa: number[], seed: number, relNoise = 0.02) {
  const rng = createRng(seed);
  return gaugeLevelsPa.map((g) => {
    const pAbs = ATM + g;
    const c = cRigid + (vAtm * ATM) / (pAbs * pAbs);
    const se = relNoise * c;
    return { complianceM3PerPa: c + se * rng.normal(), standardError: se, pressureAbsPa: pAbs };
  });
}

describe('pressureFingerprint', () => {
  const levels = [5e3, 5e3, 50e3, 50e3, 150e3, 150e3, 300e3, 300e3]; // gauge Pa, 4 levels × 2 steps

  it('pressureFingerprint recovers an exact V_atm and C_rigid from noise-free compliances', () => {
    // Expected: the V_atm and C_rigid the data were generated from (Boyle model above, §3.3).
    const pts = fingerprintData(2e-9, 3e-14, levels, 1, 0).map((p) => ({ ...p, standardError: 1e-18 }));
    const out = pressureFingerprint(pts, { ambientPressurePa: ATM });
    expect(out.volumeM3AtAtm! / 2e-9).toBeCloseTo(1, 8);
    expect(out.rigidComplianceM3PerPa!.value / 3e-14).toBeCloseTo(1, 8);
  });

  it('pressureFingerprint finds a 2 µL bubble within its 95 % CI in at least 18 of 20 seeded runs', () => {
    let covered = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const out = pressureFingerprint(fingerprintData(2e-9, 3e-14, levels, seed), { ambientPressurePa: ATM });
      const [lo, hi] = out.ci95!;
      if (lo <= 2e-9 && 2e-9 <= hi) covered++;
      expect(out.evidenceOfGas).toBe(true);
    }
    // Common practice, no source: with true 95 % coverage P(≥ 18 of 20) = 0.92 (binomial, scipy.stats.binom).
    expect(covered).toBeGreaterThanOrEqual(18);
  });

  it('pressureFingerprint says "no evidence of trapped gas" when V_atm = 0', () => {
    let claims = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const out = pressureFingerprint(fingerprintData(0, 3e-14, levels, seed), { ambientPressurePa: ATM });
      if (out.evidenceOfGas) claims++;
      else expect(out.statement).toMatch(/^No evidence of trapped gas/);
    }
    // A 95 % test: a false claim in ≤ 2/20 runs; P(≤ 2 of 20) = 0.92 at a 5 % false-claim rate (binomial, scipy.stats.binom).
    expect(claims).toBeLessThanOrEqual(2);
  });

  it('pressureFingerprint is inconclusive with fewer than 3 steps or a single pressure level', () => {
    // Derivation: C = C_rigid + V·p_atm/p² has 2 unknowns; 3 steps at ≥ 2 distinct levels leave 1 dof for a CI.
    const two = pressureFingerprint(fingerprintData(2e-9, 3e-14, [5e3, 300e3], 1));
    expect(two.volumeM3AtAtm).toBeNull();
    expect(two.statement).toMatch(/at least 3/);
    const oneLevel = pressureFingerprint(fingerprintData(2e-9, 3e-14, [5e3, 5e3, 5.01e3, 5e3], 1));
    expect(oneLevel.volumeM3AtAtm).toBeNull();
    expect(oneLevel.statement).toMatch(/distinct levels/);
  });
});

describe('linearTrend', () => {
  it('linearTrend reports a falling compliance with a slope CI containing the true slope', () => {
    // invented dissolving bubble: C(t) = 1e-13·(1 − 0.2·t/h), 8 measurements over 2 h, 1 % noise
    const rng = createRng(3);
    const pts = Array.from({ length: 8 }, (_, i) => {
      const t = i * 900;
      const c = 1e-13 * (1 - (0.2 * t) / 3600);
      return { timeS: t, value: c + 1e-15 * rng.normal(), standardError: 1e-15 };
    });
    const out = linearTrend(pts);
    expect(out.direction).toBe('falling');
    const [lo, hi] = out.slopePerS!.ci95;
    expect(lo).toBeLessThanOrEqual(-1e-13 * (0.2 / 3600));
    expect(hi).toBeGreaterThanOrEqual(-1e-13 * (0.2 / 3600));
    expect(out.statement).toMatch(/dissolving/);
  });

  it('linearTrend finds no significant trend in constant data with noise', () => {
    const rng = createRng(4);
    const pts = Array.from({ length: 8 }, (_, i) => ({ timeS: i * 600, value: 1e-13 + 1e-15 * rng.normal(), standardError: 1e-15 }));
    expect(linearTrend(pts).direction).toBe('no significant trend');
  });

  it('linearTrend is inconclusive with two points', () => {
    // Derivation: a line through 2 points has n − 2 = 0 residual degrees of freedom, so no slope CI exists.
    expect(linearTrend([{ timeS: 0, value: 1 }, { timeS: 1, value: 2 }]).direction).toBe('inconclusive');
  });
});
