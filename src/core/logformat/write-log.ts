/**
 * Writes a recording as a delimited text log in a chosen dialect (see {@link LogDialect}): the inverse of the
 * importer, used by export, the property tests and the simulator's demo logs. Pure: returns a string.
 */
import { InputError } from '../errors';
import type { Quantity, Recording } from '../recording/types';
import { factorToSi } from '../units/convert';
import { knownUnitsSentence, lookupUnit } from '../units/lookup';
import { DEFAULT_DIALECT, type LogDialect } from './dialect';

const NAMES: Record<Quantity, string> = {
  pressure: 'Pressure',
  flow: 'Flow',
  pressure_setpoint: 'Pressure setpoint',
  flow_setpoint: 'Flow setpoint',
  hydrostatic_head: 'Liquid head',
  other: 'Other',
};

const SI_SYMBOL: Record<Quantity, string> = {
  pressure: 'Pa',
  flow: 'm3/s',
  pressure_setpoint: 'Pa',
  flow_setpoint: 'm3/s',
  hydrostatic_head: 'Pa',
  other: '',
};

/** Shortest text that reads back to the same double (ECMAScript Number::toString), or n significant digits. */
export function formatNumber(v: number, digits: number | 'shortest'): string {
  if (Number.isNaN(v)) return '';
  if (digits === 'shortest') return String(v);
  return String(Number(v.toPrecision(digits)));
}

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

/** Time as integer units of 10^-decimals s (exact for |t| < 9e15 units). */
function timeUnits(t: number, decimals: number): number {
  return Math.round(t * 10 ** decimals);
}

function fractionText(units: number, decimals: number, sign: string): { whole: number; frac: string } {
  const scale = 10 ** decimals;
  const whole = Math.floor(units / scale);
  const rest = units - whole * scale;
  return { whole, frac: decimals > 0 ? `${sign}${pad(rest, decimals)}` : '' };
}

function offsetText(min: number): string {
  const sign = min < 0 ? '-' : '+';
  const m = Math.abs(min);
  return `${sign}${pad(Math.floor(m / 60), 2)}:${pad(m % 60, 2)}`;
}

/** Formats the time of sample i. */
function timeText(r: Recording, i: number, d: LogDialect): string {
  const t = r.timeS[i] as number;
  switch (d.timeFormat) {
    case 'seconds':
      return formatNumber(t, 'shortest');
    case 'milliseconds':
      return formatNumber(Number((t * 1000).toFixed(Math.max(0, d.timeDecimals - 3))), 'shortest');
    case 'elapsed': {
      const { whole, frac } = fractionText(timeUnits(t, d.timeDecimals), d.timeDecimals, d.timeDecimalSign);
      return `${pad(Math.floor(whole / 3600), 2)}:${pad(Math.floor(whole / 60) % 60, 2)}:${pad(whole % 60, 2)}${frac}`;
    }
    case 'clock':
    case 'date-clock':
    case 'iso': {
      const startMs = r.startEpochMs ?? 0;
      const units = Math.round(startMs * 10 ** (d.timeDecimals - 3)) + timeUnits(t, d.timeDecimals) + (d.isoZone === 'Z' && d.timeFormat === 'iso' ? 0 : d.utcOffsetMin * 60 * 10 ** d.timeDecimals);
      const { whole, frac } = fractionText(units, d.timeDecimals, d.timeDecimalSign);
      const iso = new Date(whole * 1000).toISOString(); // YYYY-MM-DDTHH:MM:SS.000Z
      if (d.timeFormat === 'clock') return `${iso.slice(11, 19)}${frac}`;
      if (d.timeFormat === 'date-clock') return `${iso.slice(0, 10)}\u0000${iso.slice(11, 19)}${frac}`;
      const zone = d.isoZone === 'Z' ? 'Z' : d.isoZone === 'offset' ? offsetText(d.utcOffsetMin) : '';
      return `${iso.slice(0, 19)}${frac}${zone}`;
    }
    default:
      return '';
  }
}

function headerCell(name: string, unit: string, d: LogDialect): string {
  const n = d.delimiter === 'whitespace' ? name.replace(/\s+/g, '_') : name;
  if (unit === '' || d.unitStyle === 'units-row') return n;
  if (d.unitStyle === 'brackets') return `${n} [${unit}]`.replace(d.delimiter === 'whitespace' ? / /g : /$^/, '');
  if (d.unitStyle === 'parens') return `${n} (${unit})`.replace(d.delimiter === 'whitespace' ? / /g : /$^/, '');
  return `${n}_${unit}`;
}

function quoteIfNeeded(cell: string, sep: string): string {
  return cell.includes(sep) || cell.includes('"') ? `"${cell.replace(/"/g, '""')}"` : cell;
}

/** Writes `recording` in `dialect` (fields not given take {@link DEFAULT_DIALECT}'s). */
export function writeLog(recording: Recording, dialect: Partial<LogDialect> = {}): string {
  const d: LogDialect = { ...DEFAULT_DIALECT, ...dialect };
  const sep = d.delimiter === 'whitespace' ? '  ' : d.delimiter;
  const nl = d.lineEnding;
  const cols = recording.channels.map((c, k) => {
    const unit = d.units[c.quantity] ?? (c.quantity === 'other' ? c.originalUnit : SI_SYMBOL[c.quantity]);
    let factor = 1;
    if (c.quantity !== 'other') {
      const found = lookupUnit(unit);
      if (!found) throw new InputError('unknown-unit', `Cannot write ${c.quantity} in '${unit}'`, knownUnitsSentence());
      factor = factorToSi(found, d.liquidDensityKgPerM3);
    }
    const repeat = recording.channels.slice(0, k).filter((x) => x.quantity === c.quantity).length;
    const name = c.quantity === 'other' ? c.originalHeader || `Other ${k + 1}` : `${NAMES[c.quantity]}${repeat > 0 ? ` ${repeat + 1}` : ''}`;
    return { values: c.values, factor, unit, name };
  });
  const parts: string[] = [];
  if (d.bom) parts.push('\uFEFF');
  if (d.metadataLines && !d.headerless) {
    for (const [k, v] of Object.entries(recording.metadata)) parts.push(`# ${k}: ${v}${nl}`);
  }
  const timeName = { seconds: 'Time', milliseconds: 'Time', elapsed: 'Elapsed time', clock: 'Clock time', 'date-clock': 'Time', iso: 'Timestamp', none: '' }[d.timeFormat];
  const dateClock = d.timeFormat === 'date-clock';
  const timeUnit = d.timeFormat === 'seconds' ? 's' : d.timeFormat === 'milliseconds' ? 'ms' : '';
  const hasTime = d.timeFormat !== 'none';
  const trail = d.trailingDelimiter ? sep : '';
  if (!d.headerless) {
    const header = [...(dateClock ? ['Date'] : []), ...(hasTime ? [headerCell(timeName, timeUnit, d)] : []), ...cols.map((c) => headerCell(c.name, c.unit, d))];
    parts.push(header.map((h) => quoteIfNeeded(h, d.delimiter === 'whitespace' ? ' ' : d.delimiter)).join(sep) + trail + nl);
    if (d.unitStyle === 'units-row') {
      // between runs of spaces an empty cell would vanish: '-' stands for "no unit" there
      const none = d.delimiter === 'whitespace' ? '-' : '';
      parts.push([...(dateClock ? [none] : []), ...(hasTime ? [timeUnit || none] : []), ...cols.map((c) => c.unit.replace(/\s+/g, '') || none)].join(sep) + trail + nl);
    }
  }
  const q = d.quoteNumbers ? '"' : '';
  const dec = d.decimal;
  const rows: string[] = [];
  for (let i = 0; i < recording.timeS.length; i++) {
    const cells: string[] = [];
    if (hasTime) {
      let t = timeText(recording, i, d);
      if ((d.timeFormat === 'seconds' || d.timeFormat === 'milliseconds') && dec === ',') t = t.replace('.', ',');
      if (dateClock) cells.push(...t.split('\u0000'));
      else cells.push(d.timeFormat === 'seconds' || d.timeFormat === 'milliseconds' ? `${q}${t}${q}` : t);
    }
    for (const c of cols) {
      const v = c.values[i] as number;
      let text = formatNumber(c.factor === 1 ? v : v / c.factor, d.digits);
      if (dec === ',') text = text.replace('.', ',');
      // an empty field cannot be seen between runs of spaces: write NaN there
      cells.push(text === '' ? (d.delimiter === 'whitespace' ? 'NaN' : '') : `${q}${text}${q}`);
    }
    rows.push(cells.join(sep) + trail);
    if (rows.length === 10000) {
      parts.push(rows.join(nl) + nl);
      rows.length = 0;
    }
  }
  if (rows.length > 0) parts.push(rows.join(nl) + nl);
  return parts.join('');
}
