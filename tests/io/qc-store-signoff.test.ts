import { afterEach, describe, expect, it } from 'vitest';
import { openQcStore, queryHistory, type QcStore } from '../../src/io/qc-store';
import { signOffChip, type SignOffInput } from '../../src/io/qc-signoff';
import { sha256Hex } from '../../src/io/sha256';
import { chip, SPEC, SPEC_TEXT } from './qc-store-fixtures';

let store: QcStore | null = null;
afterEach(() => store?.close());

function input(over: Partial<SignOffInput> = {}): SignOffInput {
  const m = chip('M2-010', 2.0e13, 80e-12); // 80 nL of air against a 50 nL limit: fails (fixture spec)
  return {
    spec: SPEC, specText: SPEC_TEXT, specSha256: sha256Hex(SPEC_TEXT), chipId: 'M2-010',
    chip: { measurement: m, steps: [], nominal: null, trappedAirNote: 'excess-compliance' },
    inputs: [{ path: 'M2-010.csv', sha256: 'd'.repeat(64) }], lot: 'L7', operator: 'first operator', softwareVersion: '0.1.0',
    settings: { chip_id_from: null }, recordedAt: '2026-12-01T09:00:00.000Z', ...over,
  };
}

describe('signOffChip', () => {
  it('signOffChip evaluates, records and returns a report input with the traceability block', () => {
    store = openQcStore(':memory:');
    const r = signOffChip(store, input());
    expect(r.evaluation.verdict).toBe('fail');
    expect(r.record.status).toBe('recorded');
    expect(r.report.trace).toMatchObject({ chipId: 'M2-010', lot: 'L7', operator: 'first operator', record: { status: 'recorded', id: r.record.id, store: ':memory:' } });
    expect(r.report.trappedAir?.note).toBe('excess-compliance');
    expect(queryHistory(store)).toHaveLength(1);
  });

  it('signOffChip(same inputs again) reuses the record and shows its original time and operator', () => {
    store = openQcStore(':memory:');
    signOffChip(store, input());
    const again = signOffChip(store, input({ operator: 'second operator', recordedAt: '2026-12-02T09:00:00.000Z' }));
    expect(again.record.status).toBe('already-recorded');
    expect(again.report.trace.operator).toBe('first operator');
    expect(again.report.trace.recordedAt).toBe('2026-12-01T09:00:00.000Z');
    expect(queryHistory(store)).toHaveLength(1);
  });
});
