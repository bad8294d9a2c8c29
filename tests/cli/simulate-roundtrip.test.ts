/**
 * Round trips: simulate → analyze recovers the truth written beside the log. The truth is the
 * network the simulator solved (closed forms of physics.md §4.2/§4.3 for these one-node circuits);
 * every check is "the reported 95 % CI contains the true value".
 *
 * Sampling jitter is off (--jitter 0) in the strict checks: with jitter a sample can fall just before a
 * setpoint change, the analysis window then starts one sample late, and (as of this writing) the
 * analysis takes Δp from the fitted start of the window, which biases R by about Δt/τ (3 % here).
 * That is an analysis matter, reported to its owner; it is not hidden here, only kept out of this check.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCli } from '../../src/cli/main';
import { captureIo } from '../helpers/cli-io';

const MIXER = resolve('sample-logs/chips/pdms-mixer.json');
const REGULATOR = resolve('sample-logs/simulated/regulator-bench.chip.json');
let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-rt-'));
  writeFileSync(join(dir, 'flow.csv'), 'time_s,flow[uL/min]\n0,2\n15,5\n45,10\n75,5\n105,2\n');
  writeFileSync(join(dir, 'pressure.csv'), 'time_s,pressure[mbar]\n0,50\n10,150\n30,300\n50,150\n70,50\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function cli(args: string[]): Promise<string> {
  const io = captureIo(dir);
  const code = await runCli(args, io);
  expect(code, io.stderrText()).toBe(0);
  return io.stdoutText();
}

interface Truth {
  resistance_Pa_s_per_m3: { total: number };
  steps: Array<{
    onset_s: number;
    tau_s: number[];
    compliance_m3_per_Pa: number;
    resistance_identified_Pa_s_per_m3: number;
    compliance_range_m3_per_Pa: [number, number];
    tau_range_s: [number, number];
  }>;
}
interface Analysis {
  steps: Array<{
    start_s: number;
    terms: Array<{ tau_s: number; tau_ci95_s: [number, number] }>;
    resistance_ci95: [number, number];
    compliance_ci95: [number, number];
  }>;
}

function within(ci: [number, number], v: number | [number, number]): boolean {
  const [lo, hi] = typeof v === 'number' ? [v, v] : v;
  return ci[0] <= hi && lo <= ci[1]; // the CI meets the true value (or the true range)
}

/** Each analysed step matched to the true step with the same onset; τ, R and C inside their CIs. */
function checkSteps(a: Analysis, t: Truth, minSteps: number): void {
  let matched = 0;
  for (const s of a.steps) {
    const truth = t.steps.find((x) => Math.abs(x.onset_s - s.start_s) < 0.5);
    if (!truth) continue;
    matched++;
    const slow = s.terms[s.terms.length - 1]!;
    // With trapped gas the small-signal τ and C move during the step (physics.md §3.3): the CI must meet
    // the range between their values before and after; without gas that range is a single value.
    expect(within(slow.tau_ci95_s, truth.tau_range_s), `τ at ${truth.onset_s} s: ${slow.tau_ci95_s} vs ${truth.tau_range_s}`).toBe(true);
    expect(within(s.resistance_ci95, truth.resistance_identified_Pa_s_per_m3), `R at ${truth.onset_s} s`).toBe(true);
    expect(within(s.compliance_ci95, truth.compliance_range_m3_per_Pa), `C at ${truth.onset_s} s: ${s.compliance_ci95} vs ${truth.compliance_range_m3_per_Pa}`).toBe(true);
  }
  expect(matched).toBeGreaterThanOrEqual(minSteps);
}

describe('simulate → analyze round trips', () => {
  it('flow-driven PDMS mixer: analyze --chip recovers τ, R_down and C within the CIs', async () => {
    await cli(['simulate', MIXER, '--program', 'flow.csv', '--out', 'fd.csv', '--seed', '11', '--jitter', '0']);
    const a = JSON.parse(await cli(['analyze', 'fd.csv', '--chip', MIXER, '--json'])) as Analysis;
    const t = JSON.parse(readFileSync(join(dir, 'fd.csv.truth.json'), 'utf8')) as Truth;
    for (const s of t.steps) expect(s.tau_range_s[0]).toBe(s.tau_range_s[1]); // linear: one τ
    checkSteps(a, t, 4);
  });

  it('flow-driven with a trapped 5 µL bubble: τ and C fall within the range the gas compliance spans across each step (physics.md §3.3)', async () => {
    await cli(['simulate', MIXER, '--program', 'flow.csv', '--out', 'bub.csv', '--bubble', '5 uL', '--seed', '14', '--jitter', '0']);
    const t = JSON.parse(readFileSync(join(dir, 'bub.csv.truth.json'), 'utf8')) as Truth & { trapped_air: { volume_m3_at_atm: number } };
    expect(t.trapped_air.volume_m3_at_atm).toBeCloseTo(5e-9, 20); // the --bubble 5 uL given (1 µL = 1e-9 m³)
    const a = JSON.parse(await cli(['analyze', 'bub.csv', '--chip', MIXER, '--json'])) as Analysis;
    checkSteps(a, t, 4);
  });

  it('pressure-driven regulator bench: analyze --chip recovers τ, R_total and C within the CIs', async () => {
    await cli(['simulate', REGULATOR, '--setup', 'pressure-driven', '--program', 'pressure.csv', '--out', 'pd.tsv', '--dialect', 'iso-tab', '--sample-rate', '20', '--seed', '12', '--jitter', '0']);
    const a = JSON.parse(await cli(['analyze', 'pd.tsv', '--chip', REGULATOR, '--json'])) as Analysis;
    checkSteps(a, JSON.parse(readFileSync(join(dir, 'pd.tsv.truth.json'), 'utf8')) as Truth, 4);
  });

  // The flow (the response) is logged faster than the pressure, so the merge keeps its samples as they are;
  // a slower response logger would be interpolated onto the faster time base, and interpolated samples are
  // not independent (the fit's CI would then be too narrow; reported to the analysis owner).
  it('two loggers (pressure 10 Hz, flow 20 Hz, flow clock 1.8 s ahead): analyze with --offset 0 recovers the truth', async () => {
    await cli(['simulate', REGULATOR, '--setup', 'pressure-driven', '--program', 'pressure.csv', '--out', 'p2.tsv', '--flow-out', 'q2.tsv', '--flow-rate', '20', '--clock-offset', '1.8', '--dialect', 'iso-tab', '--sample-rate', '10', '--seed', '13', '--jitter', '0']);
    const a = JSON.parse(await cli(['analyze', 'p2.tsv', 'q2.tsv', '--offset', '0', '--chip', REGULATOR, '--json'])) as Analysis;
    checkSteps(a, JSON.parse(readFileSync(join(dir, 'p2.tsv.truth.json'), 'utf8')) as Truth, 4);
  });
});
