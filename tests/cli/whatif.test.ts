import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCli } from '../../src/cli/main';
import { captureIo } from '../helpers/cli-io';

const CHIP = resolve('sample-logs/chips/pdms-mixer.json');

// Exit codes (0 = ok, 2 = bad input or usage) and message wording are the project's own conventions
// (team brief, DEVELOPERS.md); expected values come from the invented sample logs or the texts written here,
// converted with the unit definitions noted beside each check.

async function run(args: string[], cwd = process.cwd()): Promise<{ code: number; out: string; err: string }> {
  const io = captureIo(cwd);
  const code = await runCli(args, io);
  return { code, out: io.stdoutText(), err: io.stderrText() };
}

describe('lagbench whatif', () => {
  it('whatif(--vary bubble volume --json) reports τ = R_down·C rising with the bubble (physics.md §3.3, §4.2)', async () => {
    const r = await run(['whatif', CHIP, '--vary', 'bubble.volume=0:10uL:3', '--json', '--target-t95', '13']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { rows: Array<{ value: number; tau_s: { nominal: number }; t95_s: { nominal: number }; compliance_m3_per_Pa: { nominal: number }; resistance_seen_by_node_Pa_s_per_m3: number; meets_target: boolean }>; meeting_ranges: number[][] };
    expect(j.rows).toHaveLength(3);
    for (const row of j.rows) {
      expect(row.tau_s.nominal / (row.compliance_m3_per_Pa.nominal * row.resistance_seen_by_node_Pa_s_per_m3)).toBeCloseTo(1, 10);
      expect(row.t95_s.nominal / row.tau_s.nominal).toBeCloseTo(2.9957, 4); // physics.md §4.1
    }
    // The description's operating pressure is 150 mbar on 1013 mbar ambient: C_gas = V·p_atm/p_abs².
    const dC = j.rows[2]!.compliance_m3_per_Pa.nominal - j.rows[0]!.compliance_m3_per_Pa.nominal;
    expect(dC / ((1e-8 * 101300) / 116300 ** 2)).toBeCloseTo(1, 8);
    // Target 13 s is a test input chosen between the rows' t95 values; the bubble-free end meets it.
    expect(j.rows.map((x) => x.meets_target)).toEqual([true, true, false]);
    expect(j.meeting_ranges).toHaveLength(1);
    expect(j.meeting_ranges[0]![0]).toBe(0);
  });

  it('whatif(table, --responses) prints the sweep with the caution and writes overlayable step responses', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-whatif-'));
    try {
      const r = await run(['whatif', CHIP, '--vary', '1 mL plastic syringe.kind=plastic,glass', '--target-t95', '5', '--responses', 'resp.csv'], dir);
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/t95 ≤ 5 s with: glass/);
      expect(r.out).toMatch(/Caution: pressurised fluidics/);
      const lines = readFileSync(join(dir, 'resp.csv'), 'utf8').trim().split('\n');
      expect(lines[0]).toBe('time_s,fraction at plastic,fraction at glass');
      expect(lines).toHaveLength(302); // header + 301 points (the command's curve resolution)
      const last = lines[lines.length - 1]!.split(',').map(Number);
      expect(last[1]).toBeGreaterThan(0.95); // 1.5 × the slowest t95: past 95 % (physics.md §4.1)
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('whatif(bad --vary) exits 2 with the reason', async () => {
    const r = await run(['whatif', CHIP, '--vary', 'nosuch.length=1m:2m']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/no element 'nosuch'/);
    expect((await run(['whatif', CHIP])).err).toMatch(/--vary/);
    expect((await run(['whatif', CHIP, '--vary', 'bubble.length=1m:2m'])).code).toBe(2);
  });
});
