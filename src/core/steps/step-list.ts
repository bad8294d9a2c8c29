/**
 * Our own small step-list format, for logs that hold only the response (e.g. a syringe-pump programme):
 *
 * ```
 * # comment lines start with '#'; blank lines are ignored
 * time_s,flow_setpoint[uL/min]
 * 0,0
 * 60,10
 * 120,20
 * ```
 *
 * - Column 1: time since the start of the log — `time_s`, or `time[unit]` with s, ms, min or h.
 * - Column 2: the drive — `flow_setpoint[unit]`, `pressure_setpoint[unit]` (also `flow[…]`, `pressure[…]`),
 *   `value[unit]` (quantity from the unit's kind) or plain `value` (SI; quantity from the setup).
 * - Optional column 3, `ramp_s`: a ramp duration in s; a row with ramp_s > 0 is a linear ramp from the
 *   previous level (not a step: it is reported and never fitted) — the same programme files drive
 *   `lagbench simulate`. An empty cell means 0 (a step).
 * - The first row is the level from the start of the log; every later row whose value differs is a step.
 * - Times must increase. Comma, semicolon or tab separate the two columns; '.' is the decimal mark.
 */
import { InputError } from '../errors';
import type { Quantity } from '../recording/types';
import { factorToSi, knownUnitsSentence, lookupUnit } from '../units/index';

export interface ProgramEntry {
  /** Seconds since the start of the log. */
  timeS: number;
  /** New drive level, SI. */
  value: number;
  /** Ramp duration, s: > 0 makes the row a linear ramp instead of a step. */
  rampS?: number;
}

export interface StepList {
  /** Drive quantity named by the header, or null for a bare `value` column (SI, quantity from the setup). */
  quantity: Quantity | null;
  entries: ProgramEntry[];
}

const HEADER_CELL = /^\s*([A-Za-z_]+)\s*(?:\[([^\]]*)\])?\s*$/;

function splitCells(line: string): string[] {
  return line.split(/[,;\t]/).map((c) => c.trim());
}

function located(code: string, problem: string, hint: string, file: string, line: number, column?: number): InputError {
  return new InputError(code, problem, hint, { file, line, ...(column !== undefined ? { column } : {}) });
}

/** Column of the `index`-th cell (1-based), counting the separators before it. */
function columnOf(line: string, index: number): number {
  let col = 1;
  let seen = 0;
  for (let i = 0; i < line.length && seen < index; i++) {
    if (line[i] === ',' || line[i] === ';' || line[i] === '\t') {
      seen++;
      col = i + 2;
    }
  }
  return col;
}

function parseTimeHeader(cell: string, file: string, line: number): number {
  const t = cell.trim();
  if (/^time_s$/i.test(t) || /^time$/i.test(t)) return 1;
  const m = /^time\s*\[([^\]]*)\]$/i.exec(t);
  if (m) {
    const found = lookupUnit(m[1] ?? '');
    if (found?.kind === 'time') return factorToSi(found);
  }
  throw located(
    'step-list-bad-time-header',
    `The first column header '${cell}' is not a time column`,
    "Write 'time_s' or 'time[s]', 'time[min]', 'time[ms]', 'time[h]'",
    file,
    line,
    1,
  );
}

function parseValueHeader(cell: string, file: string, line: number, column: number): { quantity: Quantity | null; factor: number } {
  const m = HEADER_CELL.exec(cell);
  const name = (m?.[1] ?? '').toLowerCase();
  const unitText = m?.[2];
  const names: Record<string, Quantity | null> = {
    value: null,
    flow_setpoint: 'flow_setpoint',
    flow: 'flow_setpoint',
    pressure_setpoint: 'pressure_setpoint',
    pressure: 'pressure_setpoint',
  };
  if (!m || !(name in names)) {
    throw located(
      'step-list-bad-value-header',
      `The second column header '${cell}' names no drive quantity`,
      "Write e.g. 'flow_setpoint[uL/min]', 'pressure_setpoint[mbar]' or 'value' (SI)",
      file,
      line,
      column,
    );
  }
  let quantity = names[name] ?? null;
  if (unitText === undefined || unitText.trim() === '') return { quantity, factor: 1 };
  const found = lookupUnit(unitText);
  if (!found || found.kind === 'time') {
    throw located('step-list-unknown-unit', `Unknown drive unit '${unitText}'`, knownUnitsSentence(), file, line, column);
  }
  const kindQuantity: Quantity = found.kind === 'flow' ? 'flow_setpoint' : 'pressure_setpoint';
  if (quantity !== null && quantity !== kindQuantity) {
    throw located(
      'step-list-unit-mismatch',
      `The unit '${unitText}' is not a unit of ${quantity === 'flow_setpoint' ? 'flow' : 'pressure'}`,
      'Give a unit of the named quantity',
      file,
      line,
      column,
    );
  }
  quantity ??= kindQuantity;
  return { quantity, factor: factorToSi(found) };
}

function parseNumber(text: string): number | null {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) return null;
  return Number(text);
}

/** Parses a step-list file (see the module comment). Throws a located InputError for bad lines. */
export function parseStepList(text: string, file: string): StepList {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  let timeFactor = 0;
  let value: { quantity: Quantity | null; factor: number } | null = null;
  let hasRamp = false;
  const entries: ProgramEntry[] = [];
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i] as string;
    const lineNo = i + 1;
    if (raw.trim() === '' || raw.trim().startsWith('#')) continue;
    const cells = splitCells(raw);
    const maxCells = value === null || hasRamp ? 3 : 2;
    if (cells.length < 2 || (cells.length > maxCells && cells.slice(maxCells).some((c) => c !== ''))) {
      throw located(
        'step-list-column-count',
        `Expected ${maxCells === 3 && value !== null ? '2 or 3 columns (time, value, ramp_s)' : '2 columns (time, value)'}, found ${cells.length}`,
        'Write one time and one drive value per line, separated by a comma',
        file,
        lineNo,
      );
    }
    if (value === null) {
      timeFactor = parseTimeHeader(cells[0] as string, file, lineNo);
      value = parseValueHeader(cells[1] as string, file, lineNo, columnOf(raw, 1));
      const third = (cells[2] ?? '').trim();
      if (third !== '' && !/^ramp_s$/i.test(third)) {
        throw located('step-list-bad-ramp-header', `The third column header '${third}' is not 'ramp_s'`, "Name it 'ramp_s' (ramp duration in s) or leave it out", file, lineNo, columnOf(raw, 2));
      }
      hasRamp = third !== '';
      continue;
    }
    let rampS = 0;
    const rampText = (cells[2] ?? '').trim();
    if (hasRamp && rampText !== '') {
      const r = parseNumber(rampText);
      if (r === null || r < 0) {
        throw located('step-list-bad-ramp', `'${rampText}' is not a ramp duration ≥ 0 s`, 'Write the ramp duration in seconds, or leave the cell empty for a step', file, lineNo, columnOf(raw, 2));
      }
      rampS = r;
    }
    const t = parseNumber(cells[0] as string);
    if (t === null || t < 0) {
      throw located('step-list-bad-time', `'${cells[0]}' is not a time ≥ 0`, 'Write the time as a plain number in the header unit', file, lineNo, 1);
    }
    const v = parseNumber(cells[1] as string);
    if (v === null) {
      throw located('step-list-bad-value', `'${cells[1]}' is not a number`, "Write the drive value as a plain number, '.' as decimal mark", file, lineNo, columnOf(raw, 1));
    }
    const timeS = t * timeFactor;
    const prev = entries[entries.length - 1];
    if (prev && !(timeS > prev.timeS)) {
      throw located('step-list-time-order', `Time ${cells[0]} does not come after the previous row`, 'List the steps in increasing time', file, lineNo, 1);
    }
    entries.push(rampS > 0 ? { timeS, value: v * value.factor, rampS } : { timeS, value: v * value.factor });
  }
  if (value === null) {
    throw new InputError('step-list-empty', 'The step list has no header line', "Start with a header such as 'time_s,flow_setpoint[uL/min]'", { file });
  }
  if (entries.length < 2) {
    throw new InputError(
      'step-list-too-short',
      'The step list needs at least two rows (the initial level and one step)',
      'Add the level at time 0 and each later change',
      { file },
    );
  }
  return { quantity: value.quantity, entries };
}
