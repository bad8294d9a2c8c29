/**
 * Splitting a line into fields (quote-aware) and reading one number from a field's text.
 * This is the careful, slow path used for detection and for lines the fast tokenizer rejects.
 */
import type { Delimiter } from './types';

/** Splits one line (without its line ending) into trimmed fields. Quotes around a field are kept. */
export function splitFields(line: string, delimiter: Delimiter): string[] {
  if (delimiter === 'none') return [line.trim()];
  if (delimiter === 'whitespace') {
    const t = line.trim();
    if (t === '') return [''];
    if (!t.includes('"')) return t.split(/[ \t]+/);
  }
  const out: string[] = [];
  const isSep = delimiter === 'whitespace' ? (c: string) => c === ' ' || c === '\t' : (c: string) => c === delimiter;
  const s = delimiter === 'whitespace' ? line.trim() : line;
  let i = 0;
  const n = s.length;
  while (i <= n) {
    let field = '';
    while (i < n && (s[i] === ' ' || (s[i] === '\t' && delimiter !== '\t'))) i++;
    if (s[i] === '"') {
      // quoted field: "" inside is an escaped quote
      let j = i + 1;
      let inner = '';
      while (j < n) {
        if (s[j] === '"') {
          if (s[j + 1] === '"') {
            inner += '"';
            j += 2;
            continue;
          }
          break;
        }
        inner += s[j];
        j++;
      }
      field = `"${inner}"`;
      i = j + 1;
      while (i < n && !isSep(s[i] as string)) i++; // anything after the closing quote is dropped
    } else {
      const start = i;
      while (i < n && !isSep(s[i] as string)) i++;
      field = s.slice(start, i);
    }
    out.push(field.trim());
    if (i >= n) break;
    i++; // the separator
    if (delimiter === 'whitespace') while (i < n && (s[i] === ' ' || s[i] === '\t')) i++;
  }
  return out;
}

/** Removes one pair of surrounding double quotes. */
export function unquote(field: string): string {
  return field.length >= 2 && field.startsWith('"') && field.endsWith('"') ? field.slice(1, -1).trim() : field;
}

/** Fields with trailing empty ones removed (loggers often end rows with a delimiter). */
export function withoutTrailingEmpty(fields: string[]): string[] {
  let n = fields.length;
  while (n > 1 && fields[n - 1] === '') n--;
  return n === fields.length ? fields : fields.slice(0, n);
}

const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const MISSING_RE = /^(nan|n\/a|na|-|--|null)$/i;

/**
 * Reads a number written with the given decimal sign. Returns the value, `missing` for an empty field or a
 * not-a-number marker (NaN, N/A, -), or `invalid`.
 */
export function parseNumberText(field: string, decimal: '.' | ','): number | 'missing' | 'invalid' {
  let t = unquote(field.trim());
  if (t === '' || MISSING_RE.test(t)) return 'missing';
  if (decimal === ',') {
    if (t.includes('.')) return 'invalid';
    t = t.replace(',', '.');
  }
  if (!NUMBER_RE.test(t)) return 'invalid';
  return Number(t);
}

/** Whether a field reads as a number with either decimal sign (for detection). */
export function numberDecimalOf(field: string): '.' | ',' | 'either' | null {
  const t = unquote(field.trim());
  if (/^[+-]?\d+([eE][+-]?\d+)?$/.test(t)) return 'either';
  if (NUMBER_RE.test(t)) return '.';
  if (NUMBER_RE.test(t.replace(',', '.')) && !t.includes('.')) return ',';
  return null;
}
