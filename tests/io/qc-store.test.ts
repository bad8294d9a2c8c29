import { afterEach, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { lotStatistics, openQcStore, queryHistory, recordChip, type QcStore } from '../../src/io/qc-store';
import { chip, recordInput } from './qc-store-fixtures';

const stores: QcStore[] = [];
const dirs: string[] = [];
const mem = (): QcStore => {
  const s = openQcStore(':memory:');
  stores.push(s);
  return s;
};
afterEach(() => {
  for (const s of stores.splice(0)) s.close();
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});
const count = (s: QcStore, table: string): number => (s.db.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;

// Storage behaviour of our own (append-only QC record, docs/qc-spec.md); expected values are the inputs stored.
describe('recordChip / queryHistory', () => {
  it('recordChip then queryHistory round-trips every field (values, CIs, verdicts, reasons, inputs, settings)', () => {
    const s = mem();
    const input = recordInput(chip('M2-001', 2.0e13, 10e-12));
    const out = recordChip(s, input);
    expect(out.status).toBe('recorded');
    const [rec] = queryHistory(s);
    expect(rec).toMatchObject({
      chipId: 'M2-001', lot: 'L-2026-01', operator: 'A. Tester', recordedAt: '2026-12-01T10:00:00.000Z',
      specSha256: input.specSha256, specDesign: 'PDMS mixer M2 (test)', softwareVersion: '0.1.0',
      settings: input.settings, inputs: input.inputs, verdict: 'pass', disposition: 'pass', rule: input.evaluation.rule,
    });
    expect(rec?.results).toEqual(input.evaluation.results);
    expect(rec?.quantities.resistance).toEqual(input.measurement.quantities.resistance);
    expect(rec?.quantities.compliance?.value).toBe(input.measurement.quantities.compliance?.value);
  });

  it('recordChip(same inputs, spec and settings) twice reports already-recorded and writes nothing', () => {
    const s = mem();
    const input = recordInput(chip('M2-001', 2.0e13, 10e-12));
    const a = recordChip(s, input);
    const b = recordChip(s, { ...input, operator: 'someone else', recordedAt: '2026-12-02T00:00:00.000Z' });
    expect(b).toEqual({ status: 'already-recorded', id: a.id, recordKey: a.recordKey });
    expect(count(s, 'qc_record')).toBe(1);
    expect(count(s, 'qc_result')).toBe(input.evaluation.results.length);
  });

  it('recordChip(new input file hash = re-test, or other settings) makes a new record', () => {
    const s = mem();
    const input = recordInput(chip('M2-001', 2.0e13, 10e-12));
    recordChip(s, input);
    expect(recordChip(s, { ...input, inputs: [{ path: 'logs/M2-001_retest.csv', sha256: 'b'.repeat(64) }] }).status).toBe('recorded');
    expect(recordChip(s, { ...input, settings: { ...input.settings, analysis: { terms: 1 } } }).status).toBe('recorded');
    expect(queryHistory(s, { chip: 'M2-001' })).toHaveLength(3);
  });

  it('UPDATE or DELETE of a record is aborted by the immutability triggers', () => {
    const s = mem();
    recordChip(s, recordInput(chip('M2-001', 2.0e13, 80e-12)));
    expect(() => s.db.prepare("UPDATE qc_record SET verdict = 'pass'").run()).toThrow(/immutable/);
    expect(() => s.db.prepare("UPDATE qc_result SET verdict = 'pass'").run()).toThrow(/immutable/);
    expect(() => s.db.prepare('DELETE FROM qc_record').run()).toThrow(/immutable/);
    expect(() => s.db.prepare('DELETE FROM qc_input').run()).toThrow(/immutable/);
    expect(() => s.db.prepare('UPDATE qc_quantity SET value = 0').run()).toThrow(/immutable/);
    expect(() => s.db.prepare('DELETE FROM qc_spec').run()).toThrow(/immutable/);
    // REPLACE deletes the conflicting row first: the DELETE trigger must stop it too.
    expect(() => s.db.prepare("INSERT OR REPLACE INTO qc_result SELECT record_id, ord, check_name, label, value, ci_lo, ci_hi, lower_limit, upper_limit, unit, 'pass', reason FROM qc_result").run()).toThrow(/immutable/);
    expect(queryHistory(s)[0]?.verdict).toBe('fail');
  });

  it('a throw inside the transaction (3rd result row invalid) leaves no row of that record; the batch goes on', () => {
    const s = mem();
    const good1 = recordInput(chip('M2-001', 2.0e13, 10e-12));
    const bad = recordInput(chip('M2-002', 2.0e13, 10e-12));
    // Corrupt a late row: the record, input and first results are inserted before the CHECK constraint fires.
    bad.evaluation = { ...bad.evaluation, results: [...bad.evaluation.results, { ...bad.evaluation.results[0]!, verdict: 'maybe' as never }] };
    const good2 = recordInput(chip('M2-003', 2.0e13, 10e-12));
    const outcomes: string[] = [];
    for (const input of [good1, bad, good2]) {
      try {
        outcomes.push(recordChip(s, input).status);
      } catch {
        outcomes.push('error');
      }
    }
    expect(outcomes).toEqual(['recorded', 'error', 'recorded']);
    expect(queryHistory(s).map((r) => r.chipId)).toEqual(['M2-001', 'M2-003']);
    expect(count(s, 'qc_record')).toBe(2);
    expect(count(s, 'qc_input')).toBe(2);
    expect(count(s, 'qc_result')).toBe(good1.evaluation.results.length + good2.evaluation.results.length);
    expect(count(s, 'qc_quantity')).toBe(6); // 2 stored records × 3 quantities of the fixture chip
  });

  it('openQcStore(file) persists records across reopen', () => {
    const dir = mkdtempSync(join(tmpdir(), 'qcstore-'));
    dirs.push(dir);
    const file = join(dir, 'records.sqlite');
    const a = openQcStore(file);
    recordChip(a, recordInput(chip('M2-001', 2.0e13, 10e-12)));
    a.close();
    const b = openQcStore(file);
    stores.push(b);
    expect(queryHistory(b).map((r) => r.chipId)).toEqual(['M2-001']);
  });

  it('queryHistory filters by lot, chip and since', () => {
    const s = mem();
    recordChip(s, recordInput(chip('A1', 2e13, 1e-12), { lot: 'A', recordedAt: '2026-11-01T00:00:00.000Z' }));
    recordChip(s, recordInput(chip('A2', 2e13, 1e-12), { lot: 'A', recordedAt: '2026-11-20T00:00:00.000Z' }));
    recordChip(s, recordInput(chip('B1', 2e13, 1e-12), { lot: 'B', recordedAt: '2026-11-21T00:00:00.000Z' }));
    expect(queryHistory(s, { lot: 'A' }).map((r) => r.chipId)).toEqual(['A1', 'A2']);
    expect(queryHistory(s, { chip: 'B1' }).map((r) => r.lot)).toEqual(['B']);
    expect(queryHistory(s, { since: '2026-11-15T00:00:00.000Z' }).map((r) => r.chipId)).toEqual(['A2', 'B1']);
  });
});

describe('openQcStore', () => {
  it('openQcStore(a file that is not a database) throws a located InputError', () => {
    const dir = mkdtempSync(join(tmpdir(), 'qcstore-'));
    dirs.push(dir);
    const file = join(dir, 'notes.txt');
    writeFileSync(file, 'this is not sqlite '.repeat(100));
    expect(() => openQcStore(file)).toThrow(/cannot be opened/);
  });
});

describe('lotStatistics', () => {
  it('lotStatistics gives mean, SD, n and Cpk of R against the spec limits (worked by hand)', () => {
    const s = mem();
    const rs = [1.9e13, 2.0e13, 2.1e13];
    rs.forEach((r, k) => recordChip(s, recordInput(chip(`A${k}`, r, 1e-12), { lot: 'A', recordedAt: `2026-11-0${k + 1}T00:00:00.000Z` })));
    recordChip(s, recordInput(chip('B0', 2.3e13, 1e-12), { lot: 'B', recordedAt: '2026-11-05T00:00:00.000Z' }));
    const { statistics, charts } = lotStatistics(s, 'A');
    const r = statistics.quantities.find((q) => q.quantity === 'resistance')!;
    // Derivation: μ = 2.0e13, σ = 1e12 (n − 1); limits 1.8e13..2.2e13 → Cpk = 2e12/(3e12) = 0.6667, Cp = 4e12/6e12.
    expect(r.stats.n).toBe(3);
    expect(r.stats.mean).toBeCloseTo(2.0e13, -1);
    expect(r.stats.sd).toBeCloseTo(1e12, -1);
    expect(r.capability?.cpk).toBeCloseTo(2 / 3, 9);
    expect(r.capability?.cp).toBeCloseTo(2 / 3, 9);
    // Every lot-A chip passes: R CI ±1 % of 1.9–2.1e13 lies inside 1.8–2.2e13; 1 nL of air is below 50 nL.
    expect(statistics.counts).toEqual({ pass: 3, fail: 0, retest: 0, inconclusive: 0 });
    const rc = charts.find((c) => c.quantity === 'resistance')!;
    expect(rc.individuals.points.map((p) => p.label)).toEqual(['A0', 'A1', 'A2', 'B0']);
    expect(rc.lotMeans.points.map((p) => p.group)).toEqual(['A', 'B']);
  });
});
