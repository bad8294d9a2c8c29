// The what-if computation the desktop view runs in its worker (src/ui/worker/whatif-bridge.ts).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors';
import { parseDrive, runWhatIf } from '../../src/ui/worker/whatif-bridge';

const chip = (name: string): string => readFileSync(join(process.cwd(), 'sample-logs', 'chips', name), 'utf8');

describe('parseDrive', () => {
  it('parseDrive converts flows and pressures to SI and leaves an empty field to the default', () => {
    // 1 µL = 1e-9 m³, 1 min = 60 s, 1 mbar = 100 Pa (NIST SP 811, appendix B).
    expect(parseDrive('10 uL/min', 'flow-driven')).toBeCloseTo(10e-9 / 60, 20);
    expect(parseDrive('200 mbar', 'pressure-driven')).toBeCloseTo(2e4, 9);
    expect(parseDrive('  ', 'flow-driven')).toBeNull();
  });

  it('parseDrive rejects a bare number or the wrong kind of quantity with an InputError', () => {
    expect(() => parseDrive('10', 'flow-driven')).toThrow(InputError);
    expect(() => parseDrive('200 mbar', 'flow-driven')).toThrow(InputError);
    expect(() => parseDrive('10 uL/min', 'pressure-driven')).toThrow(InputError);
  });
});

describe('runWhatIf', () => {
  it('runWhatIf gives one row and one response per value; a one-node flow-driven response reaches 1 − 1/e at τ', () => {
    const v = runWhatIf({ chipText: chip('pdms-mixer.json'), chipName: 'pdms-mixer.json', setup: 'flow-driven', vary: 'bubble.volume=0:4uL:3', driveText: '', targetT95S: null });
    expect(v.rows).toHaveLength(3);
    expect(v.curves).toHaveLength(3);
    expect(v.driveSI).toBeCloseTo(10e-9 / 60, 20);
    // First-order step response y = 1 − exp(−t/τ): 63.2 % at t = τ (any control-engineering text,
    // e.g. Ogata, Modern Control Engineering, first-order systems). Bubble-free design, linear network.
    const row = v.rows[0]!;
    const c = v.curves[0]!;
    const k = c.tS.findIndex((t) => t >= row.tauS.nominal);
    const [t0, t1, f0, f1] = [c.tS[k - 1]!, c.tS[k]!, c.fraction[k - 1]!, c.fraction[k]!];
    const atTau = f0 + ((f1 - f0) * (row.tauS.nominal - t0)) / (t1 - t0);
    expect(atTau).toBeCloseTo(1 - Math.exp(-1), 2);
    // More trapped air, more compliance, slower settling.
    expect(v.rows[2]!.tauS.nominal).toBeGreaterThan(v.rows[1]!.tauS.nominal);
    expect(v.rows[1]!.tauS.nominal).toBeGreaterThan(v.rows[0]!.tauS.nominal);
    // Every response is past 95 % at its end (1.5 × the slowest t95, by the definition of t95).
    for (const cv of v.curves) expect(cv.fraction.at(-1)!).toBeGreaterThanOrEqual(0.95);
  });

  it('runWhatIf drives a pressure-driven sweep at the description\'s operating pressure when none is given', () => {
    const text = chip('glass-chip-pressure.json');
    const v = runWhatIf({ chipText: text, chipName: 'glass-chip-pressure.json', setup: 'pressure-driven', vary: 'bubble.volume=0:1uL:2', driveText: '', targetT95S: 1e6 });
    const op = /"operatingPressure":\s*"(\d+(?:\.\d+)?) mbar"/.exec(text);
    expect(op).not.toBeNull();
    expect(v.driveSI).toBeCloseTo(Number(op![1]) * 100, 6);
    expect(v.rows.every((r) => r.meetsTarget === true)).toBe(true);
  });

  it('runWhatIf reports a bad sweep as an InputError', () => {
    expect(() => runWhatIf({ chipText: chip('pdms-mixer.json'), chipName: 'x.json', setup: 'flow-driven', vary: 'bubble.length=0:1uL', driveText: '', targetT95S: null })).toThrow(InputError);
  });
});
