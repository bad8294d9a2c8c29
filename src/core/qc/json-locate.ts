/**
 * QC specs read JSON through the shared located parser (src/core/json/located-json.ts) and then work on
 * plain values, asking for the line:column of a value by its path when a check fails.
 */
import { parseLocatedJson, type JsonPosition, type LocatedJson as LocatedTree } from '../json/located-json';

/** A path into a JSON document: object keys and array indices. */
export type JsonPath = ReadonlyArray<string | number>;

export interface LocatedJson {
  value: unknown;
  /** 1-based line and column where the value at `path` starts (nearest located ancestor if absent). */
  locate: (path: JsonPath) => { line: number; column: number };
}

/** `limits.resistance.tolerance_percent`, `steps[2]` — how paths appear in messages. */
export function formatJsonPath(path: JsonPath): string {
  let out = '';
  for (const p of path) out += typeof p === 'number' ? `[${p}]` : out === '' ? p : `.${p}`;
  return out === '' ? '(top level)' : out;
}

const pathKey = (path: JsonPath): string => JSON.stringify(path);

/** Plain value of a located tree, recording each value's position under its path. */
function plain(node: LocatedTree, path: (string | number)[], positions: Map<string, JsonPosition>): unknown {
  positions.set(pathKey(path), node.pos);
  switch (node.kind) {
    case 'object': {
      const obj: Record<string, unknown> = {};
      // defineProperty, as JSON.parse does: a key named "__proto__" stays an own property, never a prototype.
      for (const e of node.entries) {
        Object.defineProperty(obj, e.key, { value: plain(e.value, [...path, e.key], positions), enumerable: true, writable: true, configurable: true });
      }
      return obj;
    }
    case 'array':
      return node.items.map((item, k) => plain(item, [...path, k], positions));
    case 'null':
      return null;
    default:
      return node.value;
  }
}

/** Parses `text`; throws a located InputError (`json-syntax`) on a syntax error. */
export function parseJsonLocated(text: string, file?: string): LocatedJson {
  const positions = new Map<string, JsonPosition>();
  const value = plain(parseLocatedJson(text, file), [], positions);
  return {
    value,
    locate: (path) => {
      for (let n = path.length; n >= 0; n--) {
        const at = positions.get(pathKey(path.slice(0, n)));
        if (at !== undefined) return { line: at.line, column: at.column };
      }
      return { line: 1, column: 1 };
    },
  };
}
