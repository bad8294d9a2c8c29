import { describe, expect, it } from 'vitest';
import { estimateFlowDriven, monteCarloPropagate, parameterSetFromFit } from '../../../src/core/circuits';
import { makeFit } from './fit-fixture';

// Circuit of physics.md §4.2 (syringe pump → C → R → outlet): p(t) = Q0·R·(1 − e^(−t/(RC))).
const R = 2e13; // Pa·s/m³ (≈ 3.3 mbar/(µL/min); typical chips 1e12–1e16, physics.md §6 [P]) — a test input
const C = 1e-13; // m³/Pa
const Q0 = 1e-10; // m³/s (6 µL/min)

describe('estimateFlowDriven', () => {
  it('estimateFlowDriven recovers R = Δp∞/ΔQ and C = τ/R from exact fit values (§4.2, τ = R·C of §4.1)', () => {
    const dp = Q0 * R; // 2000 Pa, §4.2 final value
    const fit = makeFit({ yInf: 100 + dp, terms: [{ tauS: R * C, amplitude: -dp }] });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    expect(out.resistancePaSPerM3?.value).toBeCloseTo(R, -7);
    expect(out.complianceM3PerPa?.value).toBeCloseTo(C, 22);
    expect(out.tauS.value).toBeCloseTo(2, 12);
    expect(out.setup).toBe('flow-driven');
  });

  it('estimateFlowDriven handles a downward step (both Δp and ΔQ negative) with positive R and C', () => {
    const dp = Q0 * R;
    // §4.2 with the step reversed [D]: Δp = −2000 Pa, ΔQ = −Q0 → R = Δp/ΔQ = 2e13; C = τ/R = 2 s/2e13 = 1e-13.
    const fit = makeFit({ yInf: 0, terms: [{ tauS: 2, amplitude: dp }] });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: Q0, flowAfterM3PerS: 0 });
    expect(out.resistancePaSPerM3?.value).toBeCloseTo(R, -7);
    expect(out.complianceM3PerPa?.value).toBeCloseTo(C, 22);
    expect(out.warnings.map((w) => w.code)).not.toContain('resistance-sign');
  });

  it('estimateFlowDriven propagates correlated SEs as the analytic delta method does', () => {
    // Derivation in this test: with baseline p0 measured (σ_b), Δp = y∞ − p0,
    // R = Δp/ΔQ → σ_R = √(σ_y² + σ_b²)/ΔQ; C = τ·ΔQ/Δp →
    // (σ_C/C)² = (σ_τ/τ)² + (σ_Δp/Δp)² − 2·ρ(τ, y∞)·σ_τ·σ_y/(τ·Δp).
    const dp = 2000;
    const [sy, sb, st, rho] = [20, 5, 0.05, 0.6];
    const fit = makeFit({
      yInf: dp,
      yInfSe: sy,
      terms: [{ tauS: 2, amplitude: -dp, tauSe: st, amplitudeSe: 30 }],
      correlations: { 'yInf|tau1_s': rho, 'yInf|a1': -0.3 },
    });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0, pressureBefore: { value: 0, standardError: sb } });
    const sDp = Math.hypot(sy, sb);
    expect(out.resistancePaSPerM3?.standardError).toBeCloseTo(sDp / Q0, -7);
    const relC = Math.sqrt((st / 2) ** 2 + (sDp / dp) ** 2 - (2 * rho * st * sy) / (2 * dp));
    expect(out.complianceM3PerPa!.standardError / C).toBeCloseTo(relC, 6);
    // CI = value ± t(0.975, 200)·SE; t(0.975, 200) = 1.972 (standard t table; scipy.stats.t.ppf(0.975, 200) = 1.97190)
    const ci = out.complianceM3PerPa!.ci95;
    expect((ci[1] - ci[0]) / 2 / out.complianceM3PerPa!.standardError).toBeCloseTo(1.972, 3);
  });

  it('monteCarloPropagate agrees with the delta method for small relative errors (JCGM 101 cross-check)', () => {
    const fit = makeFit({
      yInf: 2000,
      yInfSe: 10,
      terms: [{ tauS: 2, amplitude: -2000, tauSe: 0.02, amplitudeSe: 12 }],
      correlations: { 'yInf|tau1_s': 0.5, 'yInf|a1': -0.4, 'a1|tau1_s': -0.2 },
    });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    const { set } = parameterSetFromFit(fit);
    // C = τ·ΔQ/(y∞ − (y∞ + a1)) = −τ·ΔQ/a1 with the default baseline (the fit's start level)
    const mc = monteCarloPropagate(set, (p) => (-p('tau1_s') * Q0) / p('a1'), { samples: 40000, seed: 7 });
    expect(mc.standardDeviation / out.complianceM3PerPa!.standardError).toBeGreaterThan(0.97);
    expect(mc.standardDeviation / out.complianceM3PerPa!.standardError).toBeLessThan(1.03);
    expect(mc.ci95[0] / out.complianceM3PerPa!.ci95[0]).toBeCloseTo(1, 2);
    expect(mc.ci95[1] / out.complianceM3PerPa!.ci95[1]).toBeCloseTo(1, 2);
  });

  it('estimateFlowDriven flags C as inconclusive when its CI includes 0', () => {
    const fit = makeFit({ yInf: 2000, yInfSe: 10, terms: [{ tauS: 2, amplitude: -2000, tauSe: 1.5, amplitudeSe: 10 }] });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    expect(out.complianceM3PerPa?.inconclusive).toBe(true);
    expect(out.resistancePaSPerM3?.inconclusive).toBe(false);
    expect(out.warnings.some((w) => w.code === 'inconclusive' && w.message.includes('compliance'))).toBe(true);
  });

  it('estimateFlowDriven flags a CI spanning more than a factor of 10 as inconclusive', () => {
    // τ = 2 ± 0.45 s, dof = 2: t = 4.303 (NIST/SEMATECH e-Handbook §1.3.6.7.2 t table) → CI ≈ [0.064, 3.94] s, ratio ≈ 62
    const fit = makeFit({ yInf: 2000, terms: [{ tauS: 2, amplitude: -2000, tauSe: 0.45 }], dof: 2 });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    expect(out.complianceM3PerPa!.ci95[0]).toBeGreaterThan(0);
    expect(out.complianceM3PerPa?.inconclusive).toBe(true);
  });

  it('estimateFlowDriven uses the slowest term of a 2-term fit and says so', () => {
    // Derivation: slowest term τ = 2 s, Δp = 2000 Pa → R = 2e13, C = τ/R = 1e-13 (§4.1 τ = R·C); term 2 is the slow one.
    const fit = makeFit({ yInf: 2000, terms: [{ tauS: 0.05, amplitude: -100 }, { tauS: 2, amplitude: -1900 }] });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    expect(out.tauTermIndex).toBe(2);
    expect(out.complianceM3PerPa?.value).toBeCloseTo(C, 22);
    expect(out.notes.join(' ')).toMatch(/slowest/);
  });

  it('estimateFlowDriven warns when the pressure moves against the flow change', () => {
    // §4.2 [D]: a passive outlet has R = Δp/ΔQ > 0; here Δp = −2000 Pa for ΔQ = +Q0, so R would be negative.
    const fit = makeFit({ yInf: -2000, terms: [{ tauS: 2, amplitude: 2000 }] });
    const out = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: 0, flowAfterM3PerS: Q0 });
    expect(out.warnings.map((w) => w.code)).toContain('resistance-sign');
  });
});
