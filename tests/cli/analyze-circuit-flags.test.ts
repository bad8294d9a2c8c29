/**
 * `lagbench analyze --flow-sensor` and `--circuit` in process, on logs written here from closed forms:
 * - pressure-driven, flow sensed at the inlet (physics.md §4.3): after a pressure step Δp the inlet flow
 *   jumps to Δp/R1 and decays to Δp/(R1 + R2): Q₁(t) = Δp/(R1+R2) + Δp·(1/R1 − 1/(R1+R2))·e^(−t/τ),
 *   τ = C·R1·R2/(R1 + R2) (node balance C·dp/dt = (P − p)/R1 − p/R2, derivation);
 * - flow-driven two-node ladder (physics.md §4.4): pump → C1 → R2 → C2 → R3 → outlet; node-1 pressure
 *   p₁(t) = K·ΔQ·[1 − Σ (τᵢ − τz)/(τᵢ − τⱼ)·e^(−t/τᵢ)] with K = R2 + R3, τz = R2R3C2/(R2 + R3) and τ₁, τ₂
 *   the roots of τ² − b₁τ + b₂ = 0, b₁ = C1(R2 + R3) + R3C2, b₂ = C1C2R2R3 (partial fractions of
 *   P₁(s)/ΔQ = K(1 + sτz)/(1 + sb₁ + s²b₂), derived from Kirchhoff's laws).
 * Units: 1 mbar = 100 Pa, 1 µL/min = 1.666667e-11 m³/s (physics.md §5).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main';
import type { AnalysisWithPhysicsJson } from '../../src/core/analyze/physics';
import { createRng } from '../../src/core/stats';
import { captureIo } from '../helpers/cli-io';

const UL_MIN = 1e-9 / 60;
// Pressure-driven inlet-sensor circuit.
const [R1, R2, C] = [1e13, 2e13, 1e-13];
const TAU = (C * R1 * R2) / (R1 + R2);
// Ladder.
const [LR2, LR3, LC1, LC2] = [2e13, 4e13, 5e-14, 2e-13];
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-circuit-'));
  const rng = createRng(77);
  const times = [0, 8, 16, 24];
  const levelsMbar = [0, 30, 60, 20];
  const inlet = ['# invented demo data: pressure-driven bench, inlet flow sensor', 'Time [s],Pressure setpoint [mbar],Flow [uL/min]'];
  for (let i = 0; i < 32 * 50; i++) {
    const t = i / 50;
    let level = 0;
    let q = 0;
    for (let k = 0; k < times.length; k++) {
      if (t >= times[k]!) {
        level = levelsMbar[k]!;
        if (k > 0) {
          const dp = (levelsMbar[k]! - levelsMbar[k - 1]!) * 100;
          q += dp / (R1 + R2) + dp * (1 / R1 - 1 / (R1 + R2)) * Math.exp(-(t - times[k]!) / TAU);
        }
      }
    }
    inlet.push(`${t.toFixed(2)},${level},${(q / UL_MIN + 0.01 * rng.normal()).toFixed(5)}`);
  }
  writeFileSync(join(dir, 'inlet.csv'), `${inlet.join('\n')}\n`);

  const b1 = LC1 * (LR2 + LR3) + LR3 * LC2;
  const b2 = LC1 * LC2 * LR2 * LR3;
  const disc = Math.sqrt(b1 * b1 - 4 * b2);
  const taus = [(b1 + disc) / 2, (b1 - disc) / 2];
  const tauZ = (LR2 * LR3 * LC2) / (LR2 + LR3);
  const K = LR2 + LR3;
  const coef = [-(taus[0]! - tauZ) / (taus[0]! - taus[1]!), -(taus[1]! - tauZ) / (taus[1]! - taus[0]!)];
  const stepTimes = [0, 10, 130, 250]; // 120 s windows: 11.7 slow τ, the previous plateau settled to 1e-5
  const flowsUlMin = [0, 5, 10, 3];
  const ladder = ['# invented demo data: syringe pump into two compliant chambers', 'Time [s],Flow setpoint [uL/min],Pressure [mbar]'];
  for (let i = 0; i < 370 * 20; i++) {
    const t = i / 20;
    let q = 0;
    let p = 0;
    for (let k = 0; k < stepTimes.length; k++) {
      if (t < stepTimes[k]!) continue;
      q = flowsUlMin[k]!;
      if (k === 0) continue;
      const dq = (flowsUlMin[k]! - flowsUlMin[k - 1]!) * UL_MIN;
      const s = t - stepTimes[k]!;
      p += K * dq * (1 + coef[0]! * Math.exp(-s / taus[0]!) + coef[1]! * Math.exp(-s / taus[1]!));
    }
    ladder.push(`${t.toFixed(2)},${q},${(p / 100 + 0.2 * rng.normal()).toFixed(5)}`);
  }
  writeFileSync(join(dir, 'ladder.csv'), `${ladder.join('\n')}\n`);
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function analyze(args: string[]): Promise<AnalysisWithPhysicsJson> {
  const io = captureIo(dir);
  const rc = await runCli(['analyze', ...args, '--json'], io);
  expect(rc, io.stderrText()).toBe(0);
  return JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
}

describe('lagbench analyze --flow-sensor', () => {
  it('analyze --flow-sensor inlet reads an inlet log as inlet and gives C with a CI containing the true 1e-13 m³/Pa', async () => {
    const a = await analyze(['inlet.csv', '--setup', 'pressure-driven', '--terms', '1', '--flow-sensor', 'inlet']);
    expect(a.steps).toHaveLength(3);
    let covered = 0;
    for (const s of a.steps) {
      expect(s.physics.flow_sensor).toBe('inlet');
      expect(s.physics.flow_sensor_from).toBe('given');
      if (s.compliance_ci95[0]! < C && C < s.compliance_ci95[1]!) covered++;
      // R_total = R1 + R2 = Δp/ΔQ∞ (§4.3)
      expect(s.resistance_ci95[0]!).toBeLessThan(1.02 * (R1 + R2));
      expect(s.resistance_ci95[1]!).toBeGreaterThan(0.98 * (R1 + R2));
    }
    expect(covered).toBeGreaterThanOrEqual(2);
  });

  it('analyze --flow-sensor outlet overrides the shape-based guess; auto keeps it', async () => {
    const auto = await analyze(['inlet.csv', '--setup', 'pressure-driven', '--terms', '1']);
    expect(auto.steps.map((s) => s.physics.flow_sensor)).toEqual(['inlet', 'inlet', 'inlet']);
    expect(String(auto.steps[0]!.physics.flow_sensor_from)).toMatch(/shape/);
    const forced = await analyze(['inlet.csv', '--setup', 'pressure-driven', '--terms', '1', '--flow-sensor', 'outlet']);
    expect(forced.steps.map((s) => s.physics.flow_sensor)).toEqual(['outlet', 'outlet', 'outlet']);
    // An outlet reading needs R_up for C: none given, so no C (the wrong side is not silently "fixed").
    expect(forced.steps.every((s) => s.compliance_m3_per_Pa === null)).toBe(true);
  });

  it('analyze --flow-sensor sideways exits 2 naming the choices', async () => {
    const io = captureIo(dir);
    expect(await runCli(['analyze', 'inlet.csv', '--flow-sensor', 'sideways'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/inlet, outlet or auto/);
  });
});

describe('lagbench analyze --circuit', () => {
  it('analyze --circuit ladder reports C1 + C2, R_a + R_b, C1, C2, R_a, R_b with 95 % CIs covering the true values', async () => {
    const a = await analyze(['ladder.csv', '--circuit', 'ladder']);
    expect(a.steps).toHaveLength(3);
    let checks = 0;
    let covered = 0;
    const check = (ci: [number | null, number | null], truth: number): void => {
      checks++;
      if (ci[0]! < truth && truth < ci[1]!) covered++;
      // Never far off: within 5 % of the truth whatever the CI (the estimates are not biased).
      expect(Math.abs((ci[0]! + ci[1]!) / 2 / truth - 1)).toBeLessThan(0.05);
    };
    for (const s of a.steps) {
      expect(s.terms).toHaveLength(2);
      expect(s.physics.circuit).toBe('ladder-flow-driven');
      check(s.compliance_ci95, LC1 + LC2);
      check(s.resistance_ci95, LR2 + LR3);
      const ladder = s.physics.ladder as Record<string, { ci95: [number, number] }>;
      check(ladder.node1_compliance_m3_per_Pa!.ci95, LC1);
      check(ladder.node2_compliance_m3_per_Pa!.ci95, LC2);
      check(ladder.resistance_between_nodes_Pa_s_per_m3!.ci95, LR2);
      check(ladder.outlet_resistance_Pa_s_per_m3!.ci95, LR3);
    }
    // 18 correlated 95 % intervals: at least 15 cover (binomial P(≤ 14 of 18) ≈ 1 % for independent ones).
    expect(checks).toBe(18);
    expect(covered).toBeGreaterThanOrEqual(15);
  });

  it('analyze --circuit single (default) keeps the one-node reading; ladder with --terms 1 warns', async () => {
    const single = await analyze(['ladder.csv', '--terms', '2']);
    expect(single.steps.every((s) => s.physics.circuit === 'flow-driven')).toBe(true);
    const oneTerm = await analyze(['ladder.csv', '--circuit', 'ladder', '--terms', '1']);
    expect(oneTerm.steps.every((s) => s.physics.circuit === 'flow-driven')).toBe(true);
    expect(oneTerm.steps[0]!.warnings.map((w) => w.code)).toContain('ladder-needs-two-terms');
    const io = captureIo(dir);
    expect(await runCli(['analyze', 'ladder.csv', '--circuit', 'triple'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/single or ladder/);
  });

  it('analyze --help lists --flow-sensor and --circuit with examples', async () => {
    const io = captureIo(dir);
    expect(await runCli(['analyze', '--help'], io)).toBe(0);
    const help = io.stdoutText();
    expect(help).toMatch(/--flow-sensor <side>/);
    expect(help).toMatch(/--circuit <kind>/);
    expect(help).toMatch(/analyze .*--flow-sensor inlet/);
    expect(help).toMatch(/analyze .*--circuit ladder/);
  });
});
