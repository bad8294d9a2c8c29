// The shared argument helpers used by inspect, export and the later commands.
import { describe, expect, it } from 'vitest';
import { formatOptionHelp, numberOption, parseCommandArgs, parseValueWithUnit, stringList } from '../../src/cli/args';
import { parseColumnOption, parseImportOptions, parseUtcOffset, importOptionSpecs } from '../../src/cli/import-options';
import { UsageError } from '../../src/cli/io';

describe('parseCommandArgs', () => {
  it('parseCommandArgs reads options, repeated options and positionals', () => {
    const { values, positionals } = parseCommandArgs(['a.csv', '--column', '2=pressure:mbar', 'b.csv', '--column', '3=ignore', '--json'], { ...importOptionSpecs, json: { type: 'boolean', description: '' } });
    expect(positionals).toEqual(['a.csv', 'b.csv']);
    expect(stringList(values, 'column')).toEqual(['2=pressure:mbar', '3=ignore']);
    expect(values.json).toBe(true);
  });

  it('parseCommandArgs(unknown option or missing value) throws UsageError', () => {
    expect(() => parseCommandArgs(['--nope'], importOptionSpecs)).toThrow(UsageError);
    expect(() => parseCommandArgs(['--delimiter'], importOptionSpecs)).toThrow(UsageError);
  });

  it('numberOption refuses text and values below the limit', () => {
    expect(numberOption({ r: '2.5e3' }, 'r')).toBe(2500);
    expect(() => numberOption({ r: 'fast' }, 'r')).toThrow("--r needs a number, not 'fast'");
    expect(() => numberOption({ r: '0' }, 'r', { min: 0, exclusiveMin: true })).toThrow('must be above 0');
  });

  it('formatOptionHelp lists every option with its value name', () => {
    const help = formatOptionHelp(importOptionSpecs);
    for (const name of Object.keys(importOptionSpecs)) expect(help).toContain(`--${name}`);
    expect(help).toContain('<n|name>=<quantity>[:<unit>]');
  });
});

describe('parseValueWithUnit (conversion factors: NIST SP 811 B.8, BIPM SI Brochure 9th ed. Tables 7–8)', () => {
  it('parseValueWithUnit(50mbar) = 5000 Pa; (2.5 µL/min) = 2.5e-9/60 m³/s; (2 min) = 120 s', () => {
    // 1 mbar = 100 Pa (physics.md §5, exact); 1 µL/min = 1e-9/60 m³/s; 1 min = 60 s; 1 kPa = 1e3 Pa.
    expect(parseValueWithUnit('50mbar', 'p', ['pressure'])).toBe(5000);
    expect(parseValueWithUnit('2.5 µL/min', 'q', ['flow'])).toBeCloseTo(2.5e-9 / 60, 24);
    expect(parseValueWithUnit('2 min', 't', ['time'])).toBe(120);
    expect(parseValueWithUnit('3', 'p', ['pressure'], 'kPa')).toBe(3000);
  });

  it('parseValueWithUnit refuses a unit of the wrong kind, an unknown unit, or no unit', () => {
    expect(() => parseValueWithUnit('50 uL/min', 'p', ['pressure'])).toThrow(/not a pressure unit.*Known: Pa/);
    expect(() => parseValueWithUnit('50 atm2', 'p', ['pressure'])).toThrow(UsageError);
    expect(() => parseValueWithUnit('50', 'p', ['pressure'])).toThrow('--p needs a unit, e.g. 50mbar');
  });
});

describe('parseImportOptions', () => {
  it('parseImportOptions maps every option to ImportOptions', () => {
    const { values } = parseCommandArgs(['--delimiter', 'semicolon', '--decimal', 'comma', '--time-column', 'Zeit', '--time-format', 'ms', '--timezone', '+05:30', '--sample-rate', '100', '--column', 'Flow=flow_setpoint:uL/min', '--density', '1260', '--skip-bad-rows', '--sort-time', '--drop-repeated-time'], importOptionSpecs);
    expect(parseImportOptions(values)).toEqual({
      delimiter: ';', decimal: ',', timeColumn: 'Zeit', timeFormat: 'milliseconds', timezoneOffsetMin: 330, sampleRateHz: 100,
      columns: [{ column: 'Flow', quantity: 'flow_setpoint', unit: 'uL/min' }], liquidDensityKgPerM3: 1260,
      skipBadRows: true, sortTime: true, dropRepeatedTime: true,
    });
  });

  it('parseUtcOffset reads +hh:mm, -hhmm and Z', () => {
    // ISO 8601 offsets (from memory): Z = +00:00; −05:00 = −300 min; '+1' is our shorthand for +01:00.
    expect(parseUtcOffset('Z')).toBe(0);
    expect(parseUtcOffset('-0500')).toBe(-300);
    expect(parseUtcOffset('+1')).toBe(60);
    expect(() => parseUtcOffset('Europe/Paris')).toThrow(UsageError);
  });

  it('parseColumnOption refuses an unknown quantity', () => {
    expect(parseColumnOption('3=ignore')).toEqual({ column: 3, quantity: 'ignore' });
    expect(() => parseColumnOption('3=temperature:C')).toThrow(/unknown quantity 'temperature'/);
    expect(() => parseColumnOption('pressure')).toThrow(UsageError);
  });
});
