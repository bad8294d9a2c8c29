/**
 * Typed, located access to a parsed JSON document: every problem becomes an InputError naming the
 * JSON path, the line:column of the offending value, what is wrong and what to do.
 */
import { InputError } from '../errors';
import type { ValueRange } from '../nominal/range';
import type { JsonPosition, LocatedJson } from '../json/located-json';
import { parseQuantity, UNIT_EXAMPLES, type Dimension } from './quantity';

type ObjectNode = Extract<LocatedJson, { kind: 'object' }>;

/** Levenshtein distance, for "did you mean" hints on misspelt member names. */
function distance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let prev = row[0] as number;
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const tmp = row[j] as number;
      row[j] = Math.min((row[j] as number) + 1, (row[j - 1] as number) + 1, prev + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev = tmp;
    }
  }
  return row[b.length] as number;
}

export class DocumentReader {
  constructor(readonly file: string) {}

  error(code: string, path: string, pos: JsonPosition, problem: string, hint: string): InputError {
    return new InputError(code, `${path}: ${problem}`, hint, { file: this.file, line: pos.line, column: pos.column });
  }

  /** Converts a number (SI) or a "value unit" string node to SI, with sign checks. */
  quantityOf(node: LocatedJson, path: string, dim: Dimension, opts: { min?: number; positive?: boolean }): number {
    let value: number;
    if (node.kind === 'number') value = node.value;
    else if (node.kind === 'string') {
      const parsed = parseQuantity(node.value, dim);
      if ('error' in parsed) throw this.error('bad-quantity', path, node.pos, parsed.error, `Write it like ${UNIT_EXAMPLES[dim]}`);
      value = parsed.value;
    } else {
      throw this.error('expected-quantity', path, node.pos, `expected a ${dim} but found ${describeKind(node)}`, `Write it like ${UNIT_EXAMPLES[dim]}`);
    }
    if (opts.positive && !(value > 0)) throw this.error('not-positive', path, node.pos, `the ${dim} must be greater than zero`, 'Give a positive value');
    if (opts.min !== undefined && !(value >= opts.min)) throw this.error('out-of-range', path, node.pos, `the ${dim} must not be negative`, 'Give zero or a positive value');
    return value;
  }

  /** An object node with member bookkeeping, so unknown members can be reported. */
  object(node: LocatedJson, path: string, allowed: readonly string[]): ObjectReader {
    if (node.kind !== 'object') {
      throw this.error('expected-object', path, node.pos, `expected an object { … } but found ${describeKind(node)}`, 'See docs/chip-description.md for the members this object takes');
    }
    for (const entry of node.entries) {
      if (entry.key.startsWith('//') || allowed.includes(entry.key)) continue;
      const near = allowed.filter((a) => distance(a.toLowerCase(), entry.key.toLowerCase()) <= 2);
      throw this.error(
        'unknown-member',
        path,
        entry.keyPos,
        `unknown member "${entry.key}"`,
        near.length > 0 ? `Did you mean "${near[0]}"? Allowed here: ${allowed.join(', ')}` : `Allowed here: ${allowed.join(', ')} (members starting with "//" are ignored as comments)`,
      );
    }
    return new ObjectReader(this, node, path);
  }
}

function describeKind(node: LocatedJson): string {
  switch (node.kind) {
    case 'object':
      return 'an object';
    case 'array':
      return 'a list';
    case 'string':
      return `the text "${node.value}"`;
    case 'number':
      return `the number ${node.raw}`;
    case 'boolean':
      return `${node.value}`;
    case 'null':
      return 'null';
  }
}

export class ObjectReader {
  constructor(
    readonly doc: DocumentReader,
    readonly node: ObjectNode,
    readonly path: string,
  ) {}

  get pos(): JsonPosition {
    return this.node.pos;
  }

  has(key: string): boolean {
    return this.node.entries.some((e) => e.key === key);
  }

  child(key: string): string {
    return `${this.path}.${key}`;
  }

  /** The raw node of a member, or throws a located "missing" error when required. */
  get(key: string, required: true, hint?: string): LocatedJson;
  get(key: string, required?: false): LocatedJson | undefined;
  get(key: string, required = false, hint = ''): LocatedJson | undefined {
    const entry = this.node.entries.find((e) => e.key === key);
    if (!entry && required) {
      throw this.doc.error('missing-member', this.path, this.node.pos, `the required member "${key}" is missing`, hint || `Add "${key}" to this object`);
    }
    return entry?.value;
  }

  string(key: string, required: true, choices?: readonly string[]): string;
  string(key: string, required?: false, choices?: readonly string[]): string | undefined;
  string(key: string, required = false, choices?: readonly string[]): string | undefined {
    const node = required ? this.get(key, true) : this.get(key);
    if (node === undefined) return undefined;
    if (node.kind !== 'string') {
      throw this.doc.error('expected-string', this.child(key), node.pos, `expected text in double quotes but found ${describeKind(node)}`, choices ? `Use one of: ${choices.join(', ')}` : 'Put the value in double quotes');
    }
    if (choices && !choices.includes(node.value)) {
      throw this.doc.error('unknown-choice', this.child(key), node.pos, `"${node.value}" is not one of the known values`, `Use one of: ${choices.join(', ')}`);
    }
    return node.value;
  }

  boolean(key: string, fallback: boolean): boolean {
    const node = this.get(key);
    if (node === undefined) return fallback;
    if (node.kind !== 'boolean') throw this.doc.error('expected-boolean', this.child(key), node.pos, `expected true or false but found ${describeKind(node)}`, 'Write true or false without quotes');
    return node.value;
  }

  /** A plain number with bounds (for dimensionless values). */
  number(key: string, min: number, max: number, fallback?: number): number {
    const node = fallback === undefined ? this.get(key, true) : this.get(key);
    if (node === undefined) return fallback as number;
    if (node.kind !== 'number') throw this.doc.error('expected-number', this.child(key), node.pos, `expected a number but found ${describeKind(node)}`, `Write a number between ${min} and ${max} without quotes`);
    if (!(node.value >= min && node.value <= max)) throw this.doc.error('out-of-range', this.child(key), node.pos, `${node.raw} is outside the allowed range ${min} to ${max}`, `Give a value between ${min} and ${max}`);
    return node.value;
  }

  /** A quantity (SI number or "value unit" string) converted to SI. */
  quantity(key: string, dim: Dimension, opts: { required: true; min?: number; positive?: boolean }): number;
  quantity(key: string, dim: Dimension, opts: { required?: false; min?: number; positive?: boolean }): number | undefined;
  quantity(key: string, dim: Dimension, opts: { required?: boolean; min?: number; positive?: boolean }): number | undefined {
    const node = opts.required ? this.get(key, true, `Add "${key}", e.g. ${UNIT_EXAMPLES[dim]}`) : this.get(key);
    if (node === undefined) return undefined;
    return this.doc.quantityOf(node, this.child(key), dim, opts);
  }

  /** A quantity that may be a single value or { "low", "nominal", "high" }. */
  range(key: string, dim: Dimension, opts: { required?: boolean; positive?: boolean }): ValueRange | undefined {
    const node = opts.required ? this.get(key, true, `Add "${key}", e.g. ${UNIT_EXAMPLES[dim]}`) : this.get(key);
    if (node === undefined) return undefined;
    const path = this.child(key);
    if (node.kind !== 'object') {
      const v = this.doc.quantityOf(node, path, dim, opts);
      return { low: v, nominal: v, high: v };
    }
    const o = this.doc.object(node, path, ['low', 'nominal', 'high']);
    const nominal = o.quantity('nominal', dim, { required: true, positive: opts.positive });
    const low = o.quantity('low', dim, { positive: opts.positive }) ?? nominal;
    const high = o.quantity('high', dim, { positive: opts.positive }) ?? nominal;
    if (!(low <= nominal && nominal <= high)) {
      throw this.doc.error('bad-range', path, node.pos, 'the range must satisfy low ≤ nominal ≤ high', 'Check the order of the three values');
    }
    return { low, nominal, high };
  }

  array(key: string, required: boolean): Array<{ node: LocatedJson; path: string }> | undefined {
    const node = required ? this.get(key, true) : this.get(key);
    if (node === undefined) return undefined;
    if (node.kind !== 'array') throw this.doc.error('expected-list', this.child(key), node.pos, `expected a list [ … ] but found ${describeKind(node)}`, 'Write the elements inside square brackets');
    return node.items.map((item, i) => ({ node: item, path: `${this.child(key)}[${i}]` }));
  }
}
