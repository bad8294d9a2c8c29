import { describe, expect, it } from 'vitest';
import { estimatePressureDriven, monteCarloPropagate, parameterSetFromFit, withIndependent } from '../../../src/core/circuits';
import { makeFit } from './fit-fixture';

// Circuit and check values of physics.md §4.3: R1 = 1e13, R2 = 2e13 Pa·s/m³, C = 1e-13 m³/Pa → τ = 0.6667 s.
const R1 = 1e13;
const R2 = 2e13;
const C = 1e-13;
const DP = 3000; // Pa step of the regulator
const TAU = (C * R1 * R2) / (R1 + R2); // §4.3: τ = C·R1·R2/(R1 + R2)

describe('estimatePressureDriven', () => {
  it('the §4.3 circuit has τ = 0.6667 s (physics.md §4.3 check value)', () => {
    // physics.md §4.3 [N]. Checks the test's own circuit constants against the sheet, not the code under test.
    expect(TAU).toBeCloseTo(0.6667, 4);
  });

  it('estimatePressureDriven with an outlet sensor and a given R_up recovers R_total and C (§4.3)', () => {
    // Outlet flow Q2(t) = Δp/(R1 + R2)·(1 − e^(−t/τ)) (§4.3)
    const qInf = DP / (R1 + R2);
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: TAU, amplitude: -qInf }] });
    const out = estimatePressureDriven({
      flowFit: fit,
      sensor: 'outlet',
      pressureBeforePa: 0,
      pressureAfterPa: DP,
      upstreamResistance: { value: R1 },
    });
    // Expected: the §4.3 circuit constants the exact fit was built from (R_total = Δp/Q2(∞), C = τ(R1+R2)/(R1R2)).
    expect(out.resistancePaSPerM3!.value / (R1 + R2)).toBeCloseTo(1, 12);
    expect(out.downstreamResistancePaSPerM3!.value / R2).toBeCloseTo(1, 12);
    expect(out.complianceM3PerPa!.value / C).toBeCloseTo(1, 12);
    expect(out.upstreamResistanceSource).toBe('given');
  });

  it('estimatePressureDriven without R_up gives no C but the bound C ≥ 4τ/R_total, and says why', () => {
    const qInf = DP / (R1 + R2);
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: TAU, amplitude: -qInf }] });
    const out = estimatePressureDriven({ flowFit: fit, sensor: 'outlet', pressureBeforePa: 0, pressureAfterPa: DP });
    expect(out.complianceM3PerPa).toBeNull();
    // Derivation: R_th = R1R2/(R1+R2) ≤ (R1+R2)/4, so C = τ/R_th ≥ 4τ/R_total = 8.889e-14 here.
    expect(out.complianceLowerBoundM3PerPa!).toBeCloseTo((4 * TAU) / (R1 + R2), 25);
    expect(out.complianceLowerBoundM3PerPa!).toBeLessThanOrEqual(C);
    expect(out.warnings.map((w) => w.code)).toContain('upstream-resistance-unknown');
  });

  it('estimatePressureDriven with an inlet sensor finds R_up from the jump Δp/R1 and C from the decay (§4.3)', () => {
    // Inlet flow Q1(t) = Δp/(R1+R2) + Δp·R2/(R1(R1+R2))·e^(−t/τ); jumps to Δp/R1 at 0⁺ (§4.3)
    const qBefore = 1000 / (R1 + R2); // steady flow at the previous level of 1000 Pa
    const qInf = (1000 + DP) / (R1 + R2);
    const a = (DP * R2) / (R1 * (R1 + R2));
    expect(qInf + a - qBefore).toBeCloseTo(DP / R1, 20);
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: TAU, amplitude: a }] });
    const out = estimatePressureDriven({
      flowFit: fit,
      sensor: 'inlet',
      pressureBeforePa: 1000,
      pressureAfterPa: 1000 + DP,
      flowBefore: { value: qBefore },
    });
    // §4.3 fit recipe [D]: R1 = Δp/Q1(0⁺ jump), R1 + R2 = Δp/ΔQ(∞), C = τ(R1 + R2)/(R1 R2).
    expect(out.upstreamResistancePaSPerM3!.value / R1).toBeCloseTo(1, 10);
    expect(out.downstreamResistancePaSPerM3!.value / R2).toBeCloseTo(1, 10);
    expect(out.resistancePaSPerM3!.value / (R1 + R2)).toBeCloseTo(1, 10);
    expect(out.complianceM3PerPa!.value / C).toBeCloseTo(1, 10);
    expect(out.setup).toBe('pressure-driven-inlet-flow');
  });

  it('estimatePressureDriven takes the slow term of a 2-term fit as the chip and the fast one as source lag', () => {
    // Regulator lag τ_s = 0.02 s filters the drive: the inlet flow rises with τ_s, then decays with τ.
    // For τ_s ≪ τ the slow term's extrapolated jump is still Δp/R1 (first-order separation, derivation:
    // the slow residue of H(s)/(1 + sτ_s) is the one of H(s) times 1/(1 − τ_s/τ)); here we give the ideal values.
    const qInf = DP / (R1 + R2);
    const a = (DP * R2) / (R1 * (R1 + R2));
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: 0.02, amplitude: -(qInf + a) }, { tauS: TAU, amplitude: a }] });
    const out = estimatePressureDriven({ flowFit: fit, sensor: 'inlet', pressureBeforePa: 0, pressureAfterPa: DP, flowBefore: { value: 0 } });
    expect(out.tauTermIndex).toBe(2);
    expect(out.complianceM3PerPa!.value / C).toBeCloseTo(1, 10);
    expect(out.notes.join(' ')).toMatch(/source lag/);
  });

  it('estimatePressureDriven refuses an inlet sensor without the pre-step flow', () => {
    // §4.3 [D]: R1 = Δp/Q1(0⁺) needs the flow before the step; without it the jump is unknown.
    const fit = makeFit({ yInf: 1e-10, terms: [{ tauS: TAU, amplitude: 2e-10 }] });
    expect(() => estimatePressureDriven({ flowFit: fit, sensor: 'inlet', pressureBeforePa: 0, pressureAfterPa: DP })).toThrow(
      /flow before the step/,
    );
  });

  it('estimatePressureDriven warns when the given R_up is not below R_total', () => {
    const qInf = DP / (R1 + R2);
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: TAU, amplitude: -qInf }] });
    const out = estimatePressureDriven({
      flowFit: fit,
      sensor: 'outlet',
      pressureBeforePa: 0,
      pressureAfterPa: DP,
      upstreamResistance: { value: 4e13 },
    });
    // §4.3 [D]: R2 = R_total − R1 must be positive; 4e13 > R_total = 3e13 leaves no C.
    expect(out.complianceM3PerPa).toBeNull();
    expect(out.warnings.map((w) => w.code)).toContain('upstream-exceeds-total');
  });

  it('estimatePressureDriven propagates the σ of a given R_up into C', () => {
    const qInf = DP / (R1 + R2);
    const fit = makeFit({ yInf: qInf, terms: [{ tauS: TAU, amplitude: -qInf }] });
    const base = { flowFit: fit, sensor: 'outlet' as const, pressureBeforePa: 0, pressureAfterPa: DP };
    const exact = estimatePressureDriven({ ...base, upstreamResistance: { value: R1 } });
    const uncertain = estimatePressureDriven({ ...base, upstreamResistance: { value: R1, standardError: 0.1 * R1 } });
    expect(exact.complianceM3PerPa!.standardError).toBe(0); // the exact fixture has zero SEs everywhere
    // Derivation: C = τ·Rt/(Ru·(Rt − Ru)); ∂ln C/∂ln Ru = −1 + Ru/(Rt − Ru) = −1 + 0.5 = −0.5 → σ_C/C = 0.05
    expect(uncertain.complianceM3PerPa!.standardError / C).toBeCloseTo(0.05, 6);
  });

  it('estimatePressureDriven delta-method SE of C (inlet) agrees with a seeded Monte Carlo (JCGM 101 cross-check)', () => {
    const qBefore = 0;
    const qInf = DP / (R1 + R2);
    const a = (DP * R2) / (R1 * (R1 + R2));
    const fit = makeFit({
      yInf: qInf,
      yInfSe: 0.005 * qInf,
      terms: [{ tauS: TAU, amplitude: a, tauSe: 0.01 * TAU, amplitudeSe: 0.01 * a }],
      correlations: { 'yInf|a1': -0.4, 'a1|tau1_s': 0.3 },
    });
    const baseSe = 0.002 * qInf;
    const out = estimatePressureDriven({ flowFit: fit, sensor: 'inlet', pressureBeforePa: 0, pressureAfterPa: DP, flowBefore: { value: qBefore, standardError: baseSe } });
    const set = withIndependent(parameterSetFromFit(fit).set, 'baseline', qBefore, baseSe);
    // C = τ·Rt/(Ru·(Rt − Ru)) with Rt = Δp/(y∞ − b), Ru = Δp/(y∞ + a − b) (§4.3 recipe)
    const mc = monteCarloPropagate(
      set,
      (p) => {
        const rt = DP / (p('yInf') - p('baseline'));
        const ru = DP / (p('yInf') + p('a1') - p('baseline'));
        return (p('tau1_s') * rt) / (ru * (rt - ru));
      },
      { samples: 40000, seed: 11 },
    );
    const ratio = mc.standardDeviation / out.complianceM3PerPa!.standardError;
    // ±5 %: common practice, no source (Monte Carlo SD of 40 000 samples is itself good to ~0.4 %).
    expect(ratio).toBeGreaterThan(0.95);
    expect(ratio).toBeLessThan(1.05);
    expect(mc.median / out.complianceM3PerPa!.value).toBeCloseTo(1, 2);
  });
});
