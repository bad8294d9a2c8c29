/**
 * The QC sign-off part of the IPC contract (re-exported by electron/ipc.ts): channels, argument and
 * result types, and the validators main applies before it touches the record store. The same handlers
 * (electron/handlers/qc-handlers.ts) serve the desktop app and, in the browser tests, a local HTTP
 * bridge on 127.0.0.1 (tests/e2e/bridge-server.ts).
 */
import type { ChipEvaluation, QcRecord } from '../src/core/qc/types';
import type { AnalysedChip } from '../src/report/chip-input';
import type { ChipReportInput, LotReportInput } from '../src/report/types';

/** Whether records can be kept here, and where. */
export type QcInfo =
  | { available: true; storePath: string; softwareVersion: string; via: 'desktop' | 'bridge' }
  | { available: false; reason: string };

/** One chip to sign off: the analysed chip (from the renderer's analysis worker) and who signs. */
export interface SignOffRequest {
  /** The spec file's text exactly as read (main parses it and hashes it). */
  specText: string;
  /** The spec's file name, for messages and the settings. */
  specName: string;
  chipId: string;
  lot: string | null;
  operator: string | null;
  chip: AnalysedChip;
  /** Every input with its SHA-256 (the log(s) first, then the chip description). */
  inputs: { path: string; sha256: string }[];
  /** Analysis settings recorded with the chip (setup, fit model, chip description name). */
  settings: Record<string, unknown>;
}

export interface SignOffReply {
  evaluation: ChipEvaluation;
  record: { status: 'recorded' | 'already-recorded'; id: number };
  /** Report input with traceability (render with renderChipReportHtml / chipChecksCsv). */
  report: ChipReportInput;
}

/** History filters; `since` is a UTC date (YYYY-MM-DD) or ISO time. */
export interface QcHistoryQuery {
  lot?: string;
  chip?: string;
  since?: string;
}

/** What `window.lagbench.qc` offers (absent or unavailable in a plain browser without the bridge). */
export interface QcApi {
  info(): Promise<QcInfo>;
  signOff(request: SignOffRequest): Promise<SignOffReply>;
  history(query: QcHistoryQuery): Promise<QcRecord[]>;
  /** Lot statistics, control charts across lots and the newest record per chip, for the lot report. */
  lotReport(lot: string): Promise<LotReportInput>;
  /** Saves a CSV export atomically where the user chooses (a download in the browser). */
  saveCsv(suggestedName: string, csv: string): Promise<{ path: string } | null>;
}

export const QC_CHANNELS = {
  info: 'lagbench:qc-info',
  signOff: 'lagbench:qc-sign-off',
  history: 'lagbench:qc-history',
  lotReport: 'lagbench:qc-lot-report',
  saveCsv: 'lagbench:qc-save-csv',
} as const;

export type QcChannel = (typeof QC_CHANNELS)[keyof typeof QC_CHANNELS];

export interface QcChannelArgs {
  'lagbench:qc-info': [];
  'lagbench:qc-sign-off': [request: SignOffRequest];
  'lagbench:qc-history': [query: QcHistoryQuery];
  'lagbench:qc-lot-report': [lot: string];
  'lagbench:qc-save-csv': [suggestedName: string, csv: string];
}

export interface QcChannelResults {
  'lagbench:qc-info': QcInfo;
  'lagbench:qc-sign-off': SignOffReply;
  'lagbench:qc-history': QcRecord[];
  'lagbench:qc-lot-report': LotReportInput;
  'lagbench:qc-save-csv': { path: string } | null;
}

/** Largest spec text: 1 MB (a spec is a page of JSON). */
export const MAX_SPEC_CHARS = 1_000_000;
/** Largest analysed chip sent for sign-off (step plots of ≤ 400 points each): 20 MB of JSON. */
export const MAX_CHIP_JSON_CHARS = 20_000_000;
/** Largest CSV export: 50 MB. */
export const MAX_CSV_CHARS = 50_000_000;
/** Most inputs per record (two logs and a chip description, with room). */
export const MAX_QC_INPUTS = 4;

/** Thrown when the renderer (or a bridge client) sends QC arguments of the wrong shape. */
export class QcArgumentError extends Error {
  override readonly name = 'QcArgumentError';
}

const CONTROL = /[\u0000-\u001f\u007f]/;

function isLabel(v: unknown, max = 200): v is string {
  return typeof v === 'string' && v.trim().length > 0 && v.length <= max && !CONTROL.test(v);
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && Object.getPrototypeOf(v) === Object.prototype;
}

/** Plain JSON-like data only (no functions, class instances or cycles), at most `depth` levels. */
function isPlainData(v: unknown, depth = 10): boolean {
  if (v === null || typeof v === 'string' || typeof v === 'number' || typeof v === 'boolean') return true;
  if (depth <= 0) return false;
  if (Array.isArray(v)) return v.every((x) => isPlainData(x, depth - 1));
  if (isObject(v)) return Object.values(v).every((x) => isPlainData(x, depth - 1));
  return false;
}

function jsonSize(v: unknown): number {
  try {
    return JSON.stringify(v)?.length ?? 0;
  } catch {
    return Number.POSITIVE_INFINITY;
  }
}

const isNumOrNull = (v: unknown): boolean => v === null || typeof v === 'number';

function isMeasuredValue(v: unknown): boolean {
  if (!isObject(v) || typeof v.value !== 'number' || !isNumOrNull(v.standardError)) return false;
  return v.ci95 === null || (Array.isArray(v.ci95) && v.ci95.length === 2 && v.ci95.every((x) => typeof x === 'number' || x === null));
}

function checkChip(chip: unknown, chipId: string, fail: (what: string) => never): void {
  if (!isObject(chip) || !isPlainData(chip)) fail('chip must be plain data');
  const c = chip as Record<string, unknown>;
  if (jsonSize(c) > MAX_CHIP_JSON_CHARS) fail(`chip data must be at most ${MAX_CHIP_JSON_CHARS} characters as JSON`);
  const m = c.measurement;
  if (!isObject(m)) fail('chip.measurement must be an object');
  const meas = m as Record<string, unknown>;
  if (meas.chipId !== chipId) fail('chip.measurement.chipId must equal chipId');
  if (!isObject(meas.quantities) || !Object.values(meas.quantities).every(isMeasuredValue)) fail('chip.measurement.quantities must map quantities to {value, standardError, ci95}');
  if (meas.fit !== null && !(isObject(meas.fit) && typeof meas.fit.converged === 'boolean' && isNumOrNull(meas.fit.r2) && Array.isArray(meas.fit.flags) && meas.fit.flags.every((f) => typeof f === 'string'))) fail('chip.measurement.fit must be null or {converged, r2, flags}');
  if (!Array.isArray(meas.inconclusive) || !Array.isArray(meas.warnings)) fail('chip.measurement.inconclusive and .warnings must be arrays');
  if (!Array.isArray(c.steps) || c.steps.length > 200) fail('chip.steps must be an array of at most 200 step plots');
  if (c.nominal !== null && !isObject(c.nominal)) fail('chip.nominal must be null or an object');
  if (c.trappedAirNote !== null && typeof c.trappedAirNote !== 'string') fail('chip.trappedAirNote must be null or a string');
}

function optionalFilter(q: Record<string, unknown>, key: string, fail: (what: string) => never): void {
  if (q[key] !== undefined && !isLabel(q[key])) fail(`${key} must be a non-empty string of at most 200 characters without control characters`);
}

/** Checks a QC channel's arguments and returns them typed; throws {@link QcArgumentError}. */
export function validateQcArgs<C extends QcChannel>(channel: C, args: unknown[]): QcChannelArgs[C] {
  const fail = (what: string): never => {
    throw new QcArgumentError(`${channel}: ${what}`);
  };
  switch (channel) {
    case QC_CHANNELS.info:
      if (args.length !== 0) fail(`expects no arguments, got ${args.length}`);
      return [] as unknown as QcChannelArgs[C];
    case QC_CHANNELS.signOff: {
      if (args.length !== 1) fail(`expects one argument (the sign-off request), got ${args.length}`);
      const r = args[0];
      if (!isObject(r)) fail('the request must be an object');
      const q = r as Record<string, unknown>;
      const known = ['specText', 'specName', 'chipId', 'lot', 'operator', 'chip', 'inputs', 'settings'];
      const extra = Object.keys(q).filter((k) => !known.includes(k));
      if (extra.length) fail(`unknown field(s): ${extra.join(', ')}`);
      if (typeof q.specText !== 'string' || q.specText.length === 0 || q.specText.length > MAX_SPEC_CHARS) fail(`specText must be the spec file's text (1 to ${MAX_SPEC_CHARS} characters)`);
      if (!isLabel(q.specName)) fail('specName must be a file name of 1–200 characters without control characters');
      if (!isLabel(q.chipId, 100)) fail('chipId must be 1–100 characters without control characters');
      if (q.lot !== null && !isLabel(q.lot)) fail('lot must be null or 1–200 characters without control characters');
      if (q.operator !== null && !isLabel(q.operator)) fail('operator must be null or 1–200 characters without control characters');
      if (!Array.isArray(q.inputs) || q.inputs.length < 1 || q.inputs.length > MAX_QC_INPUTS) fail(`inputs must list 1 to ${MAX_QC_INPUTS} files`);
      for (const i of q.inputs as unknown[]) {
        if (!isObject(i) || typeof i.path !== 'string' || i.path.length === 0 || i.path.length > 4096 || i.path.includes('\u0000') || typeof i.sha256 !== 'string' || !/^[0-9a-f]{64}$/.test(i.sha256)) fail('every input must be {path, sha256} with a 64-hex-digit SHA-256');
      }
      if (!isObject(q.settings) || !isPlainData(q.settings, 4) || jsonSize(q.settings) > 100_000) fail('settings must be a small plain object');
      checkChip(q.chip, q.chipId as string, fail);
      return [r] as unknown as QcChannelArgs[C];
    }
    case QC_CHANNELS.history: {
      if (args.length !== 1) fail(`expects one argument (the filters), got ${args.length}`);
      const q = args[0];
      if (!isObject(q)) fail('the filters must be an object');
      const f = q as Record<string, unknown>;
      const extra = Object.keys(f).filter((k) => !['lot', 'chip', 'since'].includes(k));
      if (extra.length) fail(`unknown filter(s): ${extra.join(', ')}`);
      optionalFilter(f, 'lot', fail);
      optionalFilter(f, 'chip', fail);
      if (f.since !== undefined && !(typeof f.since === 'string' && /^\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?Z?)?$/.test(f.since))) fail('since must be a UTC date YYYY-MM-DD or an ISO time');
      return [f] as unknown as QcChannelArgs[C];
    }
    case QC_CHANNELS.lotReport:
      if (args.length !== 1 || !isLabel(args[0])) fail('expects one lot name of 1–200 characters without control characters');
      return [args[0]] as unknown as QcChannelArgs[C];
    case QC_CHANNELS.saveCsv: {
      if (args.length !== 2) fail(`expects two arguments (suggested name, csv), got ${args.length}`);
      const [name, csv] = args;
      if (typeof name !== 'string' || name.length === 0 || name.length > 200 || /[/\\\u0000-\u001f]/.test(name) || name === '.' || name === '..') fail('the suggested name must be a plain file name (no folders), 1–200 characters');
      if (typeof csv !== 'string' || csv.length > MAX_CSV_CHARS) fail(`the csv must be a string of at most ${MAX_CSV_CHARS} characters`);
      return [name, csv] as unknown as QcChannelArgs[C];
    }
    default:
      return fail('unknown channel');
  }
}
