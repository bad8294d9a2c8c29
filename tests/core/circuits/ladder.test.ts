import { describe, expect, it } from 'vitest';
import { estimateLadder, ladderTimeConstants } from '../../../src/core/circuits';
import { makeFit } from './fit-fixture';

/**
 * Independent solution of the two-node ladder in this test (physics.md §4.4): state matrix A,
 * eigen-decomposition of the 2×2 matrix by hand, p(t) = p∞ + Σ vᵢ·cᵢ·e^(λᵢt) with p(0) = 0.
 * Returns y∞ and the amplitudes of node 1 by τ ascending. Checked below against RK4 integration.
 */
function solveLadderNode1(r1: number, r2: number, r3: number, c1: number, c2: number, source: number) {
  const g1 = Number.isFinite(r1) ? 1 / r1 : 0;
  const [g2, g3] = [1 / r2, 1 / r3];
  const A = [
    [-(g1 + g2) / c1, g2 / c1],
    [g2 / c2, -(g2 + g3) / c2],
  ] as const;
  const b = [Number.isFinite(r1) ? (g1 * source) / c1 : source / c1, 0];
  // p∞ = −A⁻¹ b
  const det = A[0][0] * A[1][1] - A[0][1] * A[1][0];
  const pInf = [-(A[1][1] * b[0]! - A[0][1] * b[1]!) / det, -(-A[1][0] * b[0]! + A[0][0] * b[1]!) / det];
  const tr = A[0][0] + A[1][1];
  const disc = Math.sqrt(tr * tr - 4 * det);
  const lams = [(tr - disc) / 2, (tr + disc) / 2]; // fast (more negative) first
  // eigenvector for λ: (A01, λ − A00)
  const vecs = lams.map((l) => [A[0][1], l - A[0][0]]);
  // solve V c = p(0) − p∞ = −p∞
  const [v1, v2] = vecs as [number[], number[]];
  const dv = v1[0]! * v2[1]! - v2[0]! * v1[1]!;
  const c = [(-pInf[0]! * v2[1]! + pInf[1]! * v2[0]!) / dv, (-v1[0]! * pInf[1]! + v1[1]! * pInf[0]!) / dv];
  return {
    pInf,
    taus: lams.map((l) => -1 / l),
    node1Amplitudes: [c[0]! * v1[0]!, c[1]! * v2[0]!],
    node2Amplitudes: [c[0]! * v1[1]!, c[1]! * v2[1]!],
    A,
    b,
  };
}

/** Classic RK4 integration of dp/dt = A p + b from p = 0 (independent numerical check). */
function rk4(A: readonly (readonly number[])[], b: number[], tEnd: number, steps: number): number[] {
  let p = [0, 0];
  const f = (q: number[]) => [A[0]![0]! * q[0]! + A[0]![1]! * q[1]! + b[0]!, A[1]![0]! * q[0]! + A[1]![1]! * q[1]! + b[1]!];
  const h = tEnd / steps;
  for (let i = 0; i < steps; i++) {
    const k1 = f(p);
    const k2 = f(p.map((v, j) => v + (h / 2) * k1[j]!));
    const k3 = f(p.map((v, j) => v + (h / 2) * k2[j]!));
    const k4 = f(p.map((v, j) => v + h * k3[j]!));
    p = p.map((v, j) => v + (h / 6) * (k1[j]! + 2 * k2[j]! + 2 * k3[j]! + k4[j]!));
  }
  return p;
}

describe('ladderTimeConstants', () => {
  it('ladderTimeConstants gives 1.80656 s and 0.276768 s for the §4.4 check circuit', () => {
    // physics.md §4.4 [N]: R1 = 2e13, R2 = 1e13, R3 = 3e13, C1 = 1e-13, C2 = 5e-14
    const t = ladderTimeConstants({ r1PaSPerM3: 2e13, r2PaSPerM3: 1e13, r3PaSPerM3: 3e13, c1M3PerPa: 1e-13, c2M3PerPa: 5e-14 });
    expect(t.slowS).toBeCloseTo(1.80656, 5);
    expect(t.fastS).toBeCloseTo(0.276768, 6);
  });

  it('ladderTimeConstants gives RC and RC/3 for equal R and C with a pressure source (§4.4)', () => {
    // physics.md §4.4 check value [N]: R1 = R2 = R3 = R, C1 = C2 = C → τ = RC and RC/3; here RC = 1 s.
    const t = ladderTimeConstants({ r1PaSPerM3: 1e13, r2PaSPerM3: 1e13, r3PaSPerM3: 1e13, c1M3PerPa: 1e-13, c2M3PerPa: 1e-13 });
    expect(t.slowS).toBeCloseTo(1, 12);
    expect(t.fastS).toBeCloseTo(1 / 3, 12);
  });

  it('ladderTimeConstants gives 2.618 RC and 0.382 RC for the flow-source ladder (§4.4)', () => {
    const t = ladderTimeConstants({ r1PaSPerM3: Infinity, r2PaSPerM3: 1e13, r3PaSPerM3: 1e13, c1M3PerPa: 1e-13, c2M3PerPa: 1e-13 });
    // λ = (−3 ± √5)/(2RC) → τ = 2/(3 ∓ √5)·RC (§4.4 [D])
    expect(t.slowS).toBeCloseTo(2 / (3 - Math.sqrt(5)), 12);
    expect(t.slowS).toBeCloseTo(2.618, 3);
    expect(t.fastS).toBeCloseTo(0.382, 3);
  });
});

describe('estimateLadder', () => {
  it("the test's own eigen-solution reproduces the §4.4 p2(t) check formula and RK4 integration", () => {
    const s = solveLadderNode1(2e13, 1e13, 3e13, 1e-13, 5e-14, 10000);
    // §4.4 [N]: p2(t) = 5000 − 5904.59 e^(−t/1.80656) + 904.59 e^(−t/0.276768) Pa; p1∞ = 6666.67 Pa
    expect(s.pInf[0]).toBeCloseTo(6666.67, 2);
    expect(s.pInf[1]).toBeCloseTo(5000, 6);
    expect(s.node2Amplitudes[1]).toBeCloseTo(-5904.59, 2);
    expect(s.node2Amplitudes[0]).toBeCloseTo(904.59, 2);
    const at1 = rk4(s.A, s.b, 1, 20000);
    const model = s.pInf[0]! + s.node1Amplitudes[0]! * Math.exp(-1 / s.taus[0]!) + s.node1Amplitudes[1]! * Math.exp(-1 / s.taus[1]!);
    expect(at1[0]! / model).toBeCloseTo(1, 9);
  });

  it('estimateLadder recovers C1, C2, R2, R3 of a flow-driven ladder from the node-1 response alone', () => {
    const [r2, r3, c1, c2, q0] = [1e13, 3e13, 1e-13, 5e-14, 1e-10];
    const s = solveLadderNode1(Infinity, r2, r3, c1, c2, q0);
    expect(s.pInf[0]).toBeCloseTo(q0 * (r2 + r3), 6); // §4.4: p1∞ = Q0 (R2 + R3)
    const fit = makeFit({
      yInf: s.pInf[0]!,
      terms: [
        { tauS: s.taus[0]!, amplitude: s.node1Amplitudes[0]! },
        { tauS: s.taus[1]!, amplitude: s.node1Amplitudes[1]! },
      ],
    });
    const out = estimateLadder({ pressureFit: fit, drive: { kind: 'flow', flowBeforeM3PerS: 0, flowAfterM3PerS: q0 } });
    // Expected: the circuit constants the fit was built from by the test's own eigen-solution (checked against RK4 above).
    expect(out.node1ComplianceM3PerPa.value / c1).toBeCloseTo(1, 9);
    expect(out.node2ComplianceM3PerPa.value / c2).toBeCloseTo(1, 9);
    expect(out.resistanceBetweenNodesPaSPerM3.value / r2).toBeCloseTo(1, 9);
    expect(out.outletResistancePaSPerM3.value / r3).toBeCloseTo(1, 9);
    expect(out.warnings.map((w) => w.code)).not.toContain('ladder-inconsistent');
  });

  it('estimateLadder recovers the §4.4 check circuit from node 1 with the upstream R1 known', () => {
    const s = solveLadderNode1(2e13, 1e13, 3e13, 1e-13, 5e-14, 10000);
    const fit = makeFit({
      yInf: s.pInf[0]!,
      terms: [
        { tauS: s.taus[0]!, amplitude: s.node1Amplitudes[0]! },
        { tauS: s.taus[1]!, amplitude: s.node1Amplitudes[1]! },
      ],
    });
    const out = estimateLadder({
      pressureFit: fit,
      drive: { kind: 'pressure', pressureBeforePa: 0, pressureAfterPa: 10000, upstreamResistance: { value: 2e13 } },
    });
    // Expected: the §4.4 check circuit (R2 = 1e13, R3 = 3e13, C1 = 1e-13, C2 = 5e-14) and its slow τ 1.80656 s [N].
    expect(out.node1ComplianceM3PerPa.value / 1e-13).toBeCloseTo(1, 9);
    expect(out.node2ComplianceM3PerPa.value / 5e-14).toBeCloseTo(1, 9);
    expect(out.resistanceBetweenNodesPaSPerM3.value / 1e13).toBeCloseTo(1, 9);
    expect(out.outletResistancePaSPerM3.value / 3e13).toBeCloseTo(1, 9);
    expect(out.tauS.value).toBeCloseTo(1.80656, 5);
  });

  it('estimateLadder gives CIs that widen with the SEs of the fitted amplitudes', () => {
    const s = solveLadderNode1(Infinity, 1e13, 1e13, 1e-13, 1e-13, 1e-10);
    const fit = makeFit({
      yInf: s.pInf[0]!,
      yInfSe: 2,
      terms: [
        { tauS: s.taus[0]!, amplitude: s.node1Amplitudes[0]!, tauSe: 0.01, amplitudeSe: 5 },
        { tauS: s.taus[1]!, amplitude: s.node1Amplitudes[1]!, tauSe: 0.02, amplitudeSe: 5 },
      ],
    });
    const out = estimateLadder({ pressureFit: fit, drive: { kind: 'flow', flowBeforeM3PerS: 0, flowAfterM3PerS: 1e-10 } });
    for (const e of [out.node1ComplianceM3PerPa, out.node2ComplianceM3PerPa, out.resistanceBetweenNodesPaSPerM3, out.outletResistancePaSPerM3]) {
      expect(e.standardError).toBeGreaterThan(0);
      expect(e.ci95[0]).toBeLessThan(e.value);
      expect(e.ci95[1]).toBeGreaterThan(e.value);
    }
  });

  it('estimateLadder refuses a 1-term fit', () => {
    // physics.md §4.4 [D]: two compliant nodes give two time constants, so one term cannot identify four unknowns.
    const fit = makeFit({ yInf: 1, terms: [{ tauS: 1, amplitude: -1 }] });
    expect(() => estimateLadder({ pressureFit: fit, drive: { kind: 'flow', flowBeforeM3PerS: 0, flowAfterM3PerS: 1 } })).toThrow(/2-term/);
  });
});
