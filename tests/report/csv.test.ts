import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { csvCell, toCsv } from '../../src/report/csv';
import { chipChecksCsv } from '../../src/report/exports';
import { reportInput } from './fixtures';

// OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): cells starting with
// = + - @ tab or CR are prefixed with a single quote; numbers stay numbers.
describe('csvCell', () => {
  it.each([
    ['=HYPERLINK("http://evil.example","click")', `"'=HYPERLINK(""http://evil.example"",""click"")"`],
    ['+1', `"'+1"`],
    ['-cmd|/c calc', `"'-cmd|/c calc"`],
    ['@SUM(A1:A9)', `"'@SUM(A1:A9)"`],
    ['\tx', `"'\tx"`],
    ['\rx', `"'\rx"`],
  ])('csvCell(%j) neutralises the formula start', (input, want) => {
    expect(csvCell(input)).toBe(want);
  });

  it('csvCell keeps numbers (negative, exponent) and plain numeric text as numbers', () => {
    expect(csvCell(-3.5)).toBe('-3.5');
    expect(csvCell(1e-12)).toBe('1e-12');
    expect(csvCell('-3.5')).toBe('-3.5');
    expect(csvCell('1e-12')).toBe('1e-12');
    expect(csvCell(Number.NaN)).toBe('');
    expect(csvCell('M2-001')).toBe('M2-001');
    expect(csvCell('a,b')).toBe('"a,b"');
  });

  it('toCsv output read back by papaparse (reference parser) gives neutralised text and real numbers', () => {
    const csv = toCsv(['a', 'b', 'c', 'd'], [['=1+1', -3.5, 1e-12, 'x "quoted", y'], ['-2+3', '-3.5', '@A1', '\r\n']]);
    const parsed = Papa.parse<unknown[]>(csv.trimEnd(), { dynamicTyping: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[1]).toEqual(["'=1+1", -3.5, 1e-12, 'x "quoted", y']);
    expect(parsed.data[2]).toEqual(["'-2+3", -3.5, "'@A1", "'\r\n"]);
  });
});

describe('chipChecksCsv', () => {
  it('chipChecksCsv writes one row per check with SI numbers that parse back exactly', () => {
    const input = reportInput('=cmd');
    const parsed = Papa.parse<Record<string, unknown>>(chipChecksCsv(input).trimEnd(), { header: true, dynamicTyping: true });
    expect(parsed.data).toHaveLength(input.evaluation.results.length);
    // Expected: the fixture's invented values; lower limit = 2.0e13 × (1 − 10 %) = 1.8e13 (derivation).
    expect(parsed.data[0]).toMatchObject({ chip_id: "'=cmd", check: 'resistance', value: 2e13, ci95_lo: 1.98e13, lower_limit: 1.8e13, verdict: 'pass' });
  });
});
