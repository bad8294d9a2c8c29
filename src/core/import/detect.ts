/**
 * Dialect and layout detection on the first part of a log (about 64 KB): delimiter, decimal sign, line
 * ending, metadata lines, header row(s) and where the numeric body starts. Options override each guess.
 */
import { InputError } from '../errors';
import { numberDecimalOf, splitFields, unquote, withoutTrailingEmpty } from './fields';
import { looksLikeUnitsRow } from './header';
import { textTimeKind } from './time-text';
import type { Delimiter, ImportOptions } from './types';

/** What detection found out about the file's layout. */
export interface Layout {
  delimiter: Delimiter;
  decimal: '.' | ',';
  lineEnding: 'LF' | 'CRLF' | 'CR';
  /** Number of fields in a data row (trailing empty fields not counted). */
  fieldCount: number;
  headerCells: string[] | null;
  unitCells: string[] | null;
  /** 1-based line of the (first) header row. */
  headerLine: number | null;
  preambleLines: number;
  metadata: Record<string, string>;
  /** Character offset in the sample where the first data line starts. */
  bodyStartOffset: number;
  /** 1-based line number of the first data line. */
  bodyStartLine: number;
  /** The first few data rows split into fields, for time-format detection. */
  firstRows: string[][];
  forced: string[];
}

interface Line {
  text: string;
  /** 1-based line number. */
  number: number;
  offset: number;
}

const COMMENT_RE = /^\s*(#|\/\/|%|!)/;
const DELIMITER_PREFERENCE: Delimiter[] = ['\t', ';', ',', 'whitespace'];

/** Whether a line is a comment (skipped everywhere; in the preamble its `key: value` is kept). */
export function isCommentLine(text: string): boolean {
  return COMMENT_RE.test(text);
}

function splitLines(sample: string, final: boolean): Line[] {
  const lines: Line[] = [];
  let offset = 0;
  let number = 1;
  while (offset < sample.length) {
    const nl = sample.indexOf('\n', offset);
    if (nl < 0) {
      if (final) lines.push({ text: sample.slice(offset).replace(/\r$/, ''), number, offset });
      break;
    }
    const end = nl > offset && sample.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
    lines.push({ text: sample.slice(offset, end), number, offset });
    offset = nl + 1;
    number++;
  }
  return lines;
}

function fieldsOf(text: string, d: Delimiter): string[] {
  return withoutTrailingEmpty(splitFields(text, d));
}

function isValueField(f: string): boolean {
  const t = unquote(f);
  return t === '' || numberDecimalOf(t) !== null || textTimeKind(t) !== null || /^(nan|n\/a)$/i.test(t);
}

function modeOf(values: number[]): number {
  const counts = new Map<number, number>();
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
  let best = 0;
  let bestCount = -1;
  for (const [v, c] of counts) if (c > bestCount || (c === bestCount && v > best)) [best, bestCount] = [v, c];
  return best;
}

/**
 * Number of fields of a data row for delimiter d: the largest count c that at least half of the tail lines fit
 * (a line fits when it has c fields once trailing empty ones are dropped, or fewer, padded by its own trailing
 * delimiters — a missing last value is still delimited). Null if the last line does not fit.
 */
function fieldCountOf(tail: Line[], d: Delimiter): number | null {
  const counts = tail.map((l) => {
    const raw = splitFields(l.text, d);
    return { trimmed: withoutTrailingEmpty(raw).length, raw: raw.length };
  });
  const candidates = [...new Set(counts.map((c) => c.trimmed))].sort((a, b) => b - a);
  const last = counts[counts.length - 1];
  for (const c of candidates) {
    const fit = counts.filter((x) => x.trimmed <= c && c <= x.raw).length;
    if (fit / counts.length >= 0.5 && last && last.trimmed <= c && c <= last.raw) return c;
  }
  return null;
}

function chooseDelimiter(tail: Line[]): { delimiter: Delimiter; fieldCount: number } {
  let best: { delimiter: Delimiter; fieldCount: number; score: number } | null = null;
  for (const d of DELIMITER_PREFERENCE) {
    const mode = fieldCountOf(tail, d);
    if (mode === null || mode < 2) continue;
    let values = 0;
    let all = 0;
    for (const l of tail) {
      const f = fieldsOf(l.text, d);
      if (f.length > mode) continue;
      all += mode;
      values += f.filter(isValueField).length + (mode - f.length);
    }
    const score = values / all;
    if (!best || score > best.score + 1e-9) best = { delimiter: d, fieldCount: mode, score };
  }
  if (best && best.score > 0) return { delimiter: best.delimiter, fieldCount: best.fieldCount };
  return { delimiter: 'none', fieldCount: 1 };
}

function chooseDecimal(tail: Line[], d: Delimiter): '.' | ',' {
  let dots = 0;
  let commas = 0;
  for (const l of tail) {
    for (const f of fieldsOf(l.text, d)) {
      if (textTimeKind(f)) continue;
      const k = numberDecimalOf(f);
      if (k === '.') dots++;
      else if (k === ',') commas++;
    }
  }
  return commas > dots ? ',' : '.';
}

/** Reads `key: value`, `key = value` or `key<delimiter>value` from a preamble line; null if none. */
export function metadataPair(text: string, d: Delimiter): [string, string] | null {
  const t = text.replace(COMMENT_RE, '').trim();
  const kv = /^([^:=]{1,80}?)\s*[:=]\s*(.*)$/.exec(t);
  const clean = (s: string): string => unquote(s.trim().replace(/[,;\t]+$/, '').trim());
  if (kv && (kv[1] ?? '').trim() !== '') return [clean(kv[1] ?? ''), clean(kv[2] ?? '')];
  if (d !== 'none' && d !== 'whitespace') {
    const f = fieldsOf(t, d);
    if (f.length === 2 && f[0] !== '') return [clean(f[0] ?? ''), clean(f[1] ?? '')];
  }
  return null;
}

/**
 * Detects the layout from the start of the text (BOM already removed). `final` says the sample is the whole
 * file (else its last, possibly cut, line is not used).
 */
export function detectLayout(sample: string, final: boolean, options: ImportOptions): Layout {
  const file = options.sourceName;
  if (sample.trim() === '') {
    throw new InputError('empty-file', 'The file is empty', 'Choose the log file your logger wrote (it should hold a header and rows of numbers)', { file });
  }
  const lineEnding: Layout['lineEnding'] = sample.includes('\r\n') ? 'CRLF' : sample.includes('\n') ? 'LF' : sample.includes('\r') ? 'CR' : 'LF';
  // a lone CR ends lines in old Mac-style files; same length, so offsets stay valid
  const all = splitLines(lineEnding === 'CR' ? sample.replace(/\r/g, '\n') : sample, final);
  const content = all.filter((l) => l.text.trim() !== '' && !isCommentLine(l.text));
  if (content.length === 0) {
    throw new InputError('no-data-rows', 'The file holds only comments or blank lines, no data rows', 'Check that this is the log file itself and not a settings or notes file', { file });
  }
  const tailLength = Math.max(1, Math.min(30, Math.ceil(content.length / 2)));
  const tail = content.slice(-tailLength);

  const forced: string[] = [];
  let delimiter: Delimiter;
  let fieldCount: number;
  if (options.delimiter) {
    delimiter = options.delimiter;
    fieldCount = fieldCountOf(tail, delimiter) ?? modeOf(tail.map((l) => fieldsOf(l.text, delimiter).length));
    forced.push('delimiter');
  } else {
    ({ delimiter, fieldCount } = chooseDelimiter(tail));
  }
  let decimal: '.' | ',';
  if (options.decimal) {
    decimal = options.decimal;
    forced.push('decimal');
  } else {
    decimal = delimiter === ',' && !sample.includes('"') ? '.' : chooseDecimal(tail, delimiter);
  }

  const isData = (l: Line): boolean => {
    const raw = splitFields(l.text, delimiter);
    const f = withoutTrailingEmpty(raw);
    if (f.length > fieldCount || raw.length < fieldCount) return false;
    let numbers = 0;
    for (const x of f) {
      const t = unquote(x);
      if (t === '' || /^(nan|n\/a)$/i.test(t)) continue;
      if (textTimeKind(t)) { numbers++; continue; }
      const k = numberDecimalOf(t);
      if (k === null || (k !== 'either' && k !== decimal)) return false;
      numbers++;
    }
    return numbers > 0;
  };

  const allNumbers = (l: Line): boolean => fieldsOf(l.text, delimiter).every((x) => isValueField(x) && unquote(x) !== '');
  let firstData = -1;
  for (let i = 0; i < content.length; i++) {
    const line = content[i] as Line;
    const next = content[i + 1];
    // a data line followed by another data line, by a row of numbers with the wrong count (a ragged row), or
    // by lines of which at least half are data (a bad row right after the first one)
    const following = content.slice(i + 1, i + 11);
    if (isData(line) && (next === undefined || isData(next) || allNumbers(next) || following.filter(isData).length * 2 >= following.length)) {
      firstData = i;
      break;
    }
  }
  if (firstData < 0) firstData = content.findIndex(isData); // a short log whose second row is bad
  if (firstData < 0) {
    const looksHeader = content.length <= 3;
    throw new InputError(
      looksHeader ? 'header-only' : 'no-data-rows',
      looksHeader ? 'The file has a header but no data rows' : 'No rows of numbers were found in the file',
      looksHeader
        ? 'The logger may have stopped before the first sample; choose a log that holds data'
        : 'Check the delimiter and decimal sign (options delimiter / decimal), or that this is a log file',
      { file, line: (content[content.length - 1] as Line).number },
    );
  }
  const dataLine = content[firstData] as Line;

  let headerCells: string[] | null = null;
  let unitCells: string[] | null = null;
  let headerLine: number | null = null;
  let preambleEnd = firstData; // index in content of the first line not in the preamble
  const h = content[firstData - 1];
  if (h) {
    let hf = fieldsOf(h.text, delimiter);
    if (hf.length === fieldCount - 1) {
      // `2026-03-14 10:00:00.5  12.3` between runs of spaces: one header name over a date and a time field
      const first = fieldsOf(dataLine.text, delimiter);
      const k = first.findIndex((x, i) => textTimeKind(x) === 'date' && textTimeKind(first[i + 1] ?? '') === 'hms');
      if (k >= 0 && k < hf.length) hf = [...hf.slice(0, k), 'Date', ...hf.slice(k)];
    }
    if (hf.length === fieldCount || (fieldCount === 1 && hf.length === 1)) {
      headerCells = hf;
      headerLine = h.number;
      preambleEnd = firstData - 1;
      const h2 = content[firstData - 2];
      if (h2 && looksLikeUnitsRow(hf)) {
        const h2f = fieldsOf(h2.text, delimiter);
        if (h2f.length === fieldCount && !looksLikeUnitsRow(h2f)) {
          headerCells = h2f;
          unitCells = hf;
          headerLine = h2.number;
          preambleEnd = firstData - 2;
        }
      }
    }
  }

  const metadata: Record<string, string> = {};
  const preambleStopLine = headerLine ?? dataLine.number;
  let preambleLines = 0;
  for (const l of all) {
    if (l.number >= preambleStopLine) break;
    preambleLines++;
    if (l.text.trim() === '') continue;
    const pair = metadataPair(l.text, delimiter);
    if (pair && !(pair[0] in metadata)) metadata[pair[0]] = pair[1];
  }
  void preambleEnd;

  const firstRows = content.slice(firstData, firstData + 20).filter(isData).map((l) => fieldsOf(l.text, delimiter));
  return {
    delimiter,
    decimal,
    lineEnding,
    fieldCount,
    headerCells,
    unitCells,
    headerLine,
    preambleLines,
    metadata,
    bodyStartOffset: dataLine.offset,
    bodyStartLine: dataLine.number,
    firstRows,
    forced,
  };
}
