/**
 * The design variable of a what-if sweep: `<target>.<property>=<from>:<to>[:<steps>]` or a comma
 * list `<target>.<property>=<v1>,<v2>,…`. The target is an element's label ("PTFE feed line"), its
 * place in the description (`upstream[1]`, `chip[0]`, `path.chip[1].branches[0][0]`), `fluid`,
 * `chipBody`, or `bubble` (extra trapped air at the compliant node, `bubble.volume`, volume at 1 atm).
 */
import { parseQuantity, type Dimension } from '../chip/quantity';
import { InputError } from '../errors';

/** Properties that can be swept, with their dimension (`material`, `kind`, `preset` are categorical). */
export const SWEEPABLE: Readonly<Record<string, Dimension | 'category'>> = {
  length: 'length',
  width: 'length',
  height: 'length',
  diameter: 'length',
  innerDiameter: 'length',
  outerDiameter: 'length',
  volume: 'volume',
  liquidVolume: 'volume',
  gasVolume: 'volume',
  temperature: 'temperature',
  modulus: 'pressure',
  material: 'category',
  kind: 'category',
  preset: 'category',
};

export interface VarySpec {
  /** As written: element label, JSON-ish path, `fluid`, `chipBody` or `bubble`. */
  target: string;
  property: string;
  dimension: Dimension | 'category';
  /** SI numbers, or strings for categorical properties. */
  values: Array<number | string>;
  /** The text the user gave, for messages and tables. */
  text: string;
}

function usage(problem: string, hint = 'write e.g. "PTFE feed line.length=10cm:1m:10" or "bubble.volume=0:5uL:6"'): InputError {
  return new InputError('bad-vary', problem, hint);
}

/** Parses a --vary argument. Numeric sweeps are linearly spaced; steps counts the values (default 6, 2–200). */
export function parseVary(text: string): VarySpec {
  const eq = text.indexOf('=');
  if (eq < 0) throw usage(`'${text}' has no '='`);
  const lhs = text.slice(0, eq).trim();
  const rhs = text.slice(eq + 1).trim();
  const dot = lhs.lastIndexOf('.');
  if (dot <= 0) throw usage(`'${lhs}' needs the form <element>.<property>`);
  const target = lhs.slice(0, dot).trim();
  const property = lhs.slice(dot + 1).trim();
  const dimension = SWEEPABLE[property];
  if (!dimension) throw usage(`'${property}' cannot be swept`, `sweepable properties: ${Object.keys(SWEEPABLE).join(', ')}`);
  if (target === 'bubble' && property !== 'volume') throw usage(`the bubble has only a 'volume' (at atmospheric pressure)`);
  if (rhs === '') throw usage(`no values after '=' in '${text}'`);
  if (dimension === 'category') {
    const values = rhs.split(',').map((s) => s.trim()).filter((s) => s !== '');
    return { target, property, dimension, values, text };
  }
  const num = (s: string): number => {
    const q = parseQuantity(s.trim(), dimension);
    if ('error' in q) throw usage(`'${s.trim()}' in --vary: ${q.error}`);
    return q.value;
  };
  if (rhs.includes(',')) return { target, property, dimension, values: rhs.split(',').map(num), text };
  const parts = rhs.split(':');
  if (parts.length < 2 || parts.length > 3) throw usage(`'${rhs}' is not <from>:<to>[:<steps>] or a comma list`);
  const from = num(parts[0] as string);
  const to = num(parts[1] as string);
  const steps = parts[2] === undefined ? 6 : Number(parts[2]);
  if (!Number.isInteger(steps) || steps < 2 || steps > 200) throw usage(`steps '${parts[2]}' must be a whole number from 2 to 200`);
  const values = Array.from({ length: steps }, (_, k) => from + ((to - from) * k) / (steps - 1));
  return { target, property, dimension, values, text };
}
