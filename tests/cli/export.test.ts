import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import { parseLogText } from '../../src/core/import/index';
import { captureIo } from '../helpers/cli-io';

const cwd = process.cwd();

// Exit codes (0 = ok, 2 = bad input or usage) and message wording are the project's own conventions
// (team brief, DEVELOPERS.md); expected values come from the invented sample logs or the texts written here,
// converted with the unit definitions noted beside each check.

describe('lagbench export', () => {
  it('runCli(export --help) shows the column names and examples', async () => {
    const io = captureIo();
    expect(await runCli(['export', '--help'], io)).toBe(0);
    expect(io.stdoutText()).toContain('flow_setpoint_m3_per_s');
    expect(io.stdoutText()).toContain('Examples:');
  });

  it('runCli(export semicolon log) writes SI CSV with time_s and <quantity>_<unit> columns', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-export-'));
    const out = join(dir, 'pump.csv');
    const io = captureIo(cwd);
    expect(await runCli(['export', 'sample-logs/syringe-pump-semicolon.csv', '--out', out], io)).toBe(0);
    const text = readFileSync(out, 'utf8');
    expect(text.split('\n')[0]).toBe('time_s,flow_setpoint_m3_per_s,flow_m3_per_s');
    // second data row of the sample log: "200;1;0,064733;" → 0.2 s, 1 µL/min, 0.064733 µL/min (1 µL/min = 1e-9/60 m³/s)
    const [t, qs, q] = text.split('\n')[2]!.split(',').map(Number);
    expect(t).toBe(0.2);
    expect(qs).toBeCloseTo(1e-9 / 60, 24);
    expect(q).toBeCloseTo((0.064733 * 1e-9) / 60, 24);
  });

  it('runCli(export) output reads back to the same recording (full precision)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-export-'));
    const out = join(dir, 'merged.csv');
    expect(await runCli(['export', 'sample-logs/pressure-logger-iso.csv', 'sample-logs/flow-logger-iso.tsv', '--out', out], captureIo(cwd))).toBe(0);
    const first = parseLogText(readFileSync(out, 'utf8')).recording;
    const again = join(dir, 'again.csv');
    expect(await runCli(['export', out, '--out', again], captureIo(cwd))).toBe(0);
    expect(readFileSync(again, 'utf8')).toBe(readFileSync(out, 'utf8'));
    expect(first.startEpochMs).toBe(Date.UTC(2026, 2, 14, 10, 0, 0)); // first ISO timestamp of the sample pressure log
    expect(first.channels.map((c) => c.name)).toEqual(['pressure_Pa', 'flow_m3_per_s']);
  });

  it('runCli(export two pressure logs) suffixes the repeat with _2', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-export-'));
    writeFileSync(join(dir, 'a.csv'), 'Time [s],P [mbar]\n0,1\n1,2\n');
    writeFileSync(join(dir, 'b.csv'), 'Time [s],P [kPa]\n0,1\n1,2\n');
    expect(await runCli(['export', 'a.csv', 'b.csv', '--offset', '0', '--out', 'ab.csv'], captureIo(dir))).toBe(0);
    // 1 mbar = 100 Pa, 1 kPa = 1000 Pa (physics.md §5, exact)
    expect(readFileSync(join(dir, 'ab.csv'), 'utf8')).toBe('time_s,pressure_Pa,pressure_Pa_2\n0,100,1000\n1,200,2000\n');
  });

  it('runCli(export bad log) exits 2 and writes nothing, not even a temporary file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-export-'));
    writeFileSync(join(dir, 'bad.csv'), 'Time [s],P [mbar]\n0,1\n1,2\n0.5,3\n');
    const io = captureIo(dir);
    expect(await runCli(['export', 'bad.csv', '--out', 'out.csv'], io)).toBe(2);
    expect(io.stderrText()).toContain('bad.csv:4:1: The time goes backwards');
    expect(existsSync(join(dir, 'out.csv'))).toBe(false);
    expect(readdirSync(dir)).toEqual(['bad.csv']);
  });

  it('runCli(export without --out, or onto its input) exits 2', async () => {
    const io = captureIo(cwd);
    expect(await runCli(['export', 'sample-logs/pressure-controller.csv'], io)).toBe(2);
    expect(io.stderrText()).toContain('--out <file.csv> is required');
    const io2 = captureIo(cwd);
    expect(await runCli(['export', 'sample-logs/pressure-controller.csv', '--out', 'sample-logs/pressure-controller.csv'], io2)).toBe(2);
    expect(io2.stderrText()).toContain('inputs are never overwritten');
  });

  it('runCli(export two logs without absolute time or offset) exits 2 asking for --offset', async () => {
    const io = captureIo(cwd);
    expect(await runCli(['export', 'sample-logs/syringe-pump-semicolon.csv', 'sample-logs/hydrostatic-head-spaces.txt', '--out', join(tmpdir(), 'x.csv')], io)).toBe(2);
    expect(io.stderrText()).toContain('--offset');
  });
});
