/**
 * `lagbench analyze --chip … --laplace` on the simulated bubble log of the demo lot (invented data):
 * the air volume from excess compliance then solves the small-bubble formula of physics.md §3.3–3.4 [D]
 * C = V/(p − p_v + 4σ/(3r)), r = (3V/(4π))^(1/3), and without --laplace V = C·(p − p_v) (§3.4).
 * Both are checked here from the reported excess compliance, node pressure, σ and p_v.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { AnalysisWithPhysicsJson } from '../../src/core/analyze/physics';
import { captureIo } from '../helpers/cli-io';

const LOG = 'sample-logs/simulated/mixer-b04-bubble.csv';
const CHIP = 'sample-logs/simulated/mixer-b04-bubble.chip.json';

async function analyze(extra: string[]): Promise<AnalysisWithPhysicsJson> {
  const io = captureIo();
  expect(await runCli(['analyze', LOG, '--chip', CHIP, '--json', ...extra], io), io.stderrText()).toBe(0);
  return JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
}

describe('lagbench analyze --laplace', () => {
  it('analyze --laplace gives air volumes solving C = V/(p − p_v + 4σ/(3r)); without it V = C·(p − p_v)', async () => {
    const [plain, lap] = [await analyze([]), await analyze(['--laplace'])];
    const fluid = (lap.nominal as { fluid: { surface_tension_N_per_m: number; vapour_pressure_Pa: number } }).fluid;
    const sigma = fluid.surface_tension_N_per_m;
    const pv = fluid.vapour_pressure_Pa;
    // Water near room temperature: σ ≈ 0.072 N/m (physics.md §3.3 table uses 0.072).
    expect(sigma).toBeGreaterThan(0.06);
    expect(sigma).toBeLessThan(0.08);
    let checked = 0;
    for (const [i, s] of lap.steps.entries()) {
      const dc = s.physics.excess_compliance_m3_per_Pa as number | null;
      const v = s.physics.air_volume_m3_at_working_pressure as number | null;
      if (dc === null || v === null || !(dc > 0)) continue;
      const p = s.pressure_abs_Pa!;
      const r = Math.cbrt((3 * v) / (4 * Math.PI));
      expect(s.physics.air_volume_laplace).toBe(true);
      expect(Math.abs(dc * (p - pv + (4 * sigma) / (3 * r)) - v) / v).toBeLessThan(1e-9);
      const vPlain = plain.steps[i]!.physics.air_volume_m3_at_working_pressure as number;
      expect(plain.steps[i]!.physics.air_volume_laplace).toBe(false);
      expect(Math.abs(dc * (p - pv) - vPlain) / vPlain).toBeLessThan(1e-9);
      // A µL bubble: the Laplace term is ~0.1 % of p (physics.md §3.3 table: 0.07 % at 10 µL), and it stiffens.
      expect(v / vPlain).toBeGreaterThan(1);
      expect(v / vPlain).toBeLessThan(1.005);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(3);
  });

  it('analyze --laplace without --chip warns that it needs the chip description', async () => {
    const io = captureIo();
    expect(await runCli(['analyze', LOG, '--laplace', '--json'], io)).toBe(0);
    const a = JSON.parse(io.stdoutText()) as AnalysisWithPhysicsJson;
    expect(a.warnings.map((w) => w.code)).toContain('laplace-needs-chip');
  });
});
