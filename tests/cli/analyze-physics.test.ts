/**
 * `lagbench analyze` with the physics options (--upstream-resistance, --chip) in process, on a
 * pressure-driven log with an outlet flow sensor written here from the closed form of physics.md §4.3:
 * Q₂(t) = Δp/(R1 + R2)·(1 − e^(−t/τ)), τ = C·R1·R2/(R1 + R2) = 0.6667 s for the §4.3 check circuit.
 * Units: 1 mbar = 100 Pa, 1 µL/min = 1.666667e-11 m³/s, 1 mbar/(µL/min) = 6e12 Pa·s/m³ (physics.md §5).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main';
import type { AnalysisWithPhysicsJson } from '../../src/core/analyze/physics';
import { createRng } from '../../src/core/stats';
import { captureIo } from '../helpers/cli-io';

const [R1, R2, C] = [1e13, 2e13, 1e-13];
const TAU = (C * R1 * R2) / (R1 + R2);
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-physics-'));
  const rng = createRng(21);
  const times = [0, 8, 16, 24];
  const levelsMbar = [0, 30, 60, 20];
  const lines = ['# invented demo data: pressure-driven bench, outlet flow sensor', 'Time [s],Pressure setpoint [mbar],Flow [uL/min]'];
  for (let i = 0; i < 32 * 50; i++) {
    const t = i / 50;
    let level = 0;
    let q = 0;
    for (let k = 0; k < times.length; k++) {
      if (t >= times[k]!) {
        level = levelsMbar[k]!;
        if (k > 0) q += (((levelsMbar[k]! - levelsMbar[k - 1]!) * 100) / (R1 + R2)) * (1 - Math.exp(-(t - times[k]!) / TAU));
      }
    }
    const qUlMin = q * 6e10 + 0.01 * rng.normal();
    lines.push(`${t.toFixed(2)},${level},${qUlMin.toFixed(5)}`);
  }
  writeFileSync(join(dir, 'outlet.csv'), `${lines.join('\n')}\n`);
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('lagbench analyze physics options', () => {
  it('analyze --upstream-resistance "1.6667 mbar/(uL/min)" gives C with a CI containing the true 1e-13 m³/Pa', async () => {
    const io = captureIo(dir);
    // R1 = 1e13 Pa·s/m³ = 1.6667 mbar/(µL/min) (1 mbar/(µL/min) = 6e12, physics.md §5)
    const rc = await runCli(['analyze', 'outlet.csv', '--terms', '1', '--json', '--upstream-resistance', '1.66667 mbar/(uL/min)'], io);
    expect(rc).toBe(0);
    const a = JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
    expect(a.steps).toHaveLength(3);
    let covered = 0;
    for (const s of a.steps) {
      expect(s.physics.flow_sensor).toBe('outlet');
      if (s.compliance_ci95[0]! < C && C < s.compliance_ci95[1]!) covered++;
      expect(s.resistance_ci95[0]!).toBeLessThan(1.02 * (R1 + R2));
      expect(s.resistance_ci95[1]!).toBeGreaterThan(0.98 * (R1 + R2));
    }
    expect(covered).toBeGreaterThanOrEqual(2);
  });

  it('analyze without R_up reports no C for an outlet sensor, with the lower bound and a warning', async () => {
    const io = captureIo(dir);
    expect(await runCli(['analyze', 'outlet.csv', '--terms', '1', '--json'], io)).toBe(0);
    const a = JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
    for (const s of a.steps) {
      expect(s.compliance_m3_per_Pa).toBeNull();
      // bound 4τ/R_total ≤ C (docs/setups.md §2)
      expect(s.physics.compliance_lower_bound_m3_per_Pa as number).toBeLessThanOrEqual(C * 1.05);
      expect(s.warnings.some((w) => w.code === 'upstream-resistance-unknown')).toBe(true);
    }
  });

  it('analyze --upstream-resistance with an unknown unit exits 2 and names the accepted units', async () => {
    const io = captureIo(dir);
    expect(await runCli(['analyze', 'outlet.csv', '--upstream-resistance', '2 bar'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/mbar\/\(uL\/min\)/);
  });

  it('analyze human output shows the circuit section before the safety caution', async () => {
    const io = captureIo(dir);
    expect(await runCli(['analyze', 'outlet.csv', '--terms', '1', '--upstream-resistance', '1e13'], io)).toBe(0);
    const text = io.stdoutText();
    const circuit = text.indexOf('Circuit (R = resistance');
    expect(circuit).toBeGreaterThan(0);
    expect(text.indexOf('Caution:')).toBeGreaterThan(circuit);
    expect(text).toMatch(/mbar\/\(µL\/min\)/);
  });

  it('analyze --chip adds the nominal prediction and a trapped-air verdict', async () => {
    const io = captureIo(dir);
    const chip = join(process.cwd(), 'sample-logs', 'chips', 'pdms-mixer.json');
    expect(await runCli(['analyze', 'outlet.csv', '--terms', '1', '--json', '--chip', chip], io)).toBe(0);
    const a = JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
    expect(a.nominal).not.toBeNull();
    expect((a.nominal as { setup: string }).setup).toBe('pressure-driven');
    expect(a.trapped_air).not.toBeNull();
    expect(['pressure-fingerprint', 'excess-compliance']).toContain(a.trapped_air!.method);
    // R_up now comes from the chip description, so C is reported
    expect(a.steps[0]!.physics.upstream_resistance_source).toMatch(/chip description/);
    expect(a.steps[0]!.compliance_m3_per_Pa).not.toBeNull();
  });
});
