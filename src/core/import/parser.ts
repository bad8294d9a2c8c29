/**
 * The log importer: text or UTF-8 byte chunks in, a {@link Recording} and an {@link ImportReport} out. Pure (no
 * I/O): `src/io/read-log.ts` feeds it a file's chunks (bytes for UTF-8 files, so that they need not be decoded).
 * Detection runs once on the first ~64 KB (as text); the rest of the file goes through the fast numeric
 * tokenizer of `body.ts`, on the bytes themselves when every column is a plain number.
 */
import { InputError, type Warning } from '../errors';
import type { Recording } from '../recording/types';
import { BodyParser, formatOffset, type BodyResult } from './body';
import { planColumns, type ColumnPlan } from './columns';
import { detectLayout, type Layout } from './detect';
import { parseIsoDate, parseIsoTime } from './time-text';
import type { ImportOptions, ImportReport } from './types';
import { copyBytes, decodeUtf8, encodeUtf8, Utf8StreamDecoder } from './utf8';

/** Characters collected before the layout is detected. */
export const DETECTION_SAMPLE_CHARS = 64 * 1024;

/** A log parser fed chunk by chunk. */
export interface LogParser {
  /**
   * Feeds the next piece of the file, in order: text, or the file's bytes as UTF-8 (a character may be cut
   * between two byte chunks; do not switch between text and bytes inside a character).
   */
  push(chunk: string | Uint8Array): void;
  /** Ends the input; returns the recording and what was recognised. Throws InputError for bad input. */
  finish(): ImportResult;
}

export interface ImportResult {
  recording: Recording;
  report: ImportReport;
}

/** Control characters that never occur in a text log (NUL and C0 codes other than tab, LF, CR, FF). */
const BINARY_RE = /[\u0000-\u0008\u000E-\u001A\u001C-\u001F]/;

/** The byte twin of BINARY_RE's test, on the first `limit` bytes. */
function hasBinaryByte(bytes: Uint8Array, limit: number): boolean {
  const n = Math.min(bytes.length, limit);
  for (let i = 0; i < n; i++) {
    const c = bytes[i] as number;
    if (c <= 8 || (c >= 14 && c <= 26) || (c >= 28 && c <= 31)) return true;
  }
  return false;
}

/** Creates a parser for one log. */
export function createLogParser(options: ImportOptions = {}): LogParser {
  const file = options.sourceName;
  let pending = '';
  let started = false;
  let hadBom = false;
  let chars = 0;
  let layout: Layout | null = null;
  let plan: ColumnPlan | null = null;
  let body: BodyParser | null = null;
  let decoder: Utf8StreamDecoder | null = null;
  /** Copies of the bytes behind `pending` while all of it came as bytes (else null): the body then gets bytes. */
  let pendingBytes: Uint8Array[] | null = [];

  const checkText = (text: string): void => {
    const m = BINARY_RE.exec(text);
    const replacement = (text.match(/\uFFFD/g) ?? []).length;
    if (m || replacement > Math.max(8, text.length / 1000)) {
      throw new InputError(
        'binary-file',
        'This is not a text log: it contains binary data',
        'Export the log from the logger as delimited text (CSV, TSV), or choose the .csv/.txt file rather than the device\'s own binary file',
        { file, line: m ? text.slice(0, m.index).split('\n').length : undefined },
      );
    }
  };

  const start = (final: boolean): void => {
    // detection looks at the first ~64 KB only (the first chunk may be 4 MB)
    const sampleFinal = final && pending.length <= DETECTION_SAMPLE_CHARS;
    const sample = sampleFinal ? pending : pending.slice(0, DETECTION_SAMPLE_CHARS);
    checkText(sample);
    layout = detectLayout(sample, sampleFinal, options);
    plan = planColumns(layout, options);
    let expectedRows: number | undefined;
    if (options.sizeHintChars !== undefined && !sampleFinal) {
      const bodySample = sample.length - layout.bodyStartOffset;
      let lines = 0;
      for (let i = sample.indexOf('\n', layout.bodyStartOffset); i >= 0; i = sample.indexOf('\n', i + 1)) lines++;
      if (lines > 0) expectedRows = Math.ceil((options.sizeHintChars / (bodySample / lines)) * 1.05) + 16;
    }
    body = new BodyParser({
      expectedRows,
      sourceName: file,
      delimiter: layout.delimiter,
      decimal: layout.decimal,
      fieldCount: layout.fieldCount,
      timeIndex: plan.timeIndex,
      dateIndex: plan.dateIndex,
      timeFormat: plan.timeFormat,
      timeFactor: plan.timeFactor,
      sampleRateHz: options.sampleRateHz,
      timezoneOffsetMin: options.timezoneOffsetMin,
      channels: plan.channels,
      headers: plan.reports.map((r) => r.header),
      firstLine: layout.bodyStartLine,
      crOnly: layout.lineEnding === 'CR',
      skipBadRows: options.skipBadRows ?? false,
      sortTime: options.sortTime ?? false,
      dropRepeatedTime: options.dropRepeatedTime ?? false,
    });
    const head = pending.slice(0, layout.bodyStartOffset);
    const rest = pending.slice(layout.bodyStartOffset);
    pending = '';
    const parts = pendingBytes;
    pendingBytes = null;
    // hand the body over as bytes when the text before it maps back to bytes exactly (no U+FFFD for bad bytes)
    if (parts && parts.length > 0 && body.takesBytes && !head.includes('\uFFFD')) {
      const all = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
      let at = 0;
      for (const p of parts) {
        all.set(p, at);
        at += p.length;
      }
      if (decoder?.pending) decoder = new Utf8StreamDecoder(); // its held-back bytes are in `all`
      body.pushBytes(all.subarray(encodeUtf8(head).length + (hadBom ? 3 : 0)));
    } else body.push(rest);
  };

  const pushText = (chunk: string, counted: boolean): void => {
    if (!counted) pendingBytes = null;
    if (chunk.length === 0) return;
    if (!started) {
      started = true;
      if (chunk.charCodeAt(0) === 0xfeff) {
        hadBom = true;
        chunk = chunk.slice(1);
      }
    }
    if (!counted) chars += chunk.length;
    if (body) {
      if (chunk.length > 4096 ? BINARY_RE.test(chunk.slice(0, 4096)) : BINARY_RE.test(chunk)) checkText(chunk);
      body.push(chunk);
      return;
    }
    pending += chunk;
    if (pending.length >= DETECTION_SAMPLE_CHARS) start(false);
  };

  const pushBytes = (chunk: Uint8Array): void => {
    let bytes = chunk;
    if (bytes.length === 0) return;
    chars += bytes.length;
    decoder ??= new Utf8StreamDecoder();
    // detection works on text: decode only until the body parser exists (cut between characters, so that the
    // decoder holds nothing back), then hand the rest of the chunk over as bytes
    let off = 0;
    while (!body && off < bytes.length) {
      let cut = Math.min(bytes.length, off + Math.max(4096, DETECTION_SAMPLE_CHARS - pending.length));
      while (cut < bytes.length && ((bytes[cut] as number) & 0xc0) === 0x80) cut++;
      const piece = bytes.subarray(off, cut);
      pendingBytes?.push(copyBytes(piece));
      pushText(decoder.decode(piece), true);
      off = cut;
    }
    if (off === bytes.length) return;
    if (off > 0) bytes = bytes.subarray(off);
    if (body?.takesBytes && !decoder.pending) {
      if (hasBinaryByte(bytes, 4096)) checkText(decodeUtf8(bytes));
      body.pushBytes(bytes);
      return;
    }
    // a layout with text times or dates (read from text), or a character cut at the end of the last chunk
    pushText(decoder.decode(bytes), true);
  };

  return {
    push(chunk: string | Uint8Array): void {
      if (typeof chunk === 'string') pushText(chunk, false);
      else pushBytes(chunk);
    },
    finish(): ImportResult {
      if (decoder?.pending) pushText(decoder.decode(new Uint8Array(0), true), true);
      if (!body) start(true);
      const result = (body as BodyParser).end();
      return assemble(layout as Layout, plan as ColumnPlan, result, options, hadBom, chars);
    },
  };
}

/** Parses a whole log held in one string. */
export function parseLogText(text: string, options: ImportOptions = {}): ImportResult {
  const parser = createLogParser(options);
  parser.push(text);
  return parser.finish();
}

const START_KEY_RE = /start|begin|date|time|created|recorded|stamp/i;

function startFromMetadata(metadata: Record<string, string>, options: ImportOptions, warnings: Warning[]): { dateMs: number | null; startEpochS: number | null } {
  let dateMs: number | null = null;
  let startEpochS: number | null = null;
  for (const [key, value] of Object.entries(metadata)) {
    if (!START_KEY_RE.test(key)) continue;
    const iso = parseIsoTime(value, options.timezoneOffsetMin ?? 0);
    if (iso && startEpochS === null) {
      startEpochS = iso.epochWholeS + iso.fractionS;
      if (!iso.hasZone && options.timezoneOffsetMin === undefined) {
        warnings.push({ code: 'timezone-assumed-utc', message: `The start time '${key}: ${value}' carries no time zone; it was taken as UTC (give the zone with --timezone)` });
      }
    }
    const date = parseIsoDate(value);
    if (date !== null && dateMs === null) dateMs = date;
  }
  return { dateMs, startEpochS };
}

function assemble(layout: Layout, plan: ColumnPlan, body: BodyResult, options: ImportOptions, hadBom: boolean, chars: number): ImportResult {
  const source = options.sourceName ?? '(text)';
  const warnings: Warning[] = [...plan.warnings, ...body.warnings];
  const meta = startFromMetadata(layout.metadata, options, warnings);
  let startEpochMs: number | null = body.firstEpochMs;
  const dateMs = body.firstDateMs ?? meta.dateMs;
  if (startEpochMs === null && plan.timeFormat === 'clock' && body.firstClockS !== null && dateMs !== null) {
    startEpochMs = dateMs + Math.round((body.firstClockS - (options.timezoneOffsetMin ?? 0) * 60) * 1e9) / 1e6;
    if (options.timezoneOffsetMin === undefined) {
      warnings.push({ code: 'timezone-assumed-utc', message: 'Clock times carry no time zone; they were taken as UTC (give the logger\'s zone with --timezone)' });
    }
  }
  if (startEpochMs === null && meta.startEpochS !== null && plan.timeFormat !== 'clock') {
    const offsetS = plan.timeFormat === 'sample-rate' ? 0 : body.firstRawS;
    startEpochMs = Math.round((meta.startEpochS + offsetS) * 1e6) / 1e3;
  }
  const recording: Recording = {
    timeS: body.timeS,
    startEpochMs,
    channels: plan.channels.map((c, k) => ({
      name: c.name,
      quantity: c.quantity,
      originalHeader: c.header,
      originalUnit: c.unit,
      values: body.values[k] as Float64Array,
      sourceIndex: 0,
    })),
    metadata: { ...layout.metadata },
    sources: [source],
    warnings,
  };
  const forced = [...layout.forced];
  if (options.timeColumn !== undefined) forced.push('time column');
  if (options.timeFormat) forced.push('time format');
  if (options.sampleRateHz !== undefined) forced.push('sample rate');
  if (options.timezoneOffsetMin !== undefined) forced.push(`timezone ${formatOffset(options.timezoneOffsetMin)}`);
  if (options.columns?.length) forced.push('columns');
  const report: ImportReport = {
    source,
    dialect: {
      delimiter: layout.delimiter,
      decimal: layout.decimal,
      hadBom,
      lineEnding: layout.lineEnding,
      preambleLines: layout.preambleLines,
      headerRows: layout.headerCells === null ? 0 : layout.unitCells === null ? 1 : 2,
      headerLine: layout.headerLine,
      timeFormat: plan.timeFormat,
      timeColumn: plan.timeIndex === null ? null : plan.timeIndex + 1,
      dateColumn: plan.dateIndex === null ? null : plan.dateIndex + 1,
      forced,
    },
    columns: plan.reports,
    rows: body.rows,
    skippedRows: body.skippedRows,
    bytes: chars,
    metadata: { ...layout.metadata },
    warnings,
  };
  return { recording, report };
}
