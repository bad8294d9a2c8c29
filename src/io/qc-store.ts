/**
 * The QC record store: one SQLite file (better-sqlite3 12), default `lagbench-records.sqlite`.
 *
 * - One transaction per chip record: the record row, its input files, results and quantities are
 *   written together or not at all.
 * - Idempotent: a record key (SHA-256 over the input-file hashes, the spec hash, the chip ID, the lot
 *   and the settings) is UNIQUE; recording the same thing again returns `already-recorded`.
 * - Immutable: triggers RAISE(ABORT) on UPDATE or DELETE of any record table. A re-test is a new record.
 */
import Database from 'better-sqlite3';
import { InputError } from '../core/errors';
import type { ChipEvaluation, ChipMeasurement, QcRecord, QcQuantity, MeasuredValue, CheckResult } from '../core/qc/types';
import { QC_SI_UNIT } from '../core/qc/units';
import { computeLotStatistics, controlCharts, latestPerChip, type ControlCharts, type LotStatistics } from '../core/qc/lot-summary';
import { sha256Hex } from './sha256';

export const DEFAULT_QC_STORE = 'lagbench-records.sqlite';
const SCHEMA_VERSION = '1';
const IMMUTABLE = ['qc_spec', 'qc_record', 'qc_input', 'qc_result', 'qc_quantity'];

const SCHEMA = `
CREATE TABLE IF NOT EXISTS qc_meta (key TEXT PRIMARY KEY, value TEXT NOT NULL);
CREATE TABLE IF NOT EXISTS qc_spec (
  sha256 TEXT PRIMARY KEY,
  design TEXT NOT NULL,
  spec_text TEXT NOT NULL
);
CREATE TABLE IF NOT EXISTS qc_record (
  id INTEGER PRIMARY KEY,
  record_key TEXT NOT NULL UNIQUE,
  chip_id TEXT NOT NULL,
  lot TEXT,
  operator TEXT,
  recorded_at TEXT NOT NULL,
  spec_sha256 TEXT NOT NULL REFERENCES qc_spec(sha256),
  software_version TEXT NOT NULL,
  settings_json TEXT NOT NULL,
  verdict TEXT NOT NULL CHECK (verdict IN ('pass','fail','inconclusive')),
  disposition TEXT NOT NULL CHECK (disposition IN ('pass','fail','retest','inconclusive')),
  rule TEXT NOT NULL,
  warnings_json TEXT NOT NULL
);
CREATE INDEX IF NOT EXISTS qc_record_lot ON qc_record(lot, recorded_at);
CREATE INDEX IF NOT EXISTS qc_record_chip ON qc_record(chip_id, recorded_at);
CREATE TABLE IF NOT EXISTS qc_input (
  record_id INTEGER NOT NULL REFERENCES qc_record(id),
  ord INTEGER NOT NULL,
  path TEXT NOT NULL,
  sha256 TEXT NOT NULL CHECK (length(sha256) = 64),
  PRIMARY KEY (record_id, ord)
);
CREATE TABLE IF NOT EXISTS qc_result (
  record_id INTEGER NOT NULL REFERENCES qc_record(id),
  ord INTEGER NOT NULL,
  check_name TEXT NOT NULL,
  label TEXT NOT NULL,
  value REAL,
  ci_lo REAL,
  ci_hi REAL,
  lower_limit REAL,
  upper_limit REAL,
  unit TEXT NOT NULL,
  verdict TEXT NOT NULL CHECK (verdict IN ('pass','fail','inconclusive')),
  reason TEXT NOT NULL,
  PRIMARY KEY (record_id, ord)
);
CREATE TABLE IF NOT EXISTS qc_quantity (
  record_id INTEGER NOT NULL REFERENCES qc_record(id),
  quantity TEXT NOT NULL,
  value REAL NOT NULL,
  standard_error REAL,
  ci_lo REAL,
  ci_hi REAL,
  unit TEXT NOT NULL,
  PRIMARY KEY (record_id, quantity)
);
${IMMUTABLE.map(
  (t) => `
CREATE TRIGGER IF NOT EXISTS ${t}_no_update BEFORE UPDATE ON ${t}
BEGIN SELECT RAISE(ABORT, 'QC records are immutable: ${t} rows cannot be changed (record a re-test instead)'); END;
CREATE TRIGGER IF NOT EXISTS ${t}_no_delete BEFORE DELETE ON ${t}
BEGIN SELECT RAISE(ABORT, 'QC records are immutable: ${t} rows cannot be deleted'); END;`,
).join('')}
`;

/** An open record store. Close it when done. */
export interface QcStore {
  readonly path: string;
  readonly db: Database.Database;
  close: () => void;
}

/**
 * Opens (creating if needed) the store at `path` (':memory:' for tests). A file that is not a
 * Lagbench record store, or one of another schema version, is an {@link InputError}.
 */
export function openQcStore(path: string): QcStore {
  let db: Database.Database;
  try {
    db = new Database(path);
    db.pragma('foreign_keys = ON');
    db.pragma('synchronous = FULL');
    // REPLACE deletes the old row; with recursive triggers that deletion fires the DELETE trigger too.
    db.pragma('recursive_triggers = ON');
    db.exec(SCHEMA);
  } catch (err) {
    throw new InputError('qc-store-unusable', `The QC record store cannot be opened (${err instanceof Error ? err.message : String(err)})`, 'Check that --db names a Lagbench record store (or a new file) in a writable folder', { file: path });
  }
  const version = db.prepare('SELECT value FROM qc_meta WHERE key = ?').get('schema_version') as { value: string } | undefined;
  if (!version) db.prepare('INSERT INTO qc_meta(key, value) VALUES (?, ?)').run('schema_version', SCHEMA_VERSION);
  else if (version.value !== SCHEMA_VERSION) {
    db.close();
    throw new InputError('qc-store-version', `The record store has schema version ${version.value}; this Lagbench reads version ${SCHEMA_VERSION}`, 'Use the Lagbench version that wrote it, or start a new store with --db', { file: path });
  }
  return { path, db, close: () => db.close() };
}

/** Everything one chip record holds. */
export interface RecordChipInput {
  chipId: string;
  lot: string | null;
  operator: string | null;
  /** UTC ISO 8601. */
  recordedAt: string;
  /** The spec file's text exactly as read, and its SHA-256. */
  specText: string;
  specSha256: string;
  specDesign: string;
  inputs: { path: string; sha256: string }[];
  softwareVersion: string;
  /** Settings that shaped the result (chip-ID source, analysis options…): part of the record key. */
  settings: Record<string, unknown>;
  measurement: ChipMeasurement;
  evaluation: ChipEvaluation;
}

export type RecordOutcome = { status: 'recorded'; id: number; recordKey: string } | { status: 'already-recorded'; id: number; recordKey: string };

/** Canonical JSON (sorted keys) so equal settings hash equally. */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).join(',')}]`;
  if (v && typeof v === 'object') {
    return `{${Object.keys(v as object)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
      .join(',')}}`;
  }
  return JSON.stringify(v ?? null);
}

/** The idempotency key: same input hashes + spec hash + chip + lot + settings → same key. */
export function recordKeyOf(input: Pick<RecordChipInput, 'inputs' | 'specSha256' | 'chipId' | 'lot' | 'settings'>): string {
  return sha256Hex(
    canonical({ files: input.inputs.map((f) => f.sha256).sort(), spec: input.specSha256, chip: input.chipId, lot: input.lot, settings: input.settings }),
  );
}

const finiteOrNull = (x: number | null | undefined): number | null => (x === null || x === undefined || !Number.isFinite(x) ? null : x);

/**
 * Writes one chip record in one transaction. Returns `already-recorded` (and writes nothing)
 * when the same inputs, spec, chip, lot and settings were recorded before.
 */
export function recordChip(store: QcStore, input: RecordChipInput): RecordOutcome {
  const db = store.db;
  const recordKey = recordKeyOf(input);
  const tx = db.transaction((): RecordOutcome => {
    const existing = db.prepare('SELECT id FROM qc_record WHERE record_key = ?').get(recordKey) as { id: number } | undefined;
    if (existing) return { status: 'already-recorded', id: existing.id, recordKey };
    db.prepare('INSERT OR IGNORE INTO qc_spec(sha256, design, spec_text) VALUES (?, ?, ?)').run(input.specSha256, input.specDesign, input.specText);
    const info = db
      .prepare(
        `INSERT INTO qc_record(record_key, chip_id, lot, operator, recorded_at, spec_sha256, software_version, settings_json, verdict, disposition, rule, warnings_json)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        recordKey, input.chipId, input.lot, input.operator, input.recordedAt, input.specSha256, input.softwareVersion,
        canonical(input.settings), input.evaluation.verdict, input.evaluation.disposition, input.evaluation.rule,
        JSON.stringify(input.measurement.warnings),
      );
    const id = Number(info.lastInsertRowid);
    const insInput = db.prepare('INSERT INTO qc_input(record_id, ord, path, sha256) VALUES (?, ?, ?, ?)');
    input.inputs.forEach((f, k) => insInput.run(id, k, f.path, f.sha256));
    const insResult = db.prepare(
      `INSERT INTO qc_result(record_id, ord, check_name, label, value, ci_lo, ci_hi, lower_limit, upper_limit, unit, verdict, reason)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    );
    input.evaluation.results.forEach((r, k) =>
      insResult.run(id, k, r.check, r.label, finiteOrNull(r.value), finiteOrNull(r.ci95?.[0]), finiteOrNull(r.ci95?.[1]), finiteOrNull(r.lower), finiteOrNull(r.upper), r.unit, r.verdict, r.reason),
    );
    const insQ = db.prepare('INSERT INTO qc_quantity(record_id, quantity, value, standard_error, ci_lo, ci_hi, unit) VALUES (?, ?, ?, ?, ?, ?, ?)');
    for (const [q, mv] of Object.entries(input.measurement.quantities) as [QcQuantity, MeasuredValue | undefined][]) {
      if (!mv || !Number.isFinite(mv.value)) continue;
      insQ.run(id, q, mv.value, finiteOrNull(mv.standardError), finiteOrNull(mv.ci95?.[0]), finiteOrNull(mv.ci95?.[1]), QC_SI_UNIT[q]);
    }
    return { status: 'recorded', id, recordKey };
  });
  return tx.immediate();
}

export interface HistoryQuery {
  lot?: string;
  chip?: string;
  /** Only records at or after this UTC ISO time. */
  since?: string;
}

interface RecordRow {
  id: number;
  chip_id: string;
  lot: string | null;
  operator: string | null;
  recorded_at: string;
  spec_sha256: string;
  design: string;
  software_version: string;
  settings_json: string;
  verdict: QcRecord['verdict'];
  disposition: QcRecord['disposition'];
  rule: string;
}

/** Records matching the query, oldest first, with inputs, results and quantities. */
export function queryHistory(store: QcStore, query: HistoryQuery = {}): QcRecord[] {
  const where: string[] = [];
  const args: string[] = [];
  const filter = (sql: string, value: string | undefined): void => {
    if (value === undefined) return;
    where.push(sql);
    args.push(value);
  };
  filter('r.lot = ?', query.lot);
  filter('r.chip_id = ?', query.chip);
  filter('r.recorded_at >= ?', query.since);
  const rows = store.db
    .prepare(
      `SELECT r.id, r.chip_id, r.lot, r.operator, r.recorded_at, r.spec_sha256, s.design, r.software_version, r.settings_json,
              r.verdict, r.disposition, r.rule
       FROM qc_record r JOIN qc_spec s ON s.sha256 = r.spec_sha256
       ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
       ORDER BY r.recorded_at, r.id`,
    )
    .all(...args) as RecordRow[];
  const inputsQ = store.db.prepare('SELECT path, sha256 FROM qc_input WHERE record_id = ? ORDER BY ord');
  const resultsQ = store.db.prepare('SELECT * FROM qc_result WHERE record_id = ? ORDER BY ord');
  const quantQ = store.db.prepare('SELECT * FROM qc_quantity WHERE record_id = ?');
  return rows.map((r) => {
    const results = (resultsQ.all(r.id) as Record<string, unknown>[]).map(
      (x): CheckResult => ({
        check: x.check_name as string,
        label: x.label as string,
        value: x.value as number | null,
        ci95: x.ci_lo === null || x.ci_hi === null ? null : [x.ci_lo as number, x.ci_hi as number],
        lower: x.lower_limit as number | null,
        upper: x.upper_limit as number | null,
        unit: x.unit as string,
        verdict: x.verdict as CheckResult['verdict'],
        reason: x.reason as string,
      }),
    );
    const quantities: QcRecord['quantities'] = {};
    for (const x of quantQ.all(r.id) as Record<string, unknown>[]) {
      quantities[x.quantity as QcQuantity] = {
        value: x.value as number,
        standardError: x.standard_error as number | null,
        ci95: x.ci_lo === null || x.ci_hi === null ? null : [x.ci_lo as number, x.ci_hi as number],
      };
    }
    return {
      id: r.id,
      chipId: r.chip_id,
      lot: r.lot,
      operator: r.operator,
      recordedAt: r.recorded_at,
      specSha256: r.spec_sha256,
      specDesign: r.design,
      softwareVersion: r.software_version,
      settings: JSON.parse(r.settings_json) as Record<string, unknown>,
      inputs: inputsQ.all(r.id) as { path: string; sha256: string }[],
      verdict: r.verdict,
      disposition: r.disposition,
      rule: r.rule,
      results,
      quantities,
    };
  });
}

/** The spec text a record was judged by (as stored). */
export function storedSpecText(store: QcStore, sha256: string): string | null {
  const row = store.db.prepare('SELECT spec_text FROM qc_spec WHERE sha256 = ?').get(sha256) as { spec_text: string } | undefined;
  return row?.spec_text ?? null;
}

/** Lot statistics (newest record per chip) and control charts of R, C and τ across all lots in the store. */
export function lotStatistics(store: QcStore, lot: string): { statistics: LotStatistics; charts: ControlCharts[] } {
  const records = latestPerChip(queryHistory(store, { lot }));
  const all = queryHistory(store);
  const latestAll: typeof all = [];
  const lots = [...new Set(all.map((r) => r.lot ?? ''))];
  for (const l of lots) latestAll.push(...latestPerChip(all.filter((r) => (r.lot ?? '') === l)));
  return {
    statistics: computeLotStatistics(lot, records),
    charts: (['resistance', 'compliance', 'tau'] as const).map((q) => controlCharts(latestAll, q)),
  };
}
