import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import { captureIo } from '../helpers/cli-io';

const SAMPLE = 'sample-logs/chips/pdms-mixer.json';

// Exit codes (0 = ok, 2 = bad input or usage) and message wording are the project's own conventions
// (team brief, DEVELOPERS.md); expected values come from the invented sample logs or the texts written here,
// converted with the unit definitions noted beside each check.

function tempChip(doc: object | string): string {
  const dir = mkdtempSync(join(tmpdir(), 'lagbench-predict-'));
  const file = join(dir, 'chip.json');
  writeFileSync(file, typeof doc === 'string' ? doc : JSON.stringify(doc, null, 2));
  return file;
}

describe('lagbench predict', () => {
  it('runCli(predict sample) prints R, C and τ in trade units with ratings and the safety caution', async () => {
    const io = captureIo();
    expect(await runCli(['predict', SAMPLE], io)).toBe(0);
    const out = io.stdoutText();
    expect(out).toMatch(/\[mbar\/\(µL\/min\)\]/);
    expect(out).toMatch(/\[nL\/mbar\]/);
    expect(out).toMatch(/time constant τ/);
    expect(out).toMatch(/Pressure ratings \(gauge\): chip 2000 mbar/); // the sample's "chip": "2 bar" rating
    expect(out).toContain(PRESSURE_SAFETY_CAUTION);
    expect(io.stderrText()).toBe('');
  });

  it('runCli(predict --json) gives SI values with ranges that match the §4.3 check value', async () => {
    // physics.md §4.3 [N]: R_up = 1e13, R_down = 2e13 Pa·s/m³, C = 1e-13 m³/Pa → τ = 0.6667 s.
    const file = tempChip({
      format: 'lagbench-chip/1',
      fluid: { preset: 'water', temperature: '20 C' },
      chipBody: { material: 'glass' },
      path: { upstream: [{ type: 'measured', resistance: 1e13 }], chip: [{ type: 'measured', resistance: '3.3333333333 mbar/(uL/min)', compliance: '0.01 uL/mbar' }] },
    });
    const io = captureIo();
    expect(await runCli(['predict', file, '--setup', 'pressure-driven', '--json'], io)).toBe(0);
    const json = JSON.parse(io.stdoutText());
    expect(json.setup).toBe('pressure-driven');
    // 3.3333333333 mbar/(µL/min) × 6e12 = 2e13 Pa·s/m³ and 0.01 µL/mbar = 1e-13 m³/Pa (physics.md §5 [N]).
    expect(json.resistance_Pa_s_per_m3.nominal).toBeCloseTo(3e13, -4);
    expect(json.compliance_m3_per_Pa.nominal).toBeCloseTo(1e-13, 20);
    expect(json.tau_s.nominal).toBeCloseTo(0.6667, 4);
    expect(json.t95_s.nominal).toBeCloseTo(0.6667 * 2.9957, 3); // t95 = 2.9957 τ, physics.md §4.1 [N]
    expect(json.breakdown).toHaveLength(1);
    expect(json.breakdown[0].source).toBe('measured');
    expect(json.safety_caution).toBe(PRESSURE_SAFETY_CAUTION);
    expect(json.pressure_check.unknown).toEqual(['chip', 'bonding', 'tubing', 'fittings']);
  });

  it('runCli(predict --units si) prints Pa·s/m³ and m³/Pa; --compliance-unit picks µL/bar', async () => {
    const io = captureIo();
    expect(await runCli(['predict', SAMPLE, '--units', 'si'], io)).toBe(0);
    expect(io.stdoutText()).toMatch(/\[Pa·s\/m³\]/);
    expect(io.stdoutText()).toMatch(/\[m³\/Pa\]/);
    const io2 = captureIo();
    expect(await runCli(['predict', SAMPLE, '--compliance-unit', 'uL/bar'], io2)).toBe(0);
    expect(io2.stdoutText()).toMatch(/\[µL\/bar\]/);
  });

  it('runCli(predict --pressure above the chip rating) warns not to run at that pressure', async () => {
    const io = captureIo();
    // 2.5 bar exceeds the sample's 2 bar chip and bonding ratings, not tubing (10 bar) or fittings (7 bar).
    expect(await runCli(['predict', SAMPLE, '--pressure', '2.5 bar'], io)).toBe(0);
    expect(io.stdoutText()).toMatch(/WARNING: the node pressure exceeds the stated rating of: chip, bonding/);
  });

  it('runCli(predict) on a description with a bad unit exits 2 with file:line:column and no stack trace', async () => {
    const file = tempChip('{\n  "format": "lagbench-chip/1",\n  "fluid": { "preset": "water", "temperature": "20 parsecs" },\n  "chipBody": { "material": "pdms" },\n  "path": { "chip": [ { "type": "measured", "resistance": 1e13 } ] }\n}\n');
    const io = captureIo();
    expect(await runCli(['predict', file], io)).toBe(2);
    // Column 48 is where the value "20 parsecs" starts on line 3.
    expect(io.stderrText()).toMatch(/chip\.json:3:48: \$\.fluid\.temperature: unknown temperature unit "parsecs"/);
    expect(io.stderrText()).not.toMatch(/at .*\.ts:\d+/);
  });

  it('runCli(predict) on a missing file exits 2 naming the file', async () => {
    const io = captureIo();
    expect(await runCli(['predict', 'no-such-chip.json'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/does not exist/);
  });

  it('runCli(predict) with a bad --setup or no file is a usage error (exit 2)', async () => {
    const io = captureIo();
    expect(await runCli(['predict', SAMPLE, '--setup', 'gravity'], io)).toBe(2);
    expect(io.stderrText()).toMatch(/unknown --setup 'gravity'/);
    const io2 = captureIo();
    expect(await runCli(['predict'], io2)).toBe(2);
    expect(io2.stderrText()).toMatch(/missing the chip description file/);
  });

  it('runCli(predict --help) documents the options', async () => {
    const io = captureIo();
    expect(await runCli(['predict', '--help'], io)).toBe(0);
    expect(io.stdoutText()).toMatch(/--setup/);
    expect(io.stdoutText()).toMatch(/docs\/chip-description\.md/);
  });
});
