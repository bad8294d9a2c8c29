import { describe, expect, it } from 'vitest';
import {
  chiSquareCdf,
  fCdf,
  fSurvival,
  lnGamma,
  normalCdf,
  normalQuantile,
  studentTCdf,
  studentTQuantile,
} from '../../../src/core/stats';

describe('normalCdf / normalQuantile', () => {
  it('normalCdf matches known values of Φ', () => {
    // Abramowitz & Stegun Table 26.1 (Φ(1) = 0.8413447461, Φ(2) = 0.9772498681); Φ(−3) = 1.3498980316e−3
    // (scipy.stats.norm.cdf(−3) = 1.34989803163009e−3, checked as oracle).
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(1)).toBeCloseTo(0.8413447460685429, 14);
    expect(normalCdf(2)).toBeCloseTo(0.9772498680518208, 14);
    expect(normalCdf(-3) / 1.3498980316300946e-3).toBeCloseTo(1, 12);
    // Far tail: Φ(−10) = 7.6198530241605e−24 (A&S 26.2.12 asymptotic; from memory of the value;
    // scipy.stats.norm.cdf(−10) = 7.61985302416047e−24 agrees, checked as oracle).
    expect(normalCdf(-10) / 7.619853024160527e-24).toBeCloseTo(1, 10);
  });

  it('normalQuantile reproduces the standard critical values', () => {
    // Standard normal table (e.g. NIST/SEMATECH e-Handbook §1.3.6.7.1): z0.975 = 1.95996, z0.995 = 2.57583, z0.95 = 1.64485.
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 13);
    expect(normalQuantile(0.995)).toBeCloseTo(2.5758293035489004, 13);
    expect(normalQuantile(0.95)).toBeCloseTo(1.6448536269514722, 13);
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(1e-10)).toBeCloseTo(-6.361340902404056, 10); // scipy.stats.norm.ppf(1e-10) = −6.361340902404056
  });

  it('normalQuantile inverts normalCdf across the range', () => {
    // Derivation: Φ(Φ⁻¹(p)) = p.
    for (const p of [1e-300, 1e-15, 1e-5, 0.01, 0.3, 0.5, 0.7, 0.99, 1 - 1e-12]) {
      const x = normalQuantile(p);
      const back = p < 0.5 ? normalCdf(x) : 1 - normalCdf(-x);
      expect(Math.abs(back - p) / Math.min(p, 1 - p)).toBeLessThan(1e-9);
    }
  });
});

describe('studentTQuantile / studentTCdf', () => {
  it('studentTQuantile matches the table of Student t critical values', () => {
    // NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2 "Critical values of the Student's t
    // distribution" (3 decimals): ν=10, 0.975 → 2.228; ν=1 → 12.706; ν=2 → 4.303; ν=5, 0.95 → 2.015;
    // ν=20, 0.995 → 2.845; ν=30, 0.975 → 2.042; ν=100, 0.975 → 1.984; ∞ → 1.960.
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
    expect(studentTQuantile(0.975, 2)).toBeCloseTo(4.303, 3);
    expect(studentTQuantile(0.95, 5)).toBeCloseTo(2.015, 3);
    expect(studentTQuantile(0.995, 20)).toBeCloseTo(2.845, 3);
    expect(studentTQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    expect(studentTQuantile(0.975, 100)).toBeCloseTo(1.984, 3);
    expect(studentTQuantile(0.975, Infinity)).toBeCloseTo(1.96, 3);
    expect(studentTQuantile(0.025, 10)).toBeCloseTo(-2.228, 3);
  });

  it('studentTQuantile approaches the normal quantile for large dof', () => {
    // Derivation: t_ν → N(0,1) as ν → ∞; Cornish–Fisher first term t ≈ z + (z³+z)/(4ν).
    const z = normalQuantile(0.975);
    const nu = 1e6;
    expect(studentTQuantile(0.975, nu)).toBeCloseTo(z + (z ** 3 + z) / (4 * nu), 9);
  });

  it('studentTCdf matches the closed forms for 1 and 2 dof', () => {
    // Derivation: ν=1 is Cauchy, F(t) = 1/2 + atan(t)/π; ν=2: F(t) = 1/2 + t/(2√(2+t²)).
    for (const t of [-30, -2, -0.3, 0, 0.7, 4, 100]) {
      expect(studentTCdf(t, 1)).toBeCloseTo(0.5 + Math.atan(t) / Math.PI, 14);
      expect(studentTCdf(t, 2)).toBeCloseTo(0.5 + t / (2 * Math.sqrt(2 + t * t)), 14);
    }
  });

  it('studentTQuantile inverts studentTCdf for fractional and odd dof', () => {
    // Derivation: F(F⁻¹(p)) = p.
    for (const nu of [1.5, 3, 7.3, 41, 1000]) {
      for (const p of [0.6, 0.9, 0.975, 0.9995]) {
        expect(studentTCdf(studentTQuantile(p, nu), nu)).toBeCloseTo(p, 12);
      }
    }
  });
});

describe('fCdf / chiSquareCdf', () => {
  it('fCdf gives 0.95 at the tabulated upper 5 % points of F', () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.3, upper critical values of the F distribution (α = 0.05):
    // F(1,10) = 4.965, F(5,10) = 3.326, F(2,20) = 3.493, F(10,10) = 2.978 (3 decimals, hence tolerance).
    expect(fCdf(4.965, 1, 10)).toBeCloseTo(0.95, 4);
    expect(fCdf(3.326, 5, 10)).toBeCloseTo(0.95, 4);
    expect(fCdf(3.493, 2, 20)).toBeCloseTo(0.95, 4);
    expect(fCdf(2.978, 10, 10)).toBeCloseTo(0.95, 4);
  });

  it('fCdf agrees with closed forms', () => {
    // Derivation: F(1, ν) = T_ν², so P(F ≤ t²) = 2·T_ν(t) − 1; for d1 = 2, P(F ≤ x) = 1 − (1 + 2x/d2)^(−d2/2).
    const t = studentTQuantile(0.975, 10);
    expect(fCdf(t * t, 1, 10)).toBeCloseTo(0.95, 13);
    for (const x of [0.1, 1, 3, 20]) {
      expect(fCdf(x, 2, 7)).toBeCloseTo(1 - (1 + (2 * x) / 7) ** -3.5, 14);
      expect(fCdf(x, 2, 7) + fSurvival(x, 2, 7)).toBeCloseTo(1, 14);
    }
  });

  it('chiSquareCdf matches the chi-square table', () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.4, upper critical values of χ² (α = 0.05): ν=1 → 3.841, ν=10 → 18.307.
    expect(chiSquareCdf(3.841, 1)).toBeCloseTo(0.95, 4);
    expect(chiSquareCdf(18.307, 10)).toBeCloseTo(0.95, 4);
    // Derivation: ν = 2 is exponential, P = 1 − exp(−x/2).
    expect(chiSquareCdf(3, 2)).toBeCloseTo(1 - Math.exp(-1.5), 14);
  });

  it('lnGamma matches factorials and Γ(1/2) = √π', () => {
    // Derivation: Γ(n) = (n−1)!, Γ(1/2) = √π.
    expect(lnGamma(10)).toBeCloseTo(Math.log(362880), 12);
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
    let lnFact170 = 0;
    for (let k = 2; k <= 170; k++) lnFact170 += Math.log(k);
    expect(lnGamma(171)).toBeCloseTo(lnFact170, 9); // Γ(171) = 170!, summed directly
  });
});
