/**
 * `lagbench analyze` in process (runCli + captureIo) on seeded synthetic logs written to a temporary
 * folder. The response is the closed-form first-order response of physics.md §4.2 with τ = R·C = 3 s;
 * unit factors from physics.md §5 (1 mbar = 100 Pa, 1 µL/min = 1.666667e-11 m³/s).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import type { AnalysisJson } from '../../src/core/analyze/types';
import { captureIo } from '../helpers/cli-io';
import { syntheticLog, UL_PER_MIN } from '../core/steps/synthetic-logs';

const TAU = 3;
let dir = '';

function writeLog(name: string, withDrive: boolean, seed: number): void {
  const rec = syntheticLog({
    sampleRateHz: 50,
    durationS: 190,
    program: [
      { timeS: 0, value: 0 },
      { timeS: 40.01, value: 10 * UL_PER_MIN },
      { timeS: 90.01, value: 20 * UL_PER_MIN },
      { timeS: 140.01, value: 5 * UL_PER_MIN },
    ],
    driveQuantity: 'flow_setpoint',
    responseQuantity: 'pressure',
    gain: 6e13, // 10 mbar/(µL/min)
    tauS: TAU,
    responseNoise: 50,
    includeDrive: withDrive,
    seed,
  });
  const header = withDrive ? 'time_s,flow_setpoint[uL/min],pressure[mbar]' : 'time_s,pressure[mbar]';
  const lines = ['# invented demo data: PDMS mixer chip priming', header];
  const q = rec.channels.find((c) => c.quantity === 'flow_setpoint');
  const p = rec.channels.find((c) => c.quantity === 'pressure')!;
  for (let i = 0; i < rec.timeS.length; i++) {
    const cells = [rec.timeS[i]!.toFixed(2)];
    if (q) cells.push((q.values[i]! / UL_PER_MIN).toFixed(4));
    cells.push((p.values[i]! / 100).toFixed(4));
    lines.push(cells.join(','));
  }
  writeFileSync(join(dir, name), `${lines.join('\n')}\n`);
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-analyze-'));
  writeLog('pump.csv', true, 41);
  writeLog('pressure-only.csv', false, 42);
  writeFileSync(join(dir, 'program.csv'), 'time_s,flow_setpoint[uL/min]\n0,0\n40.01,10\n90.01,20\n140.01,5\n');
  writeFileSync(join(dir, 'bad-program.csv'), 'time_s,flow_setpoint[uL/min]\n0,0\n40,ten\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = captureIo(dir);
  const code = await runCli(['analyze', ...args], io);
  return { code, out: io.stdoutText(), err: io.stderrText() };
}

describe('lagbench analyze', () => {
  it('analyze <log> prints a table in mbar and µL/min with τ and its CI, and the safety caution', async () => {
    const r = await run('pump.csv', '--terms', '1');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Setup: flow-driven/);
    expect(r.out).toMatch(/drive \[µL\/min\]/);
    expect(r.out).toMatch(/y∞ \[mbar\]/);
    expect(r.out).toMatch(/0 → 10\s+up/);
    expect(r.out).toMatch(/20 → 5\s+down/);
    expect(r.out).toContain(PRESSURE_SAFETY_CAUTION);
  });

  it('analyze --json prints the documented fields in SI, with τ = R·C inside each CI', async () => {
    const r = await run('pump.csv', '--json', '--terms', '1');
    expect(r.code).toBe(0);
    const a = JSON.parse(r.out) as AnalysisJson;
    expect(a.software.name).toBe('lagbench');
    expect(a.files).toEqual(['pump.csv']);
    expect(a.steps).toHaveLength(3);
    for (const s of a.steps) {
      expect(s.drive.quantity).toBe('flow_setpoint');
      expect(s.response.quantity).toBe('pressure');
      expect(s.terms[0]!.tau_ci95_s[0]!).toBeLessThan(TAU);
      expect(s.terms[0]!.tau_ci95_s[1]!).toBeGreaterThan(TAU);
    }
    // 10 µL/min in m³/s (physics.md §5).
    expect(a.steps[0]!.drive.after! / 1.666667e-11).toBeCloseTo(10, 4);
  });

  it('analyze --steps <file> fits a response-only log at the listed times', async () => {
    const r = await run('pressure-only.csv', '--steps', 'program.csv', '--setup', 'flow-driven', '--json', '--terms', '1');
    expect(r.code).toBe(0);
    const a = JSON.parse(r.out) as AnalysisJson;
    expect(a.detection.origin).toBe('user');
    expect(a.steps.map((s) => s.start_s)).toEqual([40.01, 90.01, 140.01]);
  });

  it('analyze (response only, no step list) finds the steps on the response', async () => {
    const r = await run('pressure-only.csv', '--json', '--terms', '1');
    expect(r.code).toBe(0);
    const a = JSON.parse(r.out) as AnalysisJson;
    expect(a.detection.origin).toBe('response');
    expect(a.steps).toHaveLength(3);
    expect(a.warnings.map((w) => w.code)).toContain('setup-assumed');
  });

  it('analyze --out <file> writes the JSON to the file and nothing to stdout', async () => {
    const r = await run('pump.csv', '--json', '--out', 'result.json', '--terms', '1');
    expect(r.code).toBe(0);
    expect(r.out).toBe('');
    expect(existsSync(join(dir, 'result.json'))).toBe(true);
    expect((JSON.parse(readFileSync(join(dir, 'result.json'), 'utf8')) as AnalysisJson).steps).toHaveLength(3);
  });

  it('analyze --min-step with a unit of the wrong quantity exits 2 with a usage message', async () => {
    const r = await run('pump.csv', '--min-step', '5mbar');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--min-step 5mbar is a pressure/);
    expect(r.err).not.toMatch(/at .*\.ts:\d+/);
  });

  it('analyze --min-step 12uL/min keeps only the larger steps', async () => {
    const r = await run('pump.csv', '--min-step', '12uL/min', '--json', '--terms', '1');
    expect(r.code).toBe(0);
    // Steps: 0→10 (10), 10→20 (10), 20→5 (15 µL/min): only the last is ≥ 12 µL/min.
    expect((JSON.parse(r.out) as AnalysisJson).steps.map((s) => s.direction)).toEqual(['down']);
  });

  it('analyze with a bad step list exits 2 naming file, line and column', async () => {
    const r = await run('pressure-only.csv', '--steps', 'bad-program.csv');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bad-program\.csv:3:4: 'ten' is not a number/);
  });

  it('analyze with bad usage or a missing file exits 2 without a stack trace', async () => {
    for (const args of [[], ['pump.csv', '--terms', '4'], ['pump.csv', '--setup', 'gravity'], ['pump.csv', '--bogus'], ['missing.csv']]) {
      const r = await run(...args);
      expect(r.code).toBe(2);
      expect(r.err).not.toMatch(/at .*\.ts:\d+/);
    }
  });

  it('analyze --help shows the options and examples', async () => {
    const r = await run('--help');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/--setup <name>/);
    expect(r.out).toMatch(/Examples:/);
    // The importer's options appear once, in their own section.
    expect(r.out.match(/--time-format/g)).toHaveLength(1);
  });
});
