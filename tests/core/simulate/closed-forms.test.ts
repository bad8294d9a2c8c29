/**
 * simulate() against closed-form step responses. Every expected curve is written out here from
 * physics.md §4 (our reference sheet) or derived in a comment beside the check.
 */
import { describe, expect, it } from 'vitest';
import { simulate } from '../../../src/core/simulate/simulate';
import type { Network, Program } from '../../../src/core/simulate/types';

const emptyNet = (): Network => ({ nodes: [], resistors: [], flowSources: [], pressureSources: [], heads: [], ambientPressurePa: 101325 });
const step = (name: string, quantity: 'pressure' | 'flow', before: number, atS: number, after: number, rampS = 0): Program => ({
  channels: [{ name, quantity, points: [{ timeS: 0, valueSI: before, rampS: 0 }, { timeS: atS, valueSI: after, rampS }] }],
});

function maxRelErr(got: Float64Array, t: Float64Array, f: (t: number) => number, scale: number): number {
  let worst = 0;
  for (let i = 0; i < t.length; i++) worst = Math.max(worst, Math.abs((got[i] as number) - f(t[i] as number)) / scale);
  return worst;
}

describe('simulate (exact linear solver) against closed forms', () => {
  it('simulate(flow source → C → R → outlet) follows p = Q0·R·(1 − e^(−t/RC)) (physics.md §4.2)', () => {
    const R = 1.4e13;
    const C = 1.4e-13; // τ = 1.96 s, physics.md §6 example magnitudes
    const Q0 = 1.666667e-11; // 1 µL/min (physics.md §5)
    const net: Network = { ...emptyNet(), nodes: [{ id: 'n', complianceM3PerPa: C }], resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: R }], flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }] };
    const res = simulate(net, step('flow', 'flow', 0, 1, Q0), { sampleRateHz: 50, durationS: 15 });
    const tau = R * C;
    const p = (t: number): number => (t < 1 ? 0 : Q0 * R * (1 - Math.exp(-(t - 1) / tau)));
    expect(res.method).toBe('exact');
    expect(maxRelErr(res.nodePressurePa.n as Float64Array, res.timeS, p, Q0 * R)).toBeLessThan(1e-12);
    const qOut = (t: number): number => (t < 1 ? 0 : Q0 * (1 - Math.exp(-(t - 1) / tau)));
    expect(maxRelErr(res.resistorFlowM3PerS.r as Float64Array, res.timeS, qOut, Q0)).toBeLessThan(1e-12);
    // 95 % reached at 2.9957 τ after the step (physics.md §4.1).
    const i95 = Math.round((1 + 2.9957 * tau) * 50);
    expect((res.nodePressurePa.n as Float64Array)[i95]! / (Q0 * R)).toBeCloseTo(0.95, 3);
  });

  it('simulate(pressure source → R1 → C → R2) gives τ = 0.6667 s and the inlet-flow jump (physics.md §4.3)', () => {
    const R1 = 1e13;
    const R2 = 2e13;
    const C = 1e-13;
    const dp = 10_000;
    const net: Network = {
      ...emptyNet(),
      nodes: [{ id: 'n', complianceM3PerPa: C }],
      resistors: [{ id: 'r1', from: 'src', to: 'n', resistancePaSPerM3: R1 }, { id: 'r2', from: 'n', to: 'ground', resistancePaSPerM3: R2 }],
      pressureSources: [{ id: 'src', drive: 'pressure' }],
    };
    const res = simulate(net, step('pressure', 'pressure', 0, 0.5, dp), { sampleRateHz: 100, durationS: 6 });
    const tau = (C * R1 * R2) / (R1 + R2);
    expect(tau).toBeCloseTo(0.6667, 4); // physics.md §4.3 check value [N] (checks the test's own oracle, not the code)
    const s = (t: number): number => (t < 0.5 ? 0 : 1 - Math.exp(-(t - 0.5) / tau));
    expect(maxRelErr(res.nodePressurePa.n as Float64Array, res.timeS, (t) => ((dp * R2) / (R1 + R2)) * s(t), dp)).toBeLessThan(1e-12);
    const q2 = (t: number): number => (dp / (R1 + R2)) * s(t);
    expect(maxRelErr(res.resistorFlowM3PerS.r2 as Float64Array, res.timeS, q2, dp / R1)).toBeLessThan(1e-12);
    const q1 = (t: number): number => (t < 0.5 ? 0 : dp / (R1 + R2) + ((dp * R2) / (R1 * (R1 + R2))) * Math.exp(-(t - 0.5) / tau));
    expect(maxRelErr(res.resistorFlowM3PerS.r1 as Float64Array, res.timeS, q1, dp / R1)).toBeLessThan(1e-12);
    // At the step sample itself the inlet flow has jumped to dp/R1 (physics.md §4.3: "jumps to dp/R1 at t = 0+").
    expect((res.resistorFlowM3PerS.r1 as Float64Array)[50]).toBeCloseTo(dp / R1, 22);
  });

  it('simulate(two-node ladder) reproduces p2(t) = 5000 − 5904.59e^(−t/1.80656) + 904.59e^(−t/0.276768) Pa (physics.md §4.4)', () => {
    const net: Network = {
      ...emptyNet(),
      nodes: [{ id: 'n1', complianceM3PerPa: 1e-13 }, { id: 'n2', complianceM3PerPa: 5e-14 }],
      resistors: [
        { id: 'r1', from: 'src', to: 'n1', resistancePaSPerM3: 2e13 },
        { id: 'r2', from: 'n1', to: 'n2', resistancePaSPerM3: 1e13 },
        { id: 'r3', from: 'n2', to: 'ground', resistancePaSPerM3: 3e13 },
      ],
      pressureSources: [{ id: 'src', drive: 'pressure' }],
    };
    const res = simulate(net, step('pressure', 'pressure', 0, 0, 10_000), { sampleRateHz: 20, durationS: 45, initial: 'rest' });
    // physics.md §4.4 check curve; its coefficients have 6 significant digits, hence 1e-5 of 5000 Pa.
    const p2 = (t: number): number => 5000 - 5904.59 * Math.exp(-t / 1.80656) + 904.59 * Math.exp(-t / 0.276768);
    expect(maxRelErr(res.nodePressurePa.n2 as Float64Array, res.timeS, p2, 5000)).toBeLessThan(2e-6);
    const last = res.timeS.length - 1;
    expect((res.nodePressurePa.n1 as Float64Array)[last]).toBeCloseTo(6666.67, 1); // p1_inf (physics.md §4.4)
    expect((res.resistorFlowM3PerS.r3 as Float64Array)[last]! * 6e13).toBeCloseTo(10_000, 2); // Q = P0/(R1+R2+R3)
  });

  it('simulate(flow-source ladder, R2 = R3 = R, C1 = C2 = C) has τ = 2.618·RC and 0.382·RC (physics.md §4.4)', () => {
    const R = 1e13;
    const C = 1e-13;
    const Q0 = 1e-10;
    const net: Network = {
      ...emptyNet(),
      nodes: [{ id: 'n1', complianceM3PerPa: C }, { id: 'n2', complianceM3PerPa: C }],
      resistors: [{ id: 'r2', from: 'n1', to: 'n2', resistancePaSPerM3: R }, { id: 'r3', from: 'n2', to: 'ground', resistancePaSPerM3: R }],
      flowSources: [{ id: 'pump', into: 'n1', drive: 'flow' }],
    };
    const res = simulate(net, step('flow', 'flow', 0, 0, Q0), { sampleRateHz: 10, durationS: 20, initial: 'rest' });
    // λ = (−3 ± √5)/(2RC) (physics.md §4.4, flow-source version), node 2 from zero value and slope:
    // p2 = p2∞·[1 − (λ2·e^(λ1 t) − λ1·e^(λ2 t))/(λ2 − λ1)], p2∞ = Q0·R3.
    const l1 = (-3 + Math.sqrt(5)) / (2 * R * C);
    const l2 = (-3 - Math.sqrt(5)) / (2 * R * C);
    // Oracle self-check against the sheet's numbers (§4.4 [D]); the code is checked on p2 below.
    expect(-1 / l1 / (R * C)).toBeCloseTo(2.618, 3);
    expect(-1 / l2 / (R * C)).toBeCloseTo(0.382, 3);
    const p2 = (t: number): number => Q0 * R * (1 - (l2 * Math.exp(l1 * t) - l1 * Math.exp(l2 * t)) / (l2 - l1));
    expect(maxRelErr(res.nodePressurePa.n2 as Float64Array, res.timeS, p2, Q0 * R)).toBeLessThan(1e-12);
  });

  it('simulate(ramp of the pump flow) follows the first-order ramp response exactly', () => {
    // Derived here: C·p' = a·t − p/R, p(0) = 0 ⇒ p = a·R·(t − τ·(1 − e^(−t/τ))), τ = RC.
    const R = 2e13;
    const C = 5e-14;
    const Q1 = 2e-10;
    const rampS = 4;
    const a = Q1 / rampS;
    const net: Network = { ...emptyNet(), nodes: [{ id: 'n', complianceM3PerPa: C }], resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: R }], flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }] };
    const res = simulate(net, step('flow', 'flow', 0, 0, Q1, rampS), { sampleRateHz: 25, durationS: 4, initial: 'rest' });
    const tau = R * C;
    const p = (t: number): number => a * R * (t - tau * (1 - Math.exp(-t / tau)));
    expect(maxRelErr(res.nodePressurePa.n as Float64Array, res.timeS, p, Q1 * R)).toBeLessThan(1e-12);
    expect((res.setpoint.flow as Float64Array)[50]).toBeCloseTo(Q1 / 2, 22); // sample 50 at 25 Hz = 2 s, half of the 4 s linear ramp
  });

  it('simulate(pressure source with its own lag τs → R → C) gives the two-pole cascade response', () => {
    // Derived here: source y' = (ΔP − y)/τs, node p' = (y − p)/τ with τ = RC, both from 0:
    // p = ΔP·[1 − (τ·e^(−t/τ) − τs·e^(−t/τs))/(τ − τs)].
    const R = 1e13;
    const C = 1e-13;
    const tauS = 0.2;
    const dP = 20_000;
    const net: Network = { ...emptyNet(), nodes: [{ id: 'n', complianceM3PerPa: C }], resistors: [{ id: 'r', from: 'src', to: 'n', resistancePaSPerM3: R }], pressureSources: [{ id: 'src', drive: 'pressure', lagS: tauS }] };
    const res = simulate(net, step('pressure', 'pressure', 0, 0, dP), { sampleRateHz: 40, durationS: 8, initial: 'rest' });
    const tau = R * C;
    const p = (t: number): number => dP * (1 - (tau * Math.exp(-t / tau) - tauS * Math.exp(-t / tauS)) / (tau - tauS));
    expect(maxRelErr(res.nodePressurePa.n as Float64Array, res.timeS, p, dP)).toBeLessThan(1e-12);
    const y = (t: number): number => dP * (1 - Math.exp(-t / tauS));
    expect(maxRelErr(res.sourceOutput.src as Float64Array, res.timeS, y, dP)).toBeLessThan(1e-12);
  });

  it('simulate(hydrostatic head) settles at ρ·g·h divided by the resistances', () => {
    // ρ(20 °C) = 998.207 kg/m³ (physics.md §2.1), g = 9.80665 m/s² (standard gravity, CGPM 1901), h = 0.3 m;
    // divider: p_node = ρgh·R2/(R1 + R2).
    const head = 998.207 * 9.80665 * 0.3;
    const net: Network = {
      ...emptyNet(),
      nodes: [{ id: 'n', complianceM3PerPa: 1e-13 }],
      resistors: [{ id: 'r1', from: 'tank', to: 'n', resistancePaSPerM3: 1e13 }, { id: 'r2', from: 'n', to: 'ground', resistancePaSPerM3: 3e13 }],
      heads: [{ id: 'tank', heightM: 0.3, densityKgPerM3: 998.207 }],
    };
    const res = simulate(net, { channels: [] }, { sampleRateHz: 1, durationS: 60, initial: 'rest' });
    const last = res.timeS.length - 1;
    expect((res.nodePressurePa.n as Float64Array)[last]).toBeCloseTo(head * 0.75, 6);
    expect(head).toBeCloseTo(2936.7, 1); // arithmetic of the oracle only (998.207 × 9.80665 × 0.3 = 2936.75), not the code
  });

  it('simulate(probe with lag) is the sensor-side first-order filter of the node pressure', () => {
    // Same cascade as above with the lag on the observer: p_probe = p∞·[1 − (τ·e^(−t/τ) − τp·e^(−t/τp))/(τ − τp)].
    const R = 1e13;
    const C = 1e-13;
    const tauP = 0.05;
    const Q0 = 1e-10;
    const net: Network = { ...emptyNet(), nodes: [{ id: 'n', complianceM3PerPa: C }], resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: R }], flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }] };
    const res = simulate(net, step('flow', 'flow', 0, 0, Q0), { sampleRateHz: 100, durationS: 5, initial: 'rest', probes: [{ id: 'sensor', target: { kind: 'node', id: 'n' }, lagS: tauP }] });
    const tau = R * C;
    const p = (t: number): number => Q0 * R * (1 - (tau * Math.exp(-t / tau) - tauP * Math.exp(-t / tauP)) / (tau - tauP));
    expect(maxRelErr(res.probe.sensor as Float64Array, res.timeS, p, Q0 * R)).toBeLessThan(1e-12);
  });

  it('simulate(steady start) begins at the steady state of the first setpoint', () => {
    const net: Network = { ...emptyNet(), nodes: [{ id: 'n', complianceM3PerPa: 1e-13 }], resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: 1e13 }], flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }] };
    const res = simulate(net, step('flow', 'flow', 3e-10, 10, 3e-10), { timesS: new Float64Array([0, 0.37, 5]) });
    for (const v of res.nodePressurePa.n as Float64Array) expect(v).toBeCloseTo(3000, 8); // p = Q·R (physics.md §1.1)
  });
});
