/**
 * Reads and validates an acceptance spec (JSON, documented in docs/qc-spec.md).
 * Every problem is located: JSON syntax errors by line:column, schema problems by the
 * path of the value plus its line:column, with what is wrong and what to do.
 */
import { InputError } from '../errors';
import { formatJsonPath, parseJsonLocated, type JsonPath } from './json-locate';
import { QC_QUANTITIES, type InconclusivePolicy, type QcLimit, type QcQuantity, type QcSpec } from './types';
import { QC_UNITS } from './units';

/** One schema problem. */
export interface SpecIssue {
  path: string;
  line: number;
  column: number;
  problem: string;
  hint: string;
}

const TOP_KEYS = ['lagbench_qc_spec', 'design', 'test', 'limits', 'fit_quality', 'inconclusive_counts_as', 'chip_id_from', 'comment'];
const LIMIT_KEYS = ['unit', 'min', 'max', 'nominal', 'tolerance_percent', 'comment'];
const FIT_KEYS = ['require_converged', 'min_r2', 'reject_flags', 'on_violation', 'comment'];
/** Fit flags the fitter can raise (src/core/fit/types.ts FitFlagCode). */
export const KNOWN_FIT_FLAGS = [
  'not-converged', 'parameter-at-bound', 'tau-below-resolution', 'tau-beyond-window', 'not-settled',
  'residual-structure', 'degenerate-taus', 'too-few-points', 'inconclusive',
];

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Parses and validates a spec. Throws an {@link InputError} (`json-syntax` or `qc-spec-invalid`)
 * located at the first problem; the message lists every problem found.
 */
export function parseQcSpec(text: string, file?: string): QcSpec {
  const doc = parseJsonLocated(text, file);
  const issues: SpecIssue[] = [];
  const add = (path: JsonPath, problem: string, hint: string): void => {
    const at = doc.locate(path);
    issues.push({ path: formatJsonPath(path), ...at, problem, hint });
  };
  const spec = readSpec(doc.value, add);
  issues.sort((a, b) => a.line - b.line || a.column - b.column);
  if (issues.length > 0 || spec === null) {
    const first = issues[0] ?? { path: '(top level)', line: 1, column: 1, problem: 'The spec is not valid', hint: 'See docs/qc-spec.md' };
    const others = issues.slice(1).map((s) => `\n  ${file ?? 'spec'}:${s.line}:${s.column}: ${s.path}: ${s.problem}. ${s.hint}.`);
    const err = new InputError(
      'qc-spec-invalid',
      `${first.path}: ${first.problem}`,
      `${first.hint}${issues.length > 1 ? `. ${issues.length - 1} more problem(s):${others.join('')}` : ''}`,
      { file, line: first.line, column: first.column },
    );
    throw Object.assign(err, { issues });
  }
  return spec;
}

type Add = (path: JsonPath, problem: string, hint: string) => void;

function checkKeys(o: Obj, allowed: string[], path: JsonPath, add: Add): void {
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) add([...path, k], `Unknown field "${k}"`, `Allowed fields here: ${allowed.join(', ')}`);
  }
}

function str(o: Obj, key: string, path: JsonPath, add: Add, required: boolean): string | null {
  const v = o[key];
  if (v === undefined) {
    if (required) add(path, `Missing field "${key}"`, `Add "${key}": "<text>"`);
    return null;
  }
  if (typeof v !== 'string' || v.trim() === '') {
    add([...path, key], `"${key}" must be a non-empty text`, `Write it in double quotes, e.g. "${key}": "…"`);
    return null;
  }
  return v;
}

function readSpec(v: unknown, add: Add): QcSpec | null {
  if (!isObj(v)) {
    add([], 'The spec must be a JSON object { … }', 'See qc-spec/*.json for examples');
    return null;
  }
  checkKeys(v, TOP_KEYS, [], add);
  if (v.lagbench_qc_spec !== 1) {
    add(v.lagbench_qc_spec === undefined ? [] : ['lagbench_qc_spec'], v.lagbench_qc_spec === undefined ? 'Missing field "lagbench_qc_spec"' : `Unsupported spec format version ${JSON.stringify(v.lagbench_qc_spec)}`, 'Write "lagbench_qc_spec": 1');
  }
  let design: QcSpec['design'] = { name: '', revision: null, description: null };
  if (!isObj(v.design)) add(v.design === undefined ? [] : ['design'], v.design === undefined ? 'Missing field "design"' : '"design" must be an object', 'Write "design": { "name": "…" }');
  else {
    checkKeys(v.design, ['name', 'revision', 'description'], ['design'], add);
    design = {
      name: str(v.design, 'name', ['design'], add, true) ?? '',
      revision: str(v.design, 'revision', ['design'], add, false),
      description: str(v.design, 'description', ['design'], add, false),
    };
  }
  let test: QcSpec['test'] = { setup: '', program: '', notes: null, drive: null, chipDescription: null };
  if (!isObj(v.test)) add(v.test === undefined ? [] : ['test'], v.test === undefined ? 'Missing field "test"' : '"test" must be an object', 'Write "test": { "setup": "…", "program": "…" }');
  else {
    checkKeys(v.test, ['setup', 'program', 'notes', 'drive', 'chip_description'], ['test'], add);
    let drive: QcSpec['test']['drive'] = null;
    if (v.test.drive !== undefined) {
      if (v.test.drive !== 'flow-driven' && v.test.drive !== 'pressure-driven') add(['test', 'drive'], `"drive" is ${JSON.stringify(v.test.drive)}`, 'Write "flow-driven" (a pump sets the flow) or "pressure-driven" (a regulator sets the pressure)');
      else drive = v.test.drive;
    }
    test = {
      setup: str(v.test, 'setup', ['test'], add, true) ?? '',
      program: str(v.test, 'program', ['test'], add, true) ?? '',
      notes: str(v.test, 'notes', ['test'], add, false),
      drive,
      chipDescription: str(v.test, 'chip_description', ['test'], add, false),
    };
  }
  const limits: QcLimit[] = [];
  if (!isObj(v.limits)) add(v.limits === undefined ? [] : ['limits'], v.limits === undefined ? 'Missing field "limits"' : '"limits" must be an object', `Write "limits": { "resistance": { … } } with any of: ${QC_QUANTITIES.join(', ')}`);
  else {
    checkKeys(v.limits, QC_QUANTITIES as string[], ['limits'], add);
    for (const q of QC_QUANTITIES) {
      if (v.limits[q] === undefined) continue;
      const limit = readLimit(q, v.limits[q], ['limits', q], add);
      if (limit) limits.push(limit);
    }
    if (Object.keys(v.limits).length === 0) add(['limits'], '"limits" is empty', 'Give at least one limit, e.g. "trapped_air": { "unit": "uL", "max": 0.1 }');
  }
  const fitQuality: QcSpec['fitQuality'] = { requireConverged: true, minR2: null, rejectFlags: [], onViolation: 'inconclusive' };
  if (v.fit_quality !== undefined) {
    const f = v.fit_quality;
    if (!isObj(f)) add(['fit_quality'], '"fit_quality" must be an object', 'Write "fit_quality": { "require_converged": true, "min_r2": 0.99 }');
    else {
      checkKeys(f, FIT_KEYS, ['fit_quality'], add);
      if (f.require_converged !== undefined) {
        if (typeof f.require_converged !== 'boolean') add(['fit_quality', 'require_converged'], '"require_converged" must be true or false', 'Write true or false without quotes');
        else fitQuality.requireConverged = f.require_converged;
      }
      if (f.min_r2 !== undefined) {
        if (typeof f.min_r2 !== 'number' || !(f.min_r2 > 0 && f.min_r2 <= 1)) add(['fit_quality', 'min_r2'], '"min_r2" must be a number in (0, 1]', 'Write e.g. "min_r2": 0.99');
        else fitQuality.minR2 = f.min_r2;
      }
      if (f.reject_flags !== undefined) {
        if (!Array.isArray(f.reject_flags)) add(['fit_quality', 'reject_flags'], '"reject_flags" must be a list', `Write e.g. ["residual-structure"]; known flags: ${KNOWN_FIT_FLAGS.join(', ')}`);
        else
          f.reject_flags.forEach((flag, k) => {
            if (typeof flag !== 'string' || !KNOWN_FIT_FLAGS.includes(flag)) add(['fit_quality', 'reject_flags', k], `Unknown fit flag ${JSON.stringify(flag)}`, `Use one of: ${KNOWN_FIT_FLAGS.join(', ')}`);
            else fitQuality.rejectFlags.push(flag);
          });
      }
      if (f.on_violation !== undefined) {
        if (f.on_violation !== 'inconclusive' && f.on_violation !== 'fail') add(['fit_quality', 'on_violation'], `"on_violation" is ${JSON.stringify(f.on_violation)}`, 'Write "inconclusive" or "fail"');
        else fitQuality.onViolation = f.on_violation;
      }
    }
  }
  let inconclusiveCountsAs: InconclusivePolicy = 'inconclusive';
  if (v.inconclusive_counts_as !== undefined) {
    const p = v.inconclusive_counts_as;
    if (p !== 'fail' && p !== 'retest' && p !== 'inconclusive') add(['inconclusive_counts_as'], `"inconclusive_counts_as" is ${JSON.stringify(p)}`, 'Write "fail", "retest" or "inconclusive"');
    else inconclusiveCountsAs = p;
  }
  let chipIdFrom: string | null = null;
  if (v.chip_id_from !== undefined) {
    const c = v.chip_id_from;
    const problem = typeof c === 'string' ? checkChipIdSource(c) : 'must be a text';
    if (problem) add(['chip_id_from'], `"chip_id_from" ${problem}`, 'Write "filename:<regular expression with one (group)>" or "metadata:<key>"');
    else chipIdFrom = c as string;
  }
  return { formatVersion: 1, design, test, limits, fitQuality, inconclusiveCountsAs, chipIdFrom };
}

/** Null when `source` is a valid chip-ID source (`filename:<regex>` / `metadata:<key>`), else the problem. */
export function checkChipIdSource(source: string): string | null {
  if (source.startsWith('metadata:')) return source.length > 'metadata:'.length ? null : 'names no metadata key';
  if (source.startsWith('filename:')) {
    try {
      new RegExp(source.slice('filename:'.length));
    } catch (e) {
      return `has an invalid regular expression (${e instanceof Error ? e.message : String(e)})`;
    }
    return null;
  }
  return 'must start with "filename:" or "metadata:"';
}

function readLimit(q: QcQuantity, v: unknown, path: JsonPath, add: Add): QcLimit | null {
  const units = QC_UNITS[q];
  if (!isObj(v)) {
    add(path, `The limit "${q}" must be an object`, `Write e.g. "${q}": { "unit": "${Object.keys(units)[0]}", "max": … }`);
    return null;
  }
  checkKeys(v, LIMIT_KEYS, path, add);
  let ok = true;
  const unit = v.unit;
  let factor = 1;
  if (typeof unit !== 'string' || units[unit] === undefined) {
    add(unit === undefined ? path : [...path, 'unit'], unit === undefined ? `The limit "${q}" has no "unit"` : `Unknown unit ${JSON.stringify(unit)} for ${q}`, `Use one of: ${Object.keys(units).join(', ')}`);
    ok = false;
  } else factor = units[unit] ?? 1;
  const num = (key: string): number | null => {
    const x = v[key];
    if (x === undefined) return null;
    if (typeof x !== 'number' || !Number.isFinite(x)) {
      add([...path, key], `"${key}" must be a number`, 'Write a plain number without quotes or units, e.g. 2.4e13');
      ok = false;
      return null;
    }
    return x;
  };
  const min = num('min');
  const max = num('max');
  const nominal = num('nominal');
  const tol = num('tolerance_percent');
  const nominalForm = nominal !== null || tol !== null;
  if (nominalForm && (min !== null || max !== null)) {
    add(path, `The limit "${q}" mixes min/max with nominal/tolerance_percent`, 'Give either "min"/"max" or "nominal" with "tolerance_percent", not both');
    return null;
  }
  if (!ok) return null;
  if (nominalForm) {
    if (nominal === null || tol === null) {
      add(path, `The limit "${q}" needs both "nominal" and "tolerance_percent"`, 'Add the missing one, e.g. "tolerance_percent": 10');
      return null;
    }
    if (!(nominal > 0)) {
      add([...path, 'nominal'], '"nominal" must be greater than 0', 'Write the design value in the given unit');
      return null;
    }
    if (!(tol > 0 && tol < 100)) {
      add([...path, 'tolerance_percent'], '"tolerance_percent" must lie between 0 and 100 (exclusive)', 'Write e.g. 10 for ±10 %');
      return null;
    }
    return { quantity: q, lowerSi: nominal * (1 - tol / 100) * factor, upperSi: nominal * (1 + tol / 100) * factor, nominalSi: nominal * factor, tolerancePercent: tol, unit: unit as string, unitToSi: factor };
  }
  if (min === null && max === null) {
    add(path, `The limit "${q}" gives no bound`, 'Add "max", "min" or "nominal" with "tolerance_percent"');
    return null;
  }
  if (min !== null && max !== null && !(min < max)) {
    add([...path, 'max'], `"max" (${max}) must be greater than "min" (${min})`, 'Swap or correct the bounds');
    return null;
  }
  return { quantity: q, lowerSi: min === null ? null : min * factor, upperSi: max === null ? null : max * factor, nominalSi: null, tolerancePercent: null, unit: unit as string, unitToSi: factor };
}
