/**
 * The Rosenbrock integrator on gas-compliance networks, checked against (a) a high-accuracy
 * reference computed here by a different, general-purpose method — the classical fourth-order
 * Runge–Kutta scheme (Kutta 1901; e.g. Hairer, Nørsett & Wanner, Solving ODEs I, §II.1) with a
 * fixed step far below the time constants — on equations written out independently in this file,
 * and (b) the exact linear solution in the small-signal limit.
 */
import { describe, expect, it } from 'vitest';
import { simulate } from '../../../src/core/simulate/simulate';
import type { Network, Program } from '../../../src/core/simulate/types';

const P_ATM = 101325;

/** Classical RK4 with a fixed step, sampling y at the given times (which must be multiples of dt). */
function rk4(f: (t: number, y: number[]) => number[], y0: number[], dt: number, sampleTimes: number[]): number[][] {
  const out: number[][] = [];
  let y = [...y0];
  let step = 0;
  for (const ts of sampleTimes) {
    const n = Math.round(ts / dt) - step;
    for (let i = 0; i < n; i++) {
      // Time from the step count, rounded to 1e-12 s, so program breakpoints fall exactly on the grid.
      const t = Math.round(step * dt * 1e12) / 1e12;
      const k1 = f(t, y);
      const k2 = f(t + dt / 2, y.map((v, j) => v + (dt / 2) * k1[j]!));
      const k3 = f(t + dt / 2, y.map((v, j) => v + (dt / 2) * k2[j]!));
      // Last stage just inside the step, so a drive that jumps at t + dt is not felt one step early.
      const k4 = f(t + dt * (1 - 1e-9), y.map((v, j) => v + dt * k3[j]!));
      y = y.map((v, j) => v + (dt / 6) * (k1[j]! + 2 * k2[j]! + 2 * k3[j]! + k4[j]!));
      step++;
    }
    out.push([...y]);
  }
  return out;
}

/** Isothermal gas compliance V·p_atm/p_abs² (physics.md §3.3, C = V/p with V = V_atm·p_atm/p). */
const gasC = (vAtm: number, p: number): number => (vAtm * P_ATM) / (P_ATM + p) ** 2;

describe('simulate (Rosenbrock integrator) on trapped-gas networks', () => {
  it('simulate(pump → bubble node → R) matches an RK4 reference at half an atmosphere', () => {
    const R = 1e13;
    const vAtm = 1e-8; // 10 µL of air at 1 atm
    const cLin = 2e-14;
    const Q0 = 5e-9; // Q0·R = 50 kPa: strongly nonlinear
    const net: Network = {
      nodes: [{ id: 'n', complianceM3PerPa: cLin, gasVolumeAtAtmM3: vAtm }],
      resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: R }],
      flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }],
      pressureSources: [],
      heads: [],
      ambientPressurePa: P_ATM,
    };
    const program: Program = { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 0, rampS: 0 }, { timeS: 2, valueSI: Q0, rampS: 0 }, { timeS: 8, valueSI: Q0 / 4, rampS: 1 }] }] };
    const times = Array.from({ length: 61 }, (_, i) => i * 0.25);
    const res = simulate(net, program, { timesS: Float64Array.from(times) });
    expect(res.method).toBe('nonlinear');
    // Independent equations: C(p)·dp/dt = Q(t) − p/R, with Q(t) the program written out by hand.
    const q = (t: number): number => (t < 2 ? 0 : t < 8 ? Q0 : t < 9 ? Q0 + (Q0 / 4 - Q0) * (t - 8) : Q0 / 4);
    const ref = rk4((t, [p]) => [(q(t) - p! / R) / (cLin + gasC(vAtm, p!))], [0], 1e-4, times);
    const got = res.nodePressurePa.n as Float64Array;
    let worst = 0;
    ref.forEach((y, i) => (worst = Math.max(worst, Math.abs(got[i]! - y[0]!))));
    expect(worst / (Q0 * R)).toBeLessThan(1e-5);
    // The gas really matters here: the linear model with C at 1 atm would be far off mid-transient.
    expect(Math.abs(got[12]! - ref[12]![0]!)).toBeLessThan(1);
  });

  it('simulate(pressure source → R1 → bubble → R2 → node with linear C → R3) matches RK4 on two states', () => {
    const [R1, R2, R3] = [1e13, 2e13, 1e13];
    const vAtm = 5e-9;
    const c2 = 3e-14;
    const P0 = 80_000;
    const net: Network = {
      nodes: [{ id: 'b', complianceM3PerPa: 1e-15, gasVolumeAtAtmM3: vAtm }, { id: 'm', complianceM3PerPa: c2 }],
      resistors: [
        { id: 'r1', from: 'src', to: 'b', resistancePaSPerM3: R1 },
        { id: 'r2', from: 'b', to: 'm', resistancePaSPerM3: R2 },
        { id: 'r3', from: 'm', to: 'ground', resistancePaSPerM3: R3 },
      ],
      flowSources: [],
      pressureSources: [{ id: 'src', drive: 'p' }],
      heads: [],
      ambientPressurePa: P_ATM,
    };
    const program: Program = { channels: [{ name: 'p', quantity: 'pressure', points: [{ timeS: 0, valueSI: P0, rampS: 0 }] }] };
    const times = Array.from({ length: 41 }, (_, i) => i * 0.1);
    const res = simulate(net, program, { timesS: Float64Array.from(times), initial: 'rest' });
    const ref = rk4(
      (_t, [pb, pm]) => [
        ((P0 - pb!) / R1 - (pb! - pm!) / R2) / (1e-15 + gasC(vAtm, pb!)),
        ((pb! - pm!) / R2 - pm! / R3) / c2,
      ],
      [0, 0],
      2e-5,
      times,
    );
    let worst = 0;
    ref.forEach((y, i) => {
      worst = Math.max(worst, Math.abs(res.nodePressurePa.b![i]! - y[0]!), Math.abs(res.nodePressurePa.m![i]! - y[1]!));
    });
    expect(worst / P0).toBeLessThan(1e-5);
  });

  it('simulate(nonlinear) agrees with the exact linear solution in the small-signal limit', () => {
    // For Δp ≪ p_atm the gas compliance is V/p_atm (physics.md §3.3); the difference is O(Δp/p_atm).
    const vAtm = 1e-8;
    const R = 1e13;
    const Q0 = 1e-13; // Q0·R = 1 Pa ≪ 101325 Pa
    const base = { resistors: [{ id: 'r', from: 'n', to: 'ground', resistancePaSPerM3: R }], flowSources: [{ id: 'pump', into: 'n', drive: 'flow' }], pressureSources: [], heads: [], ambientPressurePa: P_ATM };
    const program: Program = { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 0, rampS: 0 }, { timeS: 1, valueSI: Q0, rampS: 0 }] }] };
    const gas = simulate({ ...base, nodes: [{ id: 'n', complianceM3PerPa: 0, gasVolumeAtAtmM3: vAtm }] }, program, { sampleRateHz: 10, durationS: 6 });
    const lin = simulate({ ...base, nodes: [{ id: 'n', complianceM3PerPa: vAtm / P_ATM }] }, program, { sampleRateHz: 10, durationS: 6 });
    expect(lin.method).toBe('exact');
    let worst = 0;
    for (let i = 0; i < gas.timeS.length; i++) worst = Math.max(worst, Math.abs(gas.nodePressurePa.n![i]! - lin.nodePressurePa.n![i]!));
    expect(worst / (Q0 * R)).toBeLessThan(1e-4);
  });

  it("simulate(method 'nonlinear') on a linear network reproduces the exact solver", () => {
    const net: Network = {
      nodes: [{ id: 'n1', complianceM3PerPa: 1e-13 }, { id: 'n2', complianceM3PerPa: 5e-14 }],
      resistors: [
        { id: 'r1', from: 'src', to: 'n1', resistancePaSPerM3: 2e13 },
        { id: 'r2', from: 'n1', to: 'n2', resistancePaSPerM3: 1e13 },
        { id: 'r3', from: 'n2', to: 'ground', resistancePaSPerM3: 3e13 },
      ],
      flowSources: [],
      pressureSources: [{ id: 'src', drive: 'pressure' }],
      heads: [],
      ambientPressurePa: P_ATM,
    };
    const program: Program = { channels: [{ name: 'pressure', quantity: 'pressure', points: [{ timeS: 0, valueSI: 0, rampS: 0 }, { timeS: 0.5, valueSI: 10_000, rampS: 0 }] }] };
    const opts = { sampleRateHz: 20, durationS: 10 };
    const a = simulate(net, program, { ...opts, method: 'exact' });
    const b = simulate(net, program, { ...opts, method: 'nonlinear' });
    // physics.md §4.4 closed form shifted by the 0.5 s onset.
    const p2 = (t: number): number => (t < 0.5 ? 0 : 5000 - 5904.59 * Math.exp(-(t - 0.5) / 1.80656) + 904.59 * Math.exp(-(t - 0.5) / 0.276768));
    for (let i = 0; i < a.timeS.length; i++) {
      expect(Math.abs(b.nodePressurePa.n2![i]! - p2(a.timeS[i]!))).toBeLessThan(0.05);
      expect(Math.abs(b.nodePressurePa.n2![i]! - a.nodePressurePa.n2![i]!)).toBeLessThan(0.01);
    }
    expect(b.stats.acceptedSteps).toBeGreaterThan(0);
  });
});
