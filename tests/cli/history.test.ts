import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseSince } from '../../src/cli/commands/history';
import { runCli } from '../../src/cli/main';
import { openQcStore, recordChip } from '../../src/io/qc-store';
import { captureIo } from '../helpers/cli-io';
import { chip, recordInput } from '../io/qc-store-fixtures';

describe('parseSince', () => {
  it('parseSince reads ISO 8601 dates and times as UTC unless an offset is given (ISO 8601 / RFC 3339)', () => {
    expect(parseSince('2026-12-01')).toBe('2026-12-01T00:00:00.000Z');
    expect(parseSince('2026-12-01T08:30')).toBe('2026-12-01T08:30:00.000Z');
    expect(parseSince('2026-12-01T08:30+02:00')).toBe('2026-12-01T06:30:00.000Z');
  });

  it('parseSince rejects what is not a date', () => {
    // Month 13 does not exist; '12/01/2026' is not ISO 8601 (ambiguous day/month order).
    for (const bad of ['yesterday', '2026-13-45', '12/01/2026']) expect(() => parseSince(bad)).toThrow(/not a date/);
  });
});

describe('lagbench history', () => {
  it('history prints the records as a table with hostile text kept as text, and --csv neutralises it', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbench-hist-'));
    try {
      const store = openQcStore(join(dir, 'lagbench-records.sqlite'));
      recordChip(store, recordInput(chip('=HYPERLINK("x")', 2e13, 1e-12), { operator: '@SUM(A1)', lot: '-L1' }));
      store.close();
      const t = captureIo(dir);
      expect(await runCli(['history'], t)).toBe(0);
      // CSV cells neutralised per OWASP "CSV Injection" (leading ' before = + - @); the table keeps text as text.
      expect(t.stdoutText()).toContain('=HYPERLINK("x")');
      expect(t.stdoutText()).toContain('1 record(s).');
      const c = captureIo(dir);
      expect(await runCli(['history', '--csv'], c)).toBe(0);
      const row = c.stdoutText().split('\r\n')[1] ?? '';
      expect(row).toContain(`"'=HYPERLINK(""x"")"`);
      expect(row).toContain(`"'@SUM(A1)"`);
      expect(row).toContain(`"'-L1"`);
      expect(row).toMatch(/,20000000000000,/); // R stays a plain number (the fixture's 2e13 Pa·s/m³)
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
