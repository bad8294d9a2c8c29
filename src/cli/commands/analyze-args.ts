/** Options of `lagbench analyze` (besides the importer's), parsed and checked in one place. */
import type { RobustLoss } from '../../core/fit/types';
import type { Setup } from '../../core/steps/types';
import { factorToSi, knownUnitsSentence, lookupUnit, type UnitKind } from '../../core/units/index';
import { UsageError } from '../io';

export interface AnalyzeCliOptions {
  files: string[];
  setup?: Setup;
  stepsFile?: string;
  terms: 1 | 2 | 3 | 'auto';
  deadTime: boolean;
  drift: boolean;
  robust: RobustLoss;
  /** Smallest step, SI, and the kind of quantity its unit belongs to. */
  minStep?: { valueSi: number; kind: UnitKind; text: string };
  minDwellS?: number;
  detectChannel?: string;
  responseChannel?: string;
  maxFitPoints?: number;
  shared: boolean;
  json: boolean;
  out?: string;
}

/** Flags with a value, and the boolean flags, of analyze itself. */
export const ANALYZE_VALUE_FLAGS = ['--setup', '--steps', '--terms', '--robust', '--min-step', '--min-dwell', '--detect-on', '--response', '--max-fit-points', '--out'] as const;
export const ANALYZE_BOOLEAN_FLAGS = ['--dead-time', '--drift', '--no-shared', '--json'] as const;

/** Parses `--min-step` text such as `0.5uL/min`, `2 mbar` or `50Pa` to SI. */
export function parseValueWithUnit(text: string, flag: string): { valueSi: number; kind: UnitKind } {
  const m = /^\s*([+]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
  if (!m || (m[2] ?? '') === '') {
    throw new UsageError(`${flag} needs a number with a unit, e.g. ${flag} 0.5uL/min or ${flag} "2 mbar" (got '${text}').`);
  }
  const found = lookupUnit(m[2] as string);
  if (!found || found.kind === 'time') throw new UsageError(`${flag}: unknown unit '${m[2]}'. ${knownUnitsSentence()}.`);
  return { valueSi: Number(m[1]) * factorToSi(found), kind: found.kind };
}

function positiveNumber(text: string, flag: string): number {
  const v = Number(text);
  if (text.trim() === '' || !Number.isFinite(v) || v <= 0) throw new UsageError(`${flag} needs a positive number (got '${text}').`);
  return v;
}

/**
 * Splits analyze's own flags from the rest (`rest` goes to the importer's option parser).
 * Accepts `--flag value` and `--flag=value`.
 */
export function parseAnalyzeArgs(args: string[]): { options: AnalyzeCliOptions; rest: string[] } {
  const o: AnalyzeCliOptions = { files: [], terms: 'auto', deadTime: false, drift: false, robust: 'none', shared: true, json: false };
  const rest: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i] as string;
    const eq = arg.startsWith('--') ? arg.indexOf('=') : -1;
    const flag = eq > 0 ? arg.slice(0, eq) : arg;
    if ((ANALYZE_BOOLEAN_FLAGS as readonly string[]).includes(flag)) {
      if (eq > 0) throw new UsageError(`${flag} takes no value.`);
      if (flag === '--dead-time') o.deadTime = true;
      else if (flag === '--drift') o.drift = true;
      else if (flag === '--no-shared') o.shared = false;
      else o.json = true;
      continue;
    }
    if ((ANALYZE_VALUE_FLAGS as readonly string[]).includes(flag)) {
      let value: string;
      if (eq > 0) value = arg.slice(eq + 1);
      else {
        const next = args[i + 1];
        if (next === undefined) throw new UsageError(`${flag} needs a value.`);
        value = next;
        i++;
      }
      switch (flag) {
        case '--setup':
          if (value !== 'flow-driven' && value !== 'pressure-driven') throw new UsageError(`--setup must be flow-driven or pressure-driven (got '${value}').`);
          o.setup = value;
          break;
        case '--steps':
          o.stepsFile = value;
          break;
        case '--terms':
          if (value === 'auto') o.terms = 'auto';
          else if (value === '1' || value === '2' || value === '3') o.terms = Number(value) as 1 | 2 | 3;
          else throw new UsageError(`--terms must be 1, 2, 3 or auto (got '${value}').`);
          break;
        case '--robust':
          if (value !== 'huber' && value !== 'tukey' && value !== 'none') throw new UsageError(`--robust must be huber or tukey (got '${value}').`);
          o.robust = value;
          break;
        case '--min-step':
          o.minStep = { ...parseValueWithUnit(value, '--min-step'), text: value };
          break;
        case '--min-dwell':
          o.minDwellS = positiveNumber(value, '--min-dwell');
          break;
        case '--detect-on':
          o.detectChannel = value;
          break;
        case '--response':
          o.responseChannel = value;
          break;
        case '--max-fit-points': {
          const v = Number(value);
          if (!Number.isInteger(v) || v < 0 || (v > 0 && v < 100)) throw new UsageError(`--max-fit-points must be 0 (no averaging) or an integer ≥ 100 (got '${value}').`);
          o.maxFitPoints = v;
          break;
        }
        case '--out':
          o.out = value;
          break;
      }
      continue;
    }
    if (arg.startsWith('-') && arg !== '-') {
      rest.push(arg);
      continue;
    }
    // A positional argument: a log file, unless it is the value of an importer flag (kept in order in rest).
    const prev = rest[rest.length - 1];
    if (prev !== undefined && prev.startsWith('--') && !prev.includes('=') && rest.length > 0 && expectsValue(prev)) rest.push(arg);
    else o.files.push(arg);
  }
  return { options: o, rest };
}

/** Importer flags that take a value (filled in from the importer's option table when it lands). */
let importerValueFlags: ReadonlySet<string> = new Set();
export function setImporterValueFlags(flags: Iterable<string>): void {
  importerValueFlags = new Set(flags);
}
function expectsValue(flag: string): boolean {
  return importerValueFlags.has(flag);
}
