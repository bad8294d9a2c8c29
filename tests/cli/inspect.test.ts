import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import { captureIo } from '../helpers/cli-io';

// Exit codes (0 = ok, 2 = bad input or usage) and message wording are the project's own conventions
// (team brief, DEVELOPERS.md); expected values come from the invented sample logs or the texts written here,
// converted with the unit definitions noted beside each check.
const SAMPLES = ['pressure-controller.csv', 'syringe-pump-semicolon.csv', 'pressure-logger-iso.csv', 'flow-logger-iso.tsv', 'hydrostatic-head-spaces.txt', 'overnight-clock-units-row.csv'];

describe('lagbench inspect', () => {
  it('runCli(inspect --help) shows options and examples', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', '--help'], io)).toBe(0);
    expect(io.stdoutText()).toContain('Examples:');
    expect(io.stdoutText()).toContain('--skip-bad-rows');
  });

  it.each(SAMPLES)('runCli(inspect sample-logs/%s) exits 0 and names every channel', async (name) => {
    const io = captureIo();
    expect(await runCli(['inspect', `sample-logs/${name}`], io)).toBe(0);
    expect(io.stdoutText()).toMatch(/(pressure|flow|hydrostatic_head)\w*_(Pa|m3_per_s)/);
    expect(io.stderrText()).toBe('');
  });

  it('runCli(inspect pressure log) shows dialect, rate, metadata and the pressure caution', async () => {
    const io = captureIo();
    await runCli(['inspect', 'sample-logs/pressure-controller.csv'], io);
    const out = io.stdoutText();
    expect(out).toContain('comma delimiter, decimal point');
    expect(out).toContain('sample rate 10 Hz'); // the sample log's 0.1 s spacing; metadata line '# Chip: PDMS mixer M-07'
    expect(out).toContain('Chip: PDMS mixer M-07');
    expect(out).toContain('pressure_setpoint → pressure_setpoint_Pa');
    expect(out).toContain(PRESSURE_SAFETY_CAUTION);
  });

  it('runCli(inspect --json) prints parseable JSON with report and summary', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', 'sample-logs/syringe-pump-semicolon.csv', '--json'], io)).toBe(0);
    const json = JSON.parse(io.stdoutText()) as { files: { report: { dialect: { delimiter: string; decimal: string; hadBom: boolean }; rows: number }; summary: { sampleRateHz: number } }[]; merged: unknown };
    expect(json.files[0]!.report.dialect).toMatchObject({ delimiter: ';', decimal: ',', hadBom: true });
    // Counted in the sample file: 307 lines − 6 preamble/header lines = 301 rows; 200 ms spacing = 5 Hz.
    expect(json.files[0]!.report.rows).toBe(301);
    expect(json.files[0]!.summary.sampleRateHz).toBeCloseTo(5, 9);
    expect(json.merged).toBeNull();
  });

  it('runCli(inspect two logs) shows the merged recording', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', 'sample-logs/pressure-logger-iso.csv', 'sample-logs/flow-logger-iso.tsv'], io)).toBe(0);
    expect(io.stdoutText()).toContain('merged (2 logs');
  });

  it('runCli(inspect header-less log with --sample-rate and --column) reads it', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', 'sample-logs/headerless-100Hz.txt', '--sample-rate', '100', '--column', '1=pressure:mbar'], io)).toBe(0);
    expect(io.stdoutText()).toContain('sample rate 100 Hz');
  });

  it('runCli(inspect missing file) exits 2 with a located message and no stack trace', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', 'no/such/log.csv'], io)).toBe(2);
    expect(io.stderrText()).toBe('lagbench inspect: no/such/log.csv: The file does not exist. Check the path and the spelling of the file name.\n');
  });

  it('runCli(inspect bad row) exits 2 naming file, line and column; --skip-bad-rows warns instead', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-inspect-'));
    writeFileSync(join(dir, 'bad.csv'), 'Time [s],Pressure [mbar]\n0,1\n1,n/a?\n2,3\n');
    const io = captureIo(dir);
    expect(await runCli(['inspect', 'bad.csv'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/^lagbench inspect: bad\.csv:3:2: 'n\/a\?' in column 2/);
    expect(io.stderrText()).not.toMatch(/\n\s+at /);
    const io2 = captureIo(dir);
    expect(await runCli(['inspect', 'bad.csv', '--skip-bad-rows'], io2)).toBe(0);
    expect(io2.stdoutText()).toContain('1 bad row(s) skipped; the first at line 3');
  });

  it('runCli(inspect with a bad option) exits 2 with a usage message', async () => {
    const io = captureIo();
    expect(await runCli(['inspect', 'sample-logs/pressure-controller.csv', '--delimiter', 'pipe'], io)).toBe(2);
    expect(io.stderrText()).toContain("--delimiter must be comma, semicolon, tab or space, not 'pipe'");
    const io2 = captureIo();
    expect(await runCli(['inspect', 'sample-logs/pressure-controller.csv', '--frobnicate'], io2)).toBe(2);
    expect(io2.stderrText()).toContain("Run 'lagbench inspect --help'");
  });

  it('runCli(inspect with no file) exits 2', async () => {
    const io = captureIo();
    expect(await runCli(['inspect'], io)).toBe(2);
    expect(io.stderrText()).toContain('give at least one log file');
  });
});
