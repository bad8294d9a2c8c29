/**
 * The volume-balance cross-check of C for pressure-driven logs that hold the node pressure and one flow
 * (`lagbench analyze`, physics.flow_balance), on logs written here from the closed form of physics.md §4.3:
 * regulator P → R1 → node (C) → R2 → outlet; after a step ΔP the node pressure rises as
 * p(t) = p₀ + ΔP·R2/(R1 + R2)·(1 − e^(−t/τ)), τ = C·R1·R2/(R1 + R2); the inlet flow is (P − p)/R1 and the
 * outlet flow p/R2 (Kirchhoff; derivation). The balance ∫(Q_in − Q_out)dt = C·(p − p₀) must give the true C.
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
const [R1, R2, C] = [1e13, 2e13, 1e-13];
const TAU = (C * R1 * R2) / (R1 + R2);
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-balance-'));
  const times = [0, 8, 16, 24];
  const levelsMbar = [0, 30, 60, 20];
  for (const side of ['inlet', 'outlet'] as const) {
    const rng = createRng(side === 'inlet' ? 5 : 6);
    const lines = [`# invented demo data: pressure-driven bench, node pressure and ${side} flow`, 'Time [s],Pressure setpoint [mbar],Pressure [mbar],Flow [uL/min]'];
    for (let i = 0; i < 32 * 50; i++) {
      const t = i / 50;
      let level = 0;
      let p = 0;
      for (let k = 0; k < times.length; k++) {
        if (t < times[k]!) continue;
        level = levelsMbar[k]!;
        if (k > 0) p += (((levelsMbar[k]! - levelsMbar[k - 1]!) * 100 * R2) / (R1 + R2)) * (1 - Math.exp(-(t - times[k]!) / TAU));
      }
      const q = side === 'inlet' ? (level * 100 - p) / R1 : p / R2;
      lines.push(`${t.toFixed(2)},${level},${(p / 100 + 0.02 * rng.normal()).toFixed(5)},${(q / UL_MIN + 0.005 * rng.normal()).toFixed(5)}`);
    }
    writeFileSync(join(dir, `${side}.csv`), `${lines.join('\n')}\n`);
  }
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('lagbench analyze volume balance (pressure-driven)', () => {
  for (const side of ['inlet', 'outlet'] as const) {
    it(`analyze (pressure-driven, node pressure + ${side} flow) reports a flow-balance C whose CI holds the true 1e-13 m³/Pa`, async () => {
      const io = captureIo(dir);
      const rc = await runCli(['analyze', `${side}.csv`, '--setup', 'pressure-driven', '--response', 'flow_m3_per_s', '--terms', '1', '--flow-sensor', side, '--json'], io);
      expect(rc, io.stderrText()).toBe(0);
      const a = JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
      expect(a.steps).toHaveLength(3);
      let covered = 0;
      for (const s of a.steps) {
        const fb = s.physics.flow_balance as { compliance_m3_per_Pa: number; compliance_ci95: [number, number] } | null;
        expect(fb, `step ${s.index}`).not.toBeNull();
        // Never far off (within 10 %), and inside the 95 % CI in at least 2 of 3 steps.
        expect(Math.abs(fb!.compliance_m3_per_Pa / C - 1)).toBeLessThan(0.1);
        if (fb!.compliance_ci95[0] < C && C < fb!.compliance_ci95[1]) covered++;
      }
      expect(covered).toBeGreaterThanOrEqual(2);
    });
  }
});
