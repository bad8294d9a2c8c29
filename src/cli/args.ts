/**
 * A small shared argument helper on top of node:util parseArgs: declared options (string, boolean,
 * repeated), positional arguments, numbers, numbers with units (to SI), and generated option help. Every mistake throws
 * UsageError (exit 2 with a pointer to --help).
 */
import { parseArgs } from 'node:util';
import { factorToSi } from '../core/units/convert';
import { knownUnitSymbols, lookupUnit, type UnitKind } from '../core/units/lookup';
import { UsageError } from './io';

/** One option of a command. */
export interface OptionSpec {
  type: 'string' | 'boolean';
  /** May be given more than once (values collected in order). */
  multiple?: boolean;
  short?: string;
  /** Placeholder in the help, e.g. `<file>`. */
  valueName?: string;
  /** One line for the help. */
  description: string;
}

export type OptionSpecs = Record<string, OptionSpec>;

export type OptionValues = Record<string, string | boolean | string[] | boolean[] | undefined>;

export interface ParsedArgs {
  values: OptionValues;
  positionals: string[];
}

/** Parses `args` against `specs`; unknown options, missing values and stray values throw UsageError. */
export function parseCommandArgs(args: string[], specs: OptionSpecs, command?: string): ParsedArgs {
  const options: Record<string, { type: 'string' | 'boolean'; multiple?: boolean; short?: string }> = {};
  for (const [name, s] of Object.entries(specs)) {
    options[name] = { type: s.type, ...(s.multiple ? { multiple: true } : {}), ...(s.short ? { short: s.short } : {}) };
  }
  try {
    const { values, positionals } = parseArgs({ args, options, allowPositionals: true, strict: true });
    return { values: values as OptionValues, positionals };
  } catch (err) {
    const message = err instanceof Error ? err.message.replace(/\. To specify a positional argument.*$/s, '') : String(err);
    throw new UsageError(message, command);
  }
}

/** The string value of an option (last one wins for single options), or undefined. */
export function stringOption(values: OptionValues, name: string): string | undefined {
  const v = values[name];
  if (Array.isArray(v)) return v.length ? String(v[v.length - 1]) : undefined;
  return typeof v === 'string' ? v : undefined;
}

/** All values of a repeated string option. */
export function stringList(values: OptionValues, name: string): string[] {
  const v = values[name];
  if (v === undefined) return [];
  return (Array.isArray(v) ? v : [v]).map(String);
}

export function booleanOption(values: OptionValues, name: string): boolean {
  return values[name] === true;
}

/** Reads a finite number (dot decimal, optional exponent); UsageError names the option otherwise. */
export function parseNumberArg(text: string, option: string, limits: { min?: number; max?: number; exclusiveMin?: boolean } = {}): number {
  const t = text.trim();
  const v = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
  if (!Number.isFinite(v)) throw new UsageError(`--${option} needs a number, not '${text}'`);
  if (limits.min !== undefined && (limits.exclusiveMin ? v <= limits.min : v < limits.min)) {
    throw new UsageError(`--${option} must be ${limits.exclusiveMin ? 'above' : 'at least'} ${limits.min}, not ${text}`);
  }
  if (limits.max !== undefined && v > limits.max) throw new UsageError(`--${option} must be at most ${limits.max}, not ${text}`);
  return v;
}

/** A number option, or undefined when absent. */
export function numberOption(values: OptionValues, name: string, limits: { min?: number; max?: number; exclusiveMin?: boolean } = {}): number | undefined {
  const s = stringOption(values, name);
  return s === undefined ? undefined : parseNumberArg(s, name, limits);
}

/** Option lines for a command's --help, aligned. */
export function formatOptionHelp(specs: OptionSpecs): string {
  const rows = Object.entries(specs).map(([name, s]) => {
    const flag = `${s.short ? `-${s.short}, ` : '    '}--${name}${s.type === 'string' ? ` ${s.valueName ?? '<value>'}` : ''}`;
    return [flag, `${s.description}${s.multiple ? ' (repeatable)' : ''}`] as const;
  });
  const width = Math.max(...rows.map(([f]) => f.length));
  return rows.map(([f, d]) => `  ${f.padEnd(width)}  ${d}`).join('\n');
}

/**
 * Reads a number with a unit, e.g. `50mbar`, `2.5 µL/min`, `30 s`, and returns it in SI (Pa, m³/s, s; heights
 * in mm/cm of liquid as Pa with ρ = 998.2 kg/m³). `kinds` lists the acceptable kinds; a bare number is taken in
 * `defaultUnit` when given, else refused.
 */
export function parseValueWithUnit(text: string, option: string, kinds: readonly UnitKind[], defaultUnit?: string): number {
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
  if (!m) throw new UsageError(`--${option} needs a number with a unit, e.g. ${exampleFor(kinds)}, not '${text}'`);
  const unitText = m[2] || defaultUnit;
  if (!unitText) throw new UsageError(`--${option} needs a unit, e.g. ${exampleFor(kinds)}`);
  const found = lookupUnit(unitText);
  if (!found || !kinds.includes(found.kind)) {
    throw new UsageError(`--${option}: '${unitText}' is not a ${kinds.join(' or ')} unit Lagbench knows. Known: ${knownUnitSymbols(kinds).join(', ')}`);
  }
  return Number(m[1]) * factorToSi(found);
}

function exampleFor(kinds: readonly UnitKind[]): string {
  return kinds.map((k) => ({ pressure: '50mbar', flow: '2.5uL/min', head: '20mm', time: '30s' })[k]).join(' or ');
}
