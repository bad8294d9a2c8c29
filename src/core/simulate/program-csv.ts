/**
 * The step-program file: a small CSV of our own.
 *
 *     # lines starting with # are comments
 *     time_s,flow[uL/min],ramp_s
 *     0,0
 *     10,5
 *     60,20,4
 *
 * First column: time since the start (`time_s`, or `time[s]`, `time[min]`, `time[h]`). Then one or
 * more setpoint columns named `pressure` or `flow` with a unit in brackets (any unit the importer
 * knows: `pressure[mbar]`, `flow[uL/min]`; `pressure_2[kPa]` for a second regulator). An optional
 * `ramp_s` column makes a row a linear ramp of that length instead of a step. An empty cell keeps that
 * channel where it is. The first row must be at time 0: it sets the starting levels.
 */
import { InputError } from '../errors';
import { factorToSi, knownUnitsSentence, lookupUnit } from '../units';
import type { DriveQuantity, Program, ProgramChannel } from './types';

interface Column {
  kind: 'time' | 'ramp' | 'setpoint';
  factor: number;
  channel?: ProgramChannel;
}

const HEADER = /^\s*([A-Za-z][A-Za-z0-9_]*?)\s*(?:\[(.*)\]|\((.*)\))?\s*$/;

function located(file: string, line: number, column: number, code: string, problem: string, hint: string): InputError {
  return new InputError(code, problem, hint, { file, line, column });
}

function readHeader(cell: string, file: string, line: number, column: number): Column {
  const m = HEADER.exec(cell);
  if (!m) throw located(file, line, column, 'program-header', `header '${cell}' is not a name with a unit in brackets`, "write e.g. time_s, flow[uL/min], pressure[mbar], ramp_s");
  let name = m[1] as string;
  let unit = (m[2] ?? m[3] ?? '').trim();
  const underscore = /^(time|ramp)_(s|min|h|ms)$/i.exec(name);
  if (underscore && unit === '') {
    name = underscore[1] as string;
    unit = underscore[2] as string;
  }
  const lower = name.toLowerCase();
  if (lower === 'time' || lower === 'ramp') {
    const found = lookupUnit(unit === '' ? 's' : unit);
    if (!found || found.kind !== 'time') throw located(file, line, column, 'program-unit', `'${cell}': '${unit}' is not a time unit`, 'use s, min or h');
    return { kind: lower === 'time' ? 'time' : 'ramp', factor: factorToSi(found) };
  }
  const q = /^(pressure|flow)(_\d+)?$/i.exec(name);
  if (!q) throw located(file, line, column, 'program-header', `column '${cell}' is neither time, ramp_s, pressure[…] nor flow[…]`, 'name setpoint columns pressure[unit] or flow[unit]');
  const quantity = (q[1] as string).toLowerCase() as DriveQuantity;
  if (unit === '') throw located(file, line, column, 'program-unit', `setpoint column '${cell}' has no unit`, `write it as ${quantity}[${quantity === 'flow' ? 'uL/min' : 'mbar'}]`);
  const found = lookupUnit(unit);
  if (!found || (found.kind !== quantity && !(quantity === 'pressure' && found.kind === 'head'))) {
    throw located(file, line, column, 'program-unit', `'${unit}' is not a ${quantity} unit`, knownUnitsSentence());
  }
  return { kind: 'setpoint', factor: factorToSi(found), channel: { name: name.toLowerCase(), quantity, points: [] } };
}

/** Parses a program file (text) into SI. Throws located InputErrors. */
export function parseProgramCsv(text: string, file = 'program'): Program {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  let columns: Column[] | null = null;
  let lastTime = -Infinity;
  let rows = 0;
  for (let li = 0; li < lines.length; li++) {
    const raw = lines[li] as string;
    const lineNo = li + 1;
    if (raw.trim() === '' || raw.trimStart().startsWith('#')) continue;
    const cells = raw.split(',');
    const colAt = (k: number): number => cells.slice(0, k).reduce((s, c) => s + c.length + 1, 1);
    if (!columns) {
      columns = cells.map((c, k) => readHeader(c, file, lineNo, colAt(k)));
      if (columns[0]?.kind !== 'time') throw located(file, lineNo, 1, 'program-header', 'the first column must be the time (time_s)', 'start the header with time_s');
      if (!columns.some((c) => c.kind === 'setpoint')) throw located(file, lineNo, 1, 'program-header', 'the program has no setpoint column', 'add a pressure[unit] or flow[unit] column');
      const names = columns.filter((c) => c.channel).map((c) => c.channel?.name);
      const dup = names.find((n, i) => names.indexOf(n) !== i);
      if (dup) throw located(file, lineNo, 1, 'program-header', `setpoint column '${dup}' appears twice`, 'number a second one, e.g. pressure_2[mbar]');
      if (columns.filter((c) => c.kind === 'time' || c.kind === 'ramp').length > 2 || columns.slice(1).some((c) => c.kind === 'time')) {
        throw located(file, lineNo, 1, 'program-header', 'only one time column and at most one ramp column are allowed', 'remove the extra column');
      }
      continue;
    }
    if (cells.length > columns.length) throw located(file, lineNo, colAt(columns.length), 'program-ragged', `row has ${cells.length} fields, the header ${columns.length}`, 'remove the extra fields');
    const num = (k: number, required: boolean): number | null => {
      const s = (cells[k] ?? '').trim();
      if (s === '') {
        if (required) throw located(file, lineNo, colAt(k), 'program-missing', 'the time is missing', 'give every row a time');
        return null;
      }
      const v = Number(s);
      if (!Number.isFinite(v) || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(s)) {
        throw located(file, lineNo, colAt(k), 'program-number', `'${s}' is not a number`, 'use a dot as decimal separator and no units in the cells');
      }
      return v;
    };
    const t = (num(0, true) as number) * (columns[0] as Column).factor;
    if (rows === 0 && t !== 0) throw located(file, lineNo, 1, 'program-start', `the first row is at ${t} s, not at 0`, 'add a first row at time 0 with the starting levels');
    if (!(t > lastTime)) throw located(file, lineNo, 1, 'program-order', `time ${t} s is not after the previous row (${lastTime} s)`, 'sort the rows by time; each time at most once');
    let ramp = 0;
    columns.forEach((c, k) => {
      if (c.kind !== 'ramp') return;
      const r = num(k, false);
      if (r !== null) {
        if (r < 0) throw located(file, lineNo, colAt(k), 'program-ramp', `ramp of ${r} is negative`, 'use 0 for a step');
        ramp = r * c.factor;
      }
    });
    columns.forEach((c, k) => {
      if (c.kind !== 'setpoint' || !c.channel) return;
      const v = num(k, false);
      const ch = c.channel;
      if (v === null) {
        if (rows === 0) throw located(file, lineNo, colAt(k), 'program-missing', `the first row needs a starting value for '${ch.name}'`, 'fill in the starting level');
        return;
      }
      const prev = ch.points[ch.points.length - 1];
      if (prev && prev.timeS + prev.rampS > t) {
        throw located(file, lineNo, 1, 'program-order', `'${ch.name}' changes at ${t} s while its ramp from ${prev.timeS} s runs until ${prev.timeS + prev.rampS} s`, 'let each ramp end before the next change');
      }
      ch.points.push({ timeS: t, valueSI: v * c.factor, rampS: rows === 0 ? 0 : ramp });
    });
    lastTime = t;
    rows++;
  }
  if (!columns) throw new InputError('program-empty', 'the program file is empty', 'write a header such as time_s,flow[uL/min] and at least one row', { file });
  if (rows === 0) throw new InputError('program-empty', 'the program has a header but no rows', 'add a first row at time 0', { file });
  return { channels: columns.flatMap((c) => (c.channel ? [c.channel] : [])) };
}

/** Last time at which anything in the program changes (end of the last step or ramp), s. */
export function programEndS(program: Program): number {
  let end = 0;
  for (const c of program.channels) for (const p of c.points) end = Math.max(end, p.timeS + p.rampS);
  return end;
}
