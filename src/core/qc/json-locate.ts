/**
 * A small JSON parser (RFC 8259 grammar) that also remembers where every value starts,
 * so that spec validation can point at `file:line:column` of the offending value.
 * `JSON.parse` gives neither value positions nor reliable syntax positions across engines.
 */
import { InputError } from '../errors';

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

/** Parses `text`; throws a located {@link InputError} (`json-syntax`) on a syntax error. */
export function parseJsonLocated(text: string, file?: string): LocatedJson {
  const positions = new Map<string, number>();
  let i = 0;
  // Line starts, for offset → line:column.
  const lineStarts = [0];
  for (let k = 0; k < text.length; k++) if (text.charCodeAt(k) === 10) lineStarts.push(k + 1);
  const lineCol = (offset: number): { line: number; column: number } => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if ((lineStarts[mid] ?? 0) <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - (lineStarts[lo] ?? 0) + 1 };
  };
  const fail = (problem: string, hint: string, at = i): never => {
    throw new InputError('json-syntax', problem, hint, { file, ...lineCol(at) });
  };
  const describe = (ch: string | undefined): string => (ch === undefined ? 'the end of the file' : `'${ch}'`);
  const skipWs = (): void => {
    while (i < text.length) {
      const c = text[i];
      if (c === ' ' || c === '\t' || c === '\n' || c === '\r') i++;
      else break;
    }
  };
  const parseString = (): string => {
    const start = i;
    i++; // opening quote
    let out = '';
    while (true) {
      if (i >= text.length) fail('A text in quotes is not closed', 'Add the closing double quote', start);
      const c = text[i] as string;
      if (c === '"') {
        i++;
        return out;
      }
      if (c === '\\') {
        const e = text[i + 1];
        const simple: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };
        if (e !== undefined && simple[e] !== undefined) {
          out += simple[e];
          i += 2;
        } else if (e === 'u' && /^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) {
          out += String.fromCharCode(parseInt(text.slice(i + 2, i + 6), 16));
          i += 6;
        } else {
          fail(`Unknown escape '\\${e ?? ''}' in a text`, 'Use \\" \\\\ \\/ \\b \\f \\n \\r \\t or \\uXXXX');
        }
        continue;
      }
      if (c.charCodeAt(0) < 0x20) fail('A control character (e.g. a line break) is inside a quoted text', 'Close the quote on the same line or write \\n');
      out += c;
      i++;
    }
  };
  const parseNumber = (): number => {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (!m) return fail(`Unexpected ${describe(text[i])}`, 'Write a number like 12, -3.5 or 2.0e13');
    i += m[0].length;
    return Number(m[0]);
  };
  const parseValue = (path: (string | number)[], depth: number): unknown => {
    if (depth > 200) fail('The document nests deeper than 200 levels', 'Flatten the structure');
    skipWs();
    positions.set(pathKey(path), i);
    const c = text[i];
    if (c === '{') {
      i++;
      const obj: Record<string, unknown> = {};
      skipWs();
      if (text[i] === '}') {
        i++;
        return obj;
      }
      while (true) {
        skipWs();
        if (text[i] !== '"') fail(`Expected a key in double quotes, found ${describe(text[i])}`, 'Quote every key with " (and remove any trailing comma)');
        const keyAt = i;
        const key = parseString();
        if (Object.prototype.hasOwnProperty.call(obj, key)) fail(`The key "${key}" appears twice in the same object`, 'Keep only one of them', keyAt);
        skipWs();
        if (text[i] !== ':') fail(`Expected ':' after the key "${key}", found ${describe(text[i])}`, 'Write "key": value');
        i++;
        obj[key] = parseValue([...path, key], depth + 1);
        skipWs();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          return obj;
        }
        fail(`Expected ',' or '}' in an object, found ${describe(text[i])}`, 'Separate entries with commas and close the object with }');
      }
    }
    if (c === '[') {
      i++;
      const arr: unknown[] = [];
      skipWs();
      if (text[i] === ']') {
        i++;
        return arr;
      }
      while (true) {
        arr.push(parseValue([...path, arr.length], depth + 1));
        skipWs();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          return arr;
        }
        fail(`Expected ',' or ']' in a list, found ${describe(text[i])}`, 'Separate items with commas and close the list with ]');
      }
    }
    if (c === '"') return parseString();
    if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) return parseNumber();
    for (const [word, v] of [['true', true], ['false', false], ['null', null]] as const) {
      if (text.startsWith(word, i)) {
        i += word.length;
        return v;
      }
    }
    return fail(`Unexpected ${describe(c)} where a value should be`, 'Write a number, "text", true, false, null, an object {…} or a list […]');
  };
  // A leading byte-order mark is tolerated (editors on some systems write one).
  if (text.charCodeAt(0) === 0xfeff) i = 1;
  const value = parseValue([], 0);
  skipWs();
  if (i < text.length) fail(`Unexpected ${describe(text[i])} after the end of the document`, 'Remove it, or wrap everything in one object');
  return {
    value,
    locate: (path) => {
      for (let n = path.length; n >= 0; n--) {
        const at = positions.get(pathKey(path.slice(0, n)));
        if (at !== undefined) return lineCol(at);
      }
      return { line: 1, column: 1 };
    },
  };
}
