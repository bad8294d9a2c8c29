import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCli } from '../../src/cli/main';
import { captureIo } from '../helpers/cli-io';

const ROOT = resolve('.');
const CHIP = join(ROOT, 'sample-logs/chips/pdms-mixer.json');
const FLOW_PROGRAM = join(ROOT, 'sample-logs/programs/flow-steps.csv');
let dir = '';

// Exit codes (0 = ok, 2 = bad input or usage) and message wording are the project's own conventions
// (team brief, DEVELOPERS.md); expected values come from the invented sample logs or the texts written here,
// converted with the unit definitions noted beside each check.

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-sim-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = captureIo(dir);
  const code = await runCli(args, io);
  return { code, out: io.stdoutText(), err: io.stderrText() };
}

describe('lagbench simulate', () => {
  it('simulate(same seed) writes identical bytes; another seed differs', async () => {
    const a = await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'a.csv', '--seed', '5']);
    expect(a.code).toBe(0);
    expect(a.out).toMatch(/wrote a\.csv: \d+ rows/);
    expect(a.out).toMatch(/Caution: pressurised fluidics/);
    await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'b.csv', '--seed', '5']);
    await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'c.csv', '--seed', '6']);
    const text = (f: string): string => readFileSync(join(dir, f), 'utf8');
    expect(text('a.csv')).toBe(text('b.csv'));
    expect(text('a.csv.truth.json').replace(/a\.csv/g, 'X')).toBe(text('b.csv.truth.json').replace(/b\.csv/g, 'X'));
    expect(text('a.csv')).not.toBe(text('c.csv'));
  });

  it('simulate(--dialect each) writes logs that inspect reads back', async () => {
    for (const d of ['si-csv', 'bench-csv', 'eu-semicolon', 'iso-tab', 'clock-spaces', 'ms-csv']) {
      const out = `d-${d}.log`;
      expect((await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', out, '--dialect', d, '--duration', '30'])).code).toBe(0);
      const inspected = await run(['inspect', out, '--json']);
      expect(inspected.code, `${d}: ${inspected.err}`).toBe(0);
      const rep = JSON.parse(inspected.out) as unknown;
      expect(JSON.stringify(rep)).toMatch(/pressure_Pa/);
      expect(JSON.stringify(rep)).toMatch(/flow_setpoint_m3_per_s/);
    }
  });

  it('simulate writes the truth with R, C, τ and trapped air (τ = R_down·C, physics.md §4.2)', async () => {
    expect((await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 't.csv', '--bubble', '2 uL', '--noise', 'none'])).code).toBe(0);
    const truth = JSON.parse(readFileSync(join(dir, 't.csv.truth.json'), 'utf8')) as {
      trapped_air: { volume_m3_at_atm: number };
      tau_s: number[];
      resistance_Pa_s_per_m3: { downstream: number };
      compliance_m3_per_Pa: { total_at_operating_pressure: number };
      steps: unknown[];
      note: string;
    };
    expect(truth.trapped_air.volume_m3_at_atm).toBeCloseTo(2e-9, 20); // the --bubble 2 uL given (1 µL = 1e-9 m³)
    expect(truth.tau_s[0]! / (truth.resistance_Pa_s_per_m3.downstream * truth.compliance_m3_per_Pa.total_at_operating_pressure)).toBeCloseTo(1, 10);
    expect(truth.steps).toHaveLength(4); // flow-steps.csv changes 4 times: 2 → 5 → 10 → 5 → 2 µL/min
    expect(truth.note).toMatch(/Invented data/);
  });

  it('simulate(--flow-out) writes a second logger with its own rate and clock offset', async () => {
    const r = await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'p.csv', '--flow-out', 'q.csv', '--flow-rate', '4', '--clock-offset', '2.5', '--dialect', 'iso-tab', '--duration', '40']);
    expect(r.code).toBe(0);
    const p = readFileSync(join(dir, 'p.csv'), 'utf8').split('\n');
    const q = readFileSync(join(dir, 'q.csv'), 'utf8').split('\n');
    expect(p.find((l) => /^Timestamp/.test(l))).toMatch(/Pressure_mbar/);
    expect(q.find((l) => /^Timestamp/.test(l))).toMatch(/Flow_nL\/min/);
    // 2026-03-02T09:00:00Z is the fixed start; the flow logger's clock is 2.5 s ahead.
    expect(p.find((l) => /^2026/.test(l))).toMatch(/^2026-03-02T09:00:00\.000Z/);
    expect(q.find((l) => /^2026/.test(l))).toMatch(/^2026-03-02T09:00:02\.500Z/);
    expect(q.filter((l) => /^2026/.test(l))).toHaveLength(161); // 40 s at 4 Hz, both ends
  });

  it('simulate(bad program) exits 2 with a located message and writes nothing', async () => {
    writeFileSync(join(dir, 'bad.csv'), 'time_s,flow[uL/min]\n0,1\n5,fast\n');
    const r = await run(['simulate', CHIP, '--program', 'bad.csv', '--out', 'never.csv']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bad\.csv:3:3: 'fast' is not a number/);
    expect(existsSync(join(dir, 'never.csv'))).toBe(false);
  });

  it('simulate(usage mistakes) exits 2', async () => {
    expect((await run(['simulate', CHIP, '--out', 'x.csv'])).err).toMatch(/--program/);
    expect((await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'x.csv', '--dialect', 'fancy'])).code).toBe(2);
    expect((await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', 'x.csv', '--setup', 'pressure-driven'])).err).toMatch(/needs a 'pressure' column/);
    expect((await run(['simulate', CHIP, '--program', FLOW_PROGRAM, '--out', FLOW_PROGRAM])).err).toMatch(/overwrite the input/);
  });
});
