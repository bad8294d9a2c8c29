/**
 * A small JSON parser that remembers where every value and key starts (1-based line and column),
 * so that schema errors can point at the offending value, not just its JSON path. Shared by every
 * JSON input Lagbench validates (chip descriptions, QC specs). `JSON.parse` gives neither value
 * positions nor reliable syntax positions across engines.
 * Strict RFC 8259 JSON; a leading byte-order mark is skipped; nesting deeper than 200 levels is refused.
 */
import { InputError } from '../errors';

export interface JsonPosition {
  line: number;
  column: number;
}

export type LocatedJson =
  | { kind: 'object'; pos: JsonPosition; entries: Array<{ key: string; keyPos: JsonPosition; value: LocatedJson }> }
  | { kind: 'array'; pos: JsonPosition; items: LocatedJson[] }
  | { kind: 'string'; pos: JsonPosition; value: string }
  | { kind: 'number'; pos: JsonPosition; value: number; raw: string }
  | { kind: 'boolean'; pos: JsonPosition; value: boolean }
  | { kind: 'null'; pos: JsonPosition };

const ESCAPES: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };

/** Deepest nesting accepted; deeper documents are refused rather than overflowing the stack. */
const MAX_DEPTH = 200;

class Parser {
  private i = 0;
  private depth = 0;
  private line = 1;
  private col = 1;

  constructor(
    private readonly text: string,
    private readonly file: string | undefined,
  ) {
    if (text.charCodeAt(0) === 0xfeff) this.i = 1;
  }

  parseDocument(): LocatedJson {
    this.skipSpace();
    if (this.i >= this.text.length) this.fail('The file is empty', 'Write a JSON object (the format is described in docs/)');
    const value = this.parseValue();
    this.skipSpace();
    if (this.i < this.text.length) this.fail(`Unexpected ${this.describe()} after the end of the JSON value`, 'Remove it, or wrap everything in one object');
    return value;
  }

  private here(): JsonPosition {
    return { line: this.line, column: this.col };
  }

  private fail(problem: string, hint: string, pos: JsonPosition = this.here()): never {
    throw new InputError('json-syntax', `JSON syntax error: ${problem}`, hint, { ...(this.file !== undefined ? { file: this.file } : {}), line: pos.line, column: pos.column });
  }

  private describe(): string {
    const c = this.text[this.i];
    if (c === undefined) return 'end of file';
    if (c === '\n' || c === '\r') return 'line break';
    return `character '${c}'`;
  }

  private advance(): string {
    const c = this.text[this.i++] as string;
    if (c === '\n') {
      this.line++;
      this.col = 1;
    } else {
      this.col++;
    }
    return c;
  }

  private skipSpace(): void {
    for (;;) {
      const c = this.text[this.i];
      if (c === ' ' || c === '\t' || c === '\n' || c === '\r') this.advance();
      else if (c === '/' && (this.text[this.i + 1] === '/' || this.text[this.i + 1] === '*')) {
        this.fail('comments are not allowed in JSON', 'Delete the comment, or put the text in a "note" field');
      } else return;
    }
  }

  private parseValue(): LocatedJson {
    const pos = this.here();
    const c = this.text[this.i];
    if (c === '{' || c === '[') {
      if (++this.depth > MAX_DEPTH) this.fail(`the document nests deeper than ${MAX_DEPTH} levels`, 'Flatten the structure');
      const node = c === '{' ? this.parseObject(pos) : this.parseArray(pos);
      this.depth--;
      return node;
    }
    if (c === '"') return { kind: 'string', pos, value: this.parseString() };
    if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) return this.parseNumber(pos);
    for (const [word, node] of [
      ['true', { kind: 'boolean', pos, value: true }],
      ['false', { kind: 'boolean', pos, value: false }],
      ['null', { kind: 'null', pos }],
    ] as const) {
      if (this.text.startsWith(word, this.i)) {
        for (let k = 0; k < word.length; k++) this.advance();
        return node;
      }
    }
    if (c === "'") this.fail('strings must use double quotes', 'Replace the single quotes with "');
    if (c !== undefined && /[A-Za-z_]/.test(c)) {
      this.fail(`unquoted text starting with '${c}'`, 'Put text values in double quotes, e.g. "250 um"');
    }
    this.fail(`expected a value but found ${this.describe()}`, 'Check for a missing value or an extra comma');
  }

  private parseObject(pos: JsonPosition): LocatedJson {
    this.advance();
    const entries: Array<{ key: string; keyPos: JsonPosition; value: LocatedJson }> = [];
    this.skipSpace();
    if (this.text[this.i] === '}') {
      this.advance();
      return { kind: 'object', pos, entries };
    }
    for (;;) {
      this.skipSpace();
      const keyPos = this.here();
      if (this.text[this.i] === '}') this.fail('trailing comma before }', 'Remove the comma after the last member');
      if (this.text[this.i] !== '"') this.fail(`expected a member name in double quotes but found ${this.describe()}`, 'Write members as "name": value');
      const key = this.parseString();
      if (entries.some((e) => e.key === key)) this.fail(`the member "${key}" appears twice in this object`, 'Keep only one of them', keyPos);
      this.skipSpace();
      if (this.text[this.i] !== ':') this.fail(`expected ':' after "${key}" but found ${this.describe()}`, 'Write members as "name": value');
      this.advance();
      this.skipSpace();
      const value = this.parseValue();
      entries.push({ key, keyPos, value });
      this.skipSpace();
      const c = this.text[this.i];
      if (c === ',') {
        this.advance();
        continue;
      }
      if (c === '}') {
        this.advance();
        return { kind: 'object', pos, entries };
      }
      this.fail(`expected ',' or '}' but found ${this.describe()}`, 'Separate members with commas and close the object with }');
    }
  }

  private parseArray(pos: JsonPosition): LocatedJson {
    this.advance();
    const items: LocatedJson[] = [];
    this.skipSpace();
    if (this.text[this.i] === ']') {
      this.advance();
      return { kind: 'array', pos, items };
    }
    for (;;) {
      this.skipSpace();
      if (this.text[this.i] === ']') this.fail('trailing comma before ]', 'Remove the comma after the last item');
      items.push(this.parseValue());
      this.skipSpace();
      const c = this.text[this.i];
      if (c === ',') {
        this.advance();
        continue;
      }
      if (c === ']') {
        this.advance();
        return { kind: 'array', pos, items };
      }
      this.fail(`expected ',' or ']' but found ${this.describe()}`, 'Separate items with commas and close the list with ]');
    }
  }

  private parseString(): string {
    const start = this.here();
    this.advance();
    let out = '';
    for (;;) {
      const c = this.text[this.i];
      if (c === undefined) this.fail('unterminated string', 'Close the string with "', start);
      if (c === '"') {
        this.advance();
        return out;
      }
      if (c === '\n' || c === '\r') this.fail('line break inside a string', 'Close the string with " before the end of the line');
      if (c < ' ') this.fail('control character inside a string', 'Remove it or write it as an escape such as \\t');
      if (c === '\\') {
        this.advance();
        const e = this.text[this.i];
        if (e === 'u') {
          const hex = this.text.slice(this.i + 1, this.i + 5);
          if (!/^[0-9a-fA-F]{4}$/.test(hex)) this.fail('bad \\u escape', 'Write \\u followed by four hex digits');
          for (let k = 0; k < 5; k++) this.advance();
          out += String.fromCharCode(parseInt(hex, 16));
          continue;
        }
        const mapped = e === undefined ? undefined : ESCAPES[e];
        if (mapped === undefined) this.fail(`unknown escape \\${e ?? ''}`, 'Use one of \\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX');
        this.advance();
        out += mapped;
        continue;
      }
      out += this.advance();
    }
  }

  private parseNumber(pos: JsonPosition): LocatedJson {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(this.text.slice(this.i, this.i + 64));
    if (!m) this.fail(`malformed number`, 'Write numbers like 12, 0.5 or 2.5e-6 (no leading zeros, no trailing dot)');
    const raw = m[0];
    for (let k = 0; k < raw.length; k++) this.advance();
    const next = this.text[this.i];
    if (next !== undefined && /[A-Za-z_.µμ]/.test(next)) {
      this.fail(`a number followed directly by '${next}'`, 'Put a value with a unit in double quotes, e.g. "250 um"', pos);
    }
    return { kind: 'number', pos, value: Number(raw), raw };
  }
}

/** Parses JSON text, keeping positions. Throws InputError('json-syntax') located at line:column. */
export function parseLocatedJson(text: string, file?: string): LocatedJson {
  return new Parser(text, file).parseDocument();
}
