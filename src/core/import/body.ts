/**
 * The numeric body of a log, parsed from string chunks as they arrive (pure: no I/O).
 *
 * Speed: a hand-written tokenizer reads each line's numbers straight from the chunk with charCodeAt, without
 * splitting strings. Numbers with at most 15 significant digits and a decimal exponent within ±22 are
 * converted with one exact integer and one division or multiplication by an exact power of ten, which is
 * correctly rounded (Clinger's fast path: W. D. Clinger, "How to read floating point numbers accurately",
 * PLDI 1990); anything else falls back to Number(). Lines the fast path cannot read (quotes, empty fields,
 * text, comments) go to the careful slow path, which also produces the located error messages.
 */
import { InputError, type Warning } from '../errors';
import type { ChannelPlan } from './columns';
import { isCommentLine } from './detect';
import { parseNumberText, splitFields, unquote, withoutTrailingEmpty } from './fields';
import { GrowableFloat64 } from './growable';
import { parseHmsParts, parseIsoDate, parseIsoTime } from './time-text';
import type { Delimiter, TimeFormat } from './types';
import { copyBytes, decodeUtf8, encodeUtf8 } from './utf8';

export interface BodyConfig {
  sourceName?: string;
  delimiter: Delimiter;
  decimal: '.' | ',';
  fieldCount: number;
  timeIndex: number | null;
  /** 0-based index of a YYYY-MM-DD column completing clock times, or null. */
  dateIndex?: number | null;
  timeFormat: TimeFormat | 'sample-rate';
  timeFactor: number;
  sampleRateHz?: number;
  timezoneOffsetMin?: number;
  channels: ChannelPlan[];
  /** Header text per column, for messages. */
  headers: string[];
  /** 1-based line number of the first line pushed. */
  firstLine: number;
  /** Expected number of rows (from the file size), to allocate the columns once; grown if exceeded. */
  expectedRows?: number;
  /** The file uses a lone CR as line ending. */
  crOnly: boolean;
  skipBadRows: boolean;
  sortTime: boolean;
  dropRepeatedTime: boolean;
}

/** What the body parser hands back. */
export interface BodyResult {
  /** Time in seconds from the first sample, sorted and strictly increasing. */
  timeS: Float64Array;
  /** Absolute time of the first sample (epoch ms), when the time column carries it (ISO). */
  firstEpochMs: number | null;
  /** Seconds of day of the first sample for clock times (to combine with a date from metadata). */
  firstClockS: number | null;
  /** Epoch ms of the first sample's date, when a date column completes clock times. */
  firstDateMs: number | null;
  /** The first sample's time as read (seconds, before shifting to start at 0; ISO: within its first second). */
  firstRawS: number;
  values: Float64Array[];
  rows: number;
  skippedRows: number;
  warnings: Warning[];
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];
const SPACE = 32;
const TAB = 9;
const HALF_DAY_S = 43200;
const DAY_S = 86400;

export class BodyParser {
  private readonly cfg: BodyConfig;
  /** Column storage grown together (one capacity check per row): time, then one array per channel. */
  private cap: number;
  private n = 0;
  private timeArr: Float64Array<ArrayBuffer>;
  private colArrs: Float64Array<ArrayBuffer>[];
  private readonly lines: GrowableFloat64 | null;
  private readonly row: Float64Array;
  private readonly delimCode: number;
  private readonly whitespace: boolean;
  private readonly decCode: number;
  private readonly numericTime: boolean;
  private readonly timeIdx: number;
  /** Index of the time field when it is text (ISO, hh:mm:ss), else -1. */
  private readonly textTimeField: number;
  /** Index of a date field (YYYY-MM-DD) completing clock times, else -1. */
  private readonly dateField: number;
  private baseDateMs: number | null = null;
  private firstDateMs: number | null = null;
  private readonly chanIndex: Int32Array;
  private readonly chanFactor: Float64Array;
  private carry = '';
  /** The cut last line of the previous byte chunk (UTF-8), or null. */
  private carryBytes: Uint8Array | null = null;
  /** Every field is a plain number (no text time, no date): the byte tokenizer can read the lines. */
  readonly takesBytes: boolean;
  private lineNo: number;
  private dataRows = 0;
  private lastT = Number.NEGATIVE_INFINITY;
  private lastLine = 0;
  private badRows = 0;
  private firstBad: { line: number; what: string } | null = null;
  private missingValues = 0;
  private repeatedDropped = 0;
  private outOfOrder = 0;
  private rollovers = 0;
  private dayOffsetS = 0;
  private prevClockS: number | null = null;
  private isoBaseWholeS: number | null = null;
  private isoWithoutZone = false;
  private firstClockS: number | null = null;
  private hmsBaseWholeS: number | null = null;
  /** Per field: a power-of-ten unit factor folded into the decimal exponent (exact: one rounding). */
  private readonly shift: Int32Array;

  constructor(cfg: BodyConfig) {
    this.cfg = cfg;
    this.lineNo = cfg.firstLine;
    this.cap = Math.max(1024, Math.min(cfg.expectedRows ?? 0, 1 << 28));
    this.timeArr = new Float64Array(this.cap);
    this.colArrs = cfg.channels.map(() => new Float64Array(this.cap));
    this.lines = cfg.sortTime ? new GrowableFloat64(1 << 16) : null;
    this.row = new Float64Array(cfg.fieldCount);
    this.whitespace = cfg.delimiter === 'whitespace';
    this.delimCode = cfg.delimiter === 'whitespace' || cfg.delimiter === 'none' ? -1 : cfg.delimiter.charCodeAt(0);
    this.decCode = cfg.decimal.charCodeAt(0);
    this.numericTime = cfg.timeFormat === 'seconds' || cfg.timeFormat === 'milliseconds' || cfg.timeFormat === 'minutes' || cfg.timeFormat === 'hours';
    this.timeIdx = cfg.timeIndex ?? -1;
    this.textTimeField = this.numericTime ? -1 : this.timeIdx;
    this.dateField = cfg.dateIndex ?? -1;
    this.takesBytes = this.textTimeField < 0 && this.dateField < 0;
    // A factor 10^k (mbar → Pa, kPa → Pa, ms → s) is applied by shifting the decimal exponent while reading,
    // so that '0.315068' kPa becomes exactly the double nearest 315.068 Pa (multiplying by 1000 would not).
    this.shift = new Int32Array(cfg.fieldCount);
    const timeShift = cfg.timeFormat === 'milliseconds' ? -3 : 0;
    if (cfg.timeIndex !== null && cfg.timeIndex !== undefined && timeShift !== 0) this.shift[cfg.timeIndex] = timeShift;
    this.chanIndex = Int32Array.from(cfg.channels.map((c) => c.index));
    this.chanFactor = Float64Array.from(cfg.channels.map((c) => {
      const k = powerOfTen(c.factorToSi);
      if (k === null || k === 0) return c.factorToSi;
      this.shift[c.index] = k;
      return 1;
    }));
  }

  /** Feeds the next piece of text (any size; lines may be split across chunks). */
  push(chunk: string): void {
    if (this.carryBytes) {
      this.carry = decodeUtf8(this.carryBytes);
      this.carryBytes = null;
    }
    if (this.cfg.crOnly) chunk = chunk.replace(/\r/g, '\n');
    let pos = 0;
    if (this.carry.length > 0) {
      // finish the line cut at the end of the previous chunk on its own, so that the hot loop below runs on
      // the chunk itself (a flat string) rather than on a concatenation (slower character access)
      const nl = chunk.indexOf('\n');
      if (nl < 0) {
        this.carry += chunk;
        return;
      }
      const s = this.carry + chunk.slice(0, nl + 1);
      this.carry = '';
      this.line(s, 0, s.length > 1 && s.charCodeAt(s.length - 2) === 13 ? s.length - 2 : s.length - 1);
      pos = nl + 1;
    }
    for (;;) {
      const nl = chunk.indexOf('\n', pos);
      if (nl < 0) break;
      const end = nl > pos && chunk.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
      this.line(chunk, pos, end);
      pos = nl + 1;
    }
    this.carry = chunk.slice(pos);
  }

  /**
   * Feeds the next piece of the file as UTF-8 bytes (lines and characters may be split across chunks). Only when
   * {@link takesBytes}. Lines of plain ASCII numbers are read straight from the bytes; any other line (quotes,
   * empty fields, text, decimal comma in a comma file, non-ASCII) is decoded and read by the careful path.
   */
  pushBytes(chunk: Uint8Array): void {
    const sep = this.cfg.crOnly ? 13 : 10;
    let pos = 0;
    if (this.carry.length > 0) {
      // text pushed before (the rest of the detection sample) ended inside a line: carry it on as bytes
      this.carryBytes = encodeUtf8(this.carry);
      this.carry = '';
    }
    if (this.carryBytes) {
      const nl = chunk.indexOf(sep);
      const head = nl < 0 ? chunk : chunk.subarray(0, nl + 1);
      const joined = new Uint8Array(this.carryBytes.length + head.length);
      joined.set(this.carryBytes);
      joined.set(head, this.carryBytes.length);
      this.carryBytes = null;
      if (nl < 0) {
        this.carryBytes = joined;
        return;
      }
      // the joined line is complete; scanning it cannot leave a carry
      this.scanBytes(joined, 0);
      pos = nl + 1;
    }
    const rest = this.scanBytes(chunk, pos);
    if (rest < chunk.length) this.carryBytes = copyBytes(chunk.subarray(rest));
  }

  /** Reads the last line (if the file does not end with a newline) and returns the columns. */
  end(): BodyResult {
    if (this.carryBytes) {
      const b = this.carryBytes;
      this.carryBytes = null;
      const sep = this.cfg.crOnly ? 13 : 10;
      // a complete line for the scanner: the cut last line plus a line ending
      const joined = new Uint8Array(b.length + 1);
      joined.set(b);
      joined[b.length] = sep;
      this.scanBytes(joined, 0);
    }
    if (this.carry.length > 0) {
      const s = this.carry;
      this.carry = '';
      this.line(s, 0, s.charCodeAt(s.length - 1) === 13 ? s.length - 1 : s.length);
    }
    return this.finish();
  }

  private line(s: string, start: number, end: number): void {
    const lineNo = this.lineNo++;
    if (start === end) return;
    if (this.parseFast(s, start, end)) {
      this.commit(lineNo);
      return;
    }
    const verdict = this.parseSlow(s.slice(start, end), lineNo);
    if (verdict === 'ok') this.commit(lineNo);
  }

  /** Reads a line of plain numbers into this.row; false when the line needs the slow path. */
  private parseFast(s: string, start: number, end: number): boolean {
    const nf = this.cfg.fieldCount;
    const row = this.row;
    const delim = this.delimCode;
    const ws = this.whitespace;
    const dec = this.decCode;
    const shift = this.shift;
    const textTimeField = this.textTimeField;
    let i = start;
    if (ws) while (i < end && (s.charCodeAt(i) === SPACE || s.charCodeAt(i) === TAB)) i++;
    let f = 0;
    for (;;) {
      if (f === nf) {
        while (i < end) {
          const c = s.charCodeAt(i);
          if (c !== delim && c !== SPACE && c !== TAB) return false;
          i++;
        }
        return true;
      }
      if (f === this.dateField) {
        let j = i;
        if (ws) while (j < end && s.charCodeAt(j) !== SPACE && s.charCodeAt(j) !== TAB) j++;
        else {
          j = s.indexOf(String.fromCharCode(delim), i);
          if (j < 0 || j > end) j = end;
        }
        const dateMs = parseIsoDate(s.slice(i, j).trim());
        if (dateMs === null) return false;
        row[f] = dateMs;
        i = j;
      } else if (f === textTimeField) {
        let j = i;
        if (ws) while (j < end && s.charCodeAt(j) !== SPACE && s.charCodeAt(j) !== TAB) j++;
        else {
          j = s.indexOf(String.fromCharCode(delim), i);
          if (j < 0 || j > end) j = end;
        }
        const t = this.textTime(s.slice(i, j).trim());
        if (Number.isNaN(t)) return false;
        row[f] = t;
        i = j;
      } else {
        while (i < end && s.charCodeAt(i) === SPACE) i++;
        const numStart = i;
        let c = s.charCodeAt(i);
        let neg = false;
        if (c === 45) {
          neg = true;
          i++;
        } else if (c === 43) i++;
        let mant = 0;
        let sig = 0;
        let exp10 = 0;
        let any = false;
        let exact = true;
        for (; i < end; i++) {
          const d = s.charCodeAt(i) - 48;
          if (d < 0 || d > 9) break;
          any = true;
          if (sig < 15) {
            mant = mant * 10 + d;
            if (mant !== 0) sig++;
          } else {
            exp10++;
            exact = false;
          }
        }
        if (i < end && s.charCodeAt(i) === dec) {
          i++;
          for (; i < end; i++) {
            const d = s.charCodeAt(i) - 48;
            if (d < 0 || d > 9) break;
            any = true;
            if (sig < 15) {
              mant = mant * 10 + d;
              exp10--;
              if (mant !== 0) sig++;
            } else if (d !== 0) exact = false;
          }
        }
        if (!any) return false;
        c = s.charCodeAt(i);
        if (i < end && (c === 101 || c === 69)) {
          i++;
          let eneg = false;
          c = s.charCodeAt(i);
          if (c === 45) {
            eneg = true;
            i++;
          } else if (c === 43) i++;
          let e = 0;
          let edigits = 0;
          for (; i < end; i++) {
            const d = s.charCodeAt(i) - 48;
            if (d < 0 || d > 9) break;
            e = e * 10 + d;
            edigits++;
          }
          if (edigits === 0) return false;
          exp10 += eneg ? -e : e;
        }
        let v: number;
        const sh = shift[f] as number;
        exp10 += sh;
        if (exact && exp10 >= -22 && exp10 <= 22) {
          v = exp10 < 0 ? mant / (POW10[-exp10] as number) : mant * (POW10[exp10] as number);
          if (neg) v = -v;
        } else {
          let text = s.slice(numStart, i);
          if (dec !== 46) text = text.replace(String.fromCharCode(dec), '.');
          v = shiftedNumber(text, sh);
        }
        row[f] = v;
      }
      f++;
      if (ws) {
        if (i === end) return f === nf;
        const c = s.charCodeAt(i);
        if (c !== SPACE && c !== TAB) return false;
        while (i < end && (s.charCodeAt(i) === SPACE || s.charCodeAt(i) === TAB)) i++;
        if (i === end) return f === nf;
      } else {
        while (i < end && s.charCodeAt(i) === SPACE) i++;
        if (i === end) return f === nf;
        if (s.charCodeAt(i) !== delim) return false;
        i++;
      }
    }
  }

  /**
   * Reads the complete lines of `b` from `pos` (bytes; every field a plain number) into the columns; returns where
   * the cut last line starts (b.length when the chunk ends with a line ending). The common row (fast read, time
   * increasing, room in the columns, no sorting) is stored here with the state in locals; anything else goes
   * through the same slow path and commit as text.
   */
  private scanBytes(b: Uint8Array, pos: number): number {
    const sep = this.cfg.crOnly ? 13 : 10;
    // complete lines only: the last line ending of the chunk bounds every line read below
    const len = b.lastIndexOf(sep) + 1;
    const lf = sep === 10;
    const row = this.row;
    const timeIdx = this.timeIdx;
    const timeShifted = timeIdx >= 0 && this.shift[timeIdx] !== 0;
    const timeFactor = this.cfg.timeFactor;
    const rate = this.cfg.sampleRateHz as number;
    const idx = this.chanIndex;
    const fac = this.chanFactor;
    const nc = idx.length;
    const simpleCommit = this.lines === null;
    let timeArr = this.timeArr;
    let cols = this.colArrs;
    let cap = this.cap;
    let n = this.n;
    let lineNo = this.lineNo;
    let dataRows = this.dataRows;
    let lastT = this.lastT;
    let lastLine = this.lastLine;
    while (pos < len) {
      const next = this.fastBytes(b, pos, sep);
      if (next > 0) {
        const ln = lineNo++;
        pos = next;
        let t: number;
        if (timeIdx < 0) t = dataRows / rate;
        else t = timeShifted ? (row[timeIdx] as number) : (row[timeIdx] as number) * timeFactor;
        if (t > lastT && n < cap && simpleCommit) {
          dataRows++;
          timeArr[n] = t;
          for (let k = 0; k < nc; k++) (cols[k] as Float64Array)[n] = (row[idx[k] as number] as number) * (fac[k] as number);
          n++;
          lastT = t;
          lastLine = ln;
          continue;
        }
        this.n = n;
        this.dataRows = dataRows;
        this.lastT = lastT;
        this.lastLine = lastLine;
        this.commit(ln);
      } else {
        const nl = b.indexOf(sep, pos);
        const start = pos;
        const end = lf && nl > start && b[nl - 1] === 13 ? nl - 1 : nl;
        const ln = lineNo++;
        pos = nl + 1;
        if (start === end) continue;
        this.n = n;
        this.dataRows = dataRows;
        this.lastT = lastT;
        this.lastLine = lastLine;
        if (this.parseSlow(decodeUtf8(b, start, end), ln) === 'ok') this.commit(ln);
      }
      n = this.n;
      dataRows = this.dataRows;
      lastT = this.lastT;
      lastLine = this.lastLine;
      timeArr = this.timeArr;
      cols = this.colArrs;
      cap = this.cap;
    }
    this.n = n;
    this.lineNo = lineNo;
    this.dataRows = dataRows;
    this.lastT = lastT;
    this.lastLine = lastLine;
    return Math.max(pos, len);
  }

  /**
   * Reads one line of plain ASCII numbers starting at `start` into this.row (the byte twin of {@link parseFast},
   * same rules); returns the position after its line ending, or -1 when the line needs the slow path or is cut
   * at the end of the chunk.
   */
  private fastBytes(b: Uint8Array, start: number, sep: number): number {
        const nf = this.cfg.fieldCount;
    const row = this.row;
    const delim = this.delimCode;
    const ws = this.whitespace;
    const dec = this.decCode;
    const shift = this.shift;
    let i = start;
    if (ws) while (b[i] === SPACE || b[i] === TAB) i++;
    let f = 0;
    for (;;) {
      if (f === nf) {
        // only delimiters and blanks may follow the last field
        for (;;) {
          const c = b[i] as number;
          if (c === sep) return i + 1;
          if (c === 13) return b[i + 1] === sep ? i + 2 : -1;
          if (c !== delim && c !== SPACE && c !== TAB) return -1;
          i++;
        }
      }
      while (b[i] === SPACE) i++;
      const numStart = i;
      let c = b[i] as number;
      let neg = false;
      if (c === 45) {
        neg = true;
        i++;
      } else if (c === 43) i++;
      // all digits go into one integer; with at most 15 of them it is exact (< 2^53)
      let mant = 0;
      const intStart = i;
      for (; ; i++) {
        const d = (b[i] as number) - 48;
        if (d >>> 0 > 9) break;
        mant = mant * 10 + d;
      }
      let digits = i - intStart;
      let exp10 = 0;
      if (b[i] === dec) {
        i++;
        const fracStart = i;
        for (; ; i++) {
          const d = (b[i] as number) - 48;
          if (d >>> 0 > 9) break;
          mant = mant * 10 + d;
        }
        digits += i - fracStart;
        exp10 = fracStart - i;
      }
      if (digits === 0) return -1;
      c = b[i] as number;
      if (c === 101 || c === 69) {
        i++;
        let eneg = false;
        c = b[i] as number;
        if (c === 45) {
          eneg = true;
          i++;
        } else if (c === 43) i++;
        let e = 0;
        const expStart = i;
        for (; ; i++) {
          const d = (b[i] as number) - 48;
          if (d >>> 0 > 9) break;
          e = e * 10 + d;
        }
        if (i === expStart) return -1;
        exp10 += eneg ? -e : e;
      }
      const exact = digits <= 15;
      let v: number;
      const sh = shift[f] as number;
      exp10 += sh;
      if (exact && exp10 >= -22 && exp10 <= 22) {
        v = exp10 < 0 ? mant / (POW10[-exp10] as number) : mant * (POW10[exp10] as number);
        if (neg) v = -v;
      } else {
        let text = '';
        for (let k = numStart; k < i; k++) text += String.fromCharCode(b[k] === dec ? 46 : (b[k] as number));
        v = shiftedNumber(text, sh);
      }
      row[f] = v;
      f++;
      // what follows the number decides
      c = b[i] as number;
      if (ws) {
        if (c === sep) return f === nf ? i + 1 : -1;
        if (c === 13) return f === nf && b[i + 1] === sep ? i + 2 : -1;
        if (c !== SPACE && c !== TAB) return -1;
        while (b[i] === SPACE || b[i] === TAB) i++;
        c = b[i] as number;
        if (c === sep) return f === nf ? i + 1 : -1;
        if (c === 13) return f === nf && b[i + 1] === sep ? i + 2 : -1;
      } else {
        while (b[i] === SPACE) i++;
        c = b[i] as number;
        if (c === sep) return f === nf ? i + 1 : -1;
        if (c === 13) return f === nf && b[i + 1] === sep ? i + 2 : -1;
        if (c !== delim) return -1;
        i++;
      }
    }
  }

  /** Seconds for a text time (ISO relative to the first sample's whole second, or hh:mm:ss); NaN if unreadable. */
  private textTime(text: string): number {
    const fmt = this.cfg.timeFormat;
    if (fmt === 'iso') {
      const iso = parseIsoTime(unquote(text), this.cfg.timezoneOffsetMin ?? 0);
      if (!iso) return Number.NaN;
      if (!iso.hasZone) this.isoWithoutZone = true;
      if (this.isoBaseWholeS === null) this.isoBaseWholeS = iso.epochWholeS;
      return iso.epochWholeS - this.isoBaseWholeS + iso.fractionS;
    }
    const p = parseHmsParts(unquote(text));
    if (p === null) return Number.NaN;
    if (this.hmsBaseWholeS === null) {
      this.hmsBaseWholeS = p.wholeS;
      this.firstClockS = p.wholeS + p.fractionS;
    }
    let t = p.wholeS - this.hmsBaseWholeS + this.dayOffsetS + p.fractionS;
    if (this.cfg.timeFormat === 'clock' && this.dateField < 0) {
      // a time of day far below the previous one means the log passed midnight
      if (this.prevClockS !== null && t < this.prevClockS - HALF_DAY_S) {
        this.dayOffsetS += DAY_S;
        this.rollovers++;
        t = p.wholeS - this.hmsBaseWholeS + this.dayOffsetS + p.fractionS;
      }
      this.prevClockS = t;
    }
    return t;
  }

  /** The careful path: quotes, empty values, comments, and located errors. */
  private parseSlow(text: string, lineNo: number): 'ok' | 'skip' {
    if (text.trim() === '' || isCommentLine(text)) return 'skip';
    const cfg = this.cfg;
    const raw = splitFields(text, cfg.delimiter);
    const fields = withoutTrailingEmpty(raw);
    // missing values at the end of a row still have their delimiters: `1.5,2.0,` is three fields
    while (fields.length < cfg.fieldCount && raw.length > fields.length) fields.push('');
    if (fields.length !== cfg.fieldCount) {
      return this.bad(
        lineNo,
        undefined,
        'ragged-row',
        `The row has ${fields.length} field${fields.length === 1 ? '' : 's'} where the header has ${cfg.fieldCount}`,
        'Check for a missing or extra delimiter on that line, or skip such rows with the skip-bad-rows option (--skip-bad-rows)',
      );
    }
    for (let f = 0; f < fields.length; f++) {
      const field = fields[f] as string;
      if (f === this.timeIdx) {
        let t: number;
        if (this.numericTime) {
          const v = parseNumberText(field, cfg.decimal);
          t = typeof v === 'number' ? shiftedNumber(String(v), this.shift[f] as number) : Number.NaN;
        } else t = this.textTime(field);
        if (Number.isNaN(t)) {
          return this.bad(lineNo, f + 1, 'bad-time-value', `The time value '${unquote(field)}' cannot be read as ${cfg.timeFormat} time`, 'Fix the value, give the right --time-format, or skip such rows with --skip-bad-rows');
        }
        this.row[f] = t;
        continue;
      }
      if (f === this.dateField) {
        const dateMs = parseIsoDate(field);
        if (dateMs === null) {
          return this.bad(lineNo, f + 1, 'bad-time-value', `The date '${unquote(field)}' is not a date written YYYY-MM-DD`, 'Fix the value, or skip such rows with --skip-bad-rows');
        }
        this.row[f] = dateMs;
        continue;
      }
      if (!this.chanIndex.includes(f)) continue; // an ignored column may hold anything
      const v = parseNumberText(field, cfg.decimal);
      if (v === 'invalid') {
        const header = cfg.headers[f];
        return this.bad(
          lineNo,
          f + 1,
          'non-numeric-value',
          `'${unquote(field)}' in column ${f + 1}${header ? ` ('${header}')` : ''} is not a number${cfg.decimal === ',' ? ' with a decimal comma' : ''}`,
          'Fix the value, or skip such rows with the skip-bad-rows option (--skip-bad-rows); skipped rows are counted',
        );
      }
      if (v === 'missing') {
        this.missingValues++;
        this.row[f] = Number.NaN;
      } else this.row[f] = shiftedNumber(String(v), this.shift[f] as number);
    }
    return 'ok';
  }

  private bad(line: number, column: number | undefined, code: string, problem: string, hint: string): 'skip' {
    if (!this.cfg.skipBadRows) throw new InputError(code, problem, hint, { file: this.cfg.sourceName, line, column });
    this.dataRows++;
    this.badRows++;
    if (!this.firstBad) this.firstBad = { line, what: problem };
    return 'skip';
  }

  private commit(lineNo: number): void {
    const cfg = this.cfg;
    let t: number;
    if (this.timeIdx < 0) t = this.dataRows / (cfg.sampleRateHz as number);
    else if (this.numericTime) {
      const v = this.row[this.timeIdx] as number;
      t = this.shift[this.timeIdx] !== 0 ? v : v * cfg.timeFactor;
    }
    else {
      t = this.row[this.timeIdx] as number;
      if (this.dateField >= 0) {
        const dateMs = this.row[this.dateField] as number;
        if (this.baseDateMs === null) {
          this.baseDateMs = dateMs;
          this.firstDateMs = dateMs;
        }
        t += (dateMs - this.baseDateMs) / 1000; // whole days: exact
      }
    }
    this.dataRows++;
    if (!(t > this.lastT)) {
      if (Number.isNaN(t)) {
        this.bad(lineNo, this.timeIdx + 1, 'bad-time-value', 'The time value is not a number', 'Fix the value or skip such rows with --skip-bad-rows');
        this.dataRows--;
        return;
      }
      if (t === this.lastT && cfg.dropRepeatedTime && !cfg.sortTime) {
        this.repeatedDropped++;
        return;
      }
      if (!cfg.sortTime) {
        const repeated = t === this.lastT;
        throw new InputError(
          repeated ? 'repeated-time' : 'time-backwards',
          repeated
            ? `The time repeats: this row has the same time as line ${this.lastLine}`
            : `The time goes backwards: this row is ${formatSeconds(this.lastT - t)} s earlier than line ${this.lastLine}`,
          repeated
            ? 'Drop rows with a repeated time with the drop-repeated-time option (--drop-repeated-time), or fix the log'
            : 'Sort the rows by time with the sort-time option (--sort-time) if the logger wrote them out of order, or fix the log',
          { file: cfg.sourceName, line: lineNo, column: this.timeIdx >= 0 ? this.timeIdx + 1 : undefined },
        );
      }
      this.outOfOrder++;
    }
    if (this.n === this.cap) this.grow();
    const n = this.n++;
    this.timeArr[n] = t;
    const row = this.row;
    const idx = this.chanIndex;
    const fac = this.chanFactor;
    const cols = this.colArrs;
    for (let k = 0; k < idx.length; k++) (cols[k] as Float64Array)[n] = (row[idx[k] as number] as number) * (fac[k] as number);
    if (this.lines) this.lines.push(lineNo);
    if (t > this.lastT) {
      this.lastT = t;
      this.lastLine = lineNo;
    }
  }

  private grow(): void {
    this.cap *= 2;
    const bigger = (a: Float64Array): Float64Array<ArrayBuffer> => {
      const b = new Float64Array(this.cap);
      b.set(a);
      return b;
    };
    this.timeArr = bigger(this.timeArr);
    this.colArrs = this.colArrs.map(bigger);
  }

  private finish(): BodyResult {
    const cfg = this.cfg;
    const warnings: Warning[] = [];
    // views when the columns are at least half full (no 100 MB copy for a large log; the size estimate from the
    // first 64 KB runs high when later rows are longer), copies when mostly empty
    const trim = (a: Float64Array): Float64Array => (this.n >= 0.5 * this.cap ? a.subarray(0, this.n) : a.slice(0, this.n));
    let timeS = trim(this.timeArr);
    let values = this.colArrs.map(trim);
    if (timeS.length === 0) {
      throw new InputError('no-data-rows', this.badRows > 0 ? `All ${this.badRows} data rows were bad and skipped` : 'The file has a header but no data rows', 'Choose a log that holds readable data rows', { file: cfg.sourceName });
    }
    if (this.outOfOrder > 0) {
      const order = Array.from({ length: timeS.length }, (_, i) => i);
      const t0 = timeS;
      order.sort((a, b) => (t0[a] as number) - (t0[b] as number) || a - b);
      const lines = this.lines?.toArray() ?? new Float64Array(timeS.length);
      const keep: number[] = [];
      let dropped = 0;
      for (const i of order) {
        const prev = keep[keep.length - 1];
        if (prev !== undefined && t0[i] === t0[prev]) {
          if (!cfg.dropRepeatedTime) {
            throw new InputError(
              'repeated-time',
              `After sorting, lines ${lines[prev]} and ${lines[i]} have the same time (${formatSeconds(t0[i] as number)} s)`,
              'Drop rows with a repeated time with the drop-repeated-time option (--drop-repeated-time), or fix the log',
              { file: cfg.sourceName, line: lines[i] },
            );
          }
          dropped++;
          continue;
        }
        keep.push(i);
      }
      this.repeatedDropped += dropped;
      timeS = Float64Array.from(keep, (i) => t0[i] as number);
      values = values.map((v) => Float64Array.from(keep, (i) => v[i] as number));
      warnings.push({ code: 'rows-sorted-by-time', message: `${this.outOfOrder} row(s) were out of time order; rows were sorted by time`, count: this.outOfOrder });
    }
    const first = timeS[0] as number;
    if (first !== 0) for (let i = 0; i < timeS.length; i++) timeS[i] = (timeS[i] as number) - first;
    let firstEpochMs: number | null = null;
    if (cfg.timeFormat === 'iso' && this.isoBaseWholeS !== null) firstEpochMs = this.isoBaseWholeS * 1000 + Math.round(first * 1e9) / 1e6; // to the ns, without the rounding of (whole + fraction) · 1000
    if (this.isoWithoutZone) {
      warnings.push({
        code: cfg.timezoneOffsetMin === undefined ? 'timezone-assumed-utc' : 'timezone-from-option',
        message: cfg.timezoneOffsetMin === undefined
          ? 'Timestamps carry no time zone; they were taken as UTC (give the logger\'s zone with --timezone, e.g. +01:00)'
          : `Timestamps carry no time zone; the given offset ${formatOffset(cfg.timezoneOffsetMin)} was applied`,
      });
    }
    if (this.badRows > 0) {
      warnings.push({ code: 'skipped-bad-rows', message: `${this.badRows} bad row(s) skipped; the first at line ${this.firstBad?.line}: ${this.firstBad?.what}`, count: this.badRows, location: { file: cfg.sourceName, line: this.firstBad?.line } });
    }
    if (this.repeatedDropped > 0) {
      warnings.push({ code: 'dropped-repeated-time', message: `${this.repeatedDropped} row(s) with a repeated time dropped (the first of each kept)`, count: this.repeatedDropped });
    }
    if (this.missingValues > 0) {
      warnings.push({ code: 'missing-values', message: `${this.missingValues} empty or NaN value(s) kept as missing (NaN)`, count: this.missingValues });
    }
    if (this.rollovers > 0) {
      warnings.push({ code: 'midnight-rollover', message: `The clock time passed midnight ${this.rollovers} time(s); 24 h were added each time`, count: this.rollovers });
    }
    return {
      timeS,
      firstEpochMs,
      firstClockS: this.firstClockS,
      firstDateMs: this.firstDateMs,
      firstRawS: first,
      values,
      rows: timeS.length,
      skippedRows: this.badRows + this.repeatedDropped,
      warnings,
    };
  }
}

/**
 * 10^k → k for powers of ten within ±22, else null. A product of SI prefixes (1e-9 · 1e-3 for nL/s) may miss the
 * double nearest 10^k by an ulp; those factors are exact decimal definitions, so a 1e-15 relative match counts.
 */
function powerOfTen(factor: number): number | null {
  for (let k = -22; k <= 22; k++) {
    const p = k < 0 ? 1 / (POW10[-k] as number) : (POW10[k] as number);
    if (Math.abs(factor - p) <= 1e-15 * p) return k;
  }
  return null;
}

/** Number(text) × 10^shift with one rounding (the shift goes into the decimal exponent). */
function shiftedNumber(text: string, shift: number): number {
  if (shift === 0) return Number(text);
  const m = /^([^eE]*)(?:[eE]([+-]?\d+))?$/.exec(text);
  return Number(`${m?.[1] ?? text}e${Number(m?.[2] ?? 0) + shift}`);
}

function formatSeconds(s: number): string {
  return String(Number(s.toPrecision(9)));
}

/** `+01:00` style UTC offset from minutes east. */
export function formatOffset(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const m = Math.abs(minutes);
  return `${sign}${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
}
