/**
 * Deciding what each column is: which one is time (and how it is written), and for every other column its
 * quantity, unit and factor to SI, from the header, the units row and the user's overrides.
 */
import { InputError, type Warning } from '../errors';
import { channelBaseName, uniqueNames } from '../recording/channel-names';
import type { Quantity } from '../recording/types';
import { factorToSi } from '../units/convert';
import { knownUnitsSentence, lookupUnit, type FoundUnit } from '../units/lookup';
import { unquote } from './fields';
import type { Layout } from './detect';
import {
  nameSaysClock, nameSaysElapsed, nameSaysFlow, nameSaysHead, nameSaysPressure, nameSaysSetpoint, nameSaysTime,
  parseHeaderCell, unitsRowCell, type HeaderCell,
} from './header';
import { parseHmsSeconds, textTimeKind } from './time-text';
import type { ColumnOverride, ColumnReport, ImportOptions, Recognition, TimeFormat } from './types';

export interface ChannelPlan {
  /** 0-based field index. */
  index: number;
  quantity: Quantity;
  header: string;
  unit: string;
  factorToSi: number;
  name: string;
}

export interface ColumnPlan {
  /** 0-based field index of the time column, or null with a sample rate. */
  timeIndex: number | null;
  timeFormat: TimeFormat | 'sample-rate';
  /** Factor to seconds for numeric time formats. */
  timeFactor: number;
  /** 0-based field index of a date column completing a clock time, or null. */
  dateIndex: number | null;
  channels: ChannelPlan[];
  reports: ColumnReport[];
  warnings: Warning[];
}

const QUANTITIES: ReadonlySet<string> = new Set(['pressure', 'flow', 'pressure_setpoint', 'flow_setpoint', 'hydrostatic_head', 'other']);

/** Whether `text` names a quantity. */
export function isQuantity(text: string): text is Quantity {
  return QUANTITIES.has(text);
}

function findOverride(overrides: readonly ColumnOverride[], index: number, cell: HeaderCell | null): ColumnOverride | undefined {
  return overrides.find((o) =>
    typeof o.column === 'number'
      ? o.column === index + 1
      : cell !== null && (o.column.toLowerCase() === cell.header.toLowerCase() || o.column.toLowerCase() === cell.name.toLowerCase()),
  );
}

function resolveColumnRef(ref: number | string, cells: (HeaderCell | null)[], what: string, file?: string): number {
  if (typeof ref === 'number') {
    if (ref >= 1 && ref <= cells.length) return ref - 1;
    throw new InputError('no-such-column', `There is no column ${ref} for the ${what} (the file has ${cells.length})`, 'Give a column number from 1 to the number of columns, or a header name', { file });
  }
  const i = cells.findIndex((c) => c !== null && (c.header.toLowerCase() === ref.toLowerCase() || c.name.toLowerCase() === ref.toLowerCase()));
  if (i < 0) {
    const names = cells.map((c, k) => (c ? `'${c.header}'` : `${k + 1}`)).join(', ');
    throw new InputError('no-such-column', `No column is named '${ref}' for the ${what}`, `Columns are: ${names}`, { file });
  }
  return i;
}

function unitError(column: number, header: string, unit: string, line: number | undefined, file?: string): InputError {
  return new InputError(
    'unknown-unit',
    `Column ${column} ('${header}') has the unit '${unit}', which Lagbench does not know`,
    `${knownUnitsSentence()}. Give the unit with the column option, e.g. --column ${column}=pressure:mbar`,
    { file, line, column },
  );
}

/** Decides the role, quantity and unit of every column. */
export function planColumns(layout: Layout, options: ImportOptions): ColumnPlan {
  const file = options.sourceName;
  const n = layout.fieldCount;
  const overrides = options.columns ?? [];
  const warnings: Warning[] = [];
  const cells: (HeaderCell | null)[] = [];
  for (let i = 0; i < n; i++) {
    const raw = layout.headerCells?.[i];
    if (raw === undefined) {
      cells.push(null);
      continue;
    }
    const cell = parseHeaderCell(raw);
    const rowUnit = layout.unitCells?.[i];
    cells.push(rowUnit !== undefined && unitsRowCell(rowUnit) !== '' && cell.unit === '' ? { ...cell, unit: unitsRowCell(rowUnit) } : cell);
  }
  const unitFromRow = (i: number): boolean => layout.unitCells !== null && unitsRowCell(layout.unitCells[i] ?? '') !== '' && (cells[i]?.unit ?? '') === unitsRowCell(layout.unitCells[i] ?? '');
  const firstValue = (i: number): string => unquote(layout.firstRows[0]?.[i] ?? '');

  // --- time column ---
  let timeIndex: number | null = null;
  let timeFrom: Recognition = 'none';
  if (options.timeColumn !== undefined) {
    timeIndex = resolveColumnRef(options.timeColumn, cells, 'time column', file);
    timeFrom = 'option';
  } else if (options.sampleRateHz === undefined) {
    const byName = cells.findIndex((c) => c !== null && (nameSaysTime(c.name) || lookupUnit(c.unit)?.kind === 'time'));
    if (byName >= 0) {
      timeIndex = byName;
      timeFrom = 'header-name';
    } else {
      const byValue = cells.findIndex((_, i) => { const k = textTimeKind(firstValue(i)); return k === 'iso' || k === 'hms'; });
      if (byValue >= 0) {
        timeIndex = byValue;
        timeFrom = 'position';
      }
    }
    if (timeIndex === null) {
      const names = cells.map((c, k) => (c ? `'${c.header}'` : `column ${k + 1}`)).join(', ');
      throw new InputError(
        'no-time-column',
        layout.headerCells === null ? 'The file has no header row, so no time column can be recognised' : `No time column was recognised among ${names}`,
        'Name the time column (option time column, e.g. --time-column 1), or give the sample rate of a file without time (--sample-rate 100)',
        { file, line: layout.headerLine ?? layout.bodyStartLine },
      );
    }
  }
  if (options.sampleRateHz !== undefined && !(options.sampleRateHz > 0 && Number.isFinite(options.sampleRateHz))) {
    throw new InputError('bad-option', `The sample rate must be a positive number of hertz, not ${options.sampleRateHz}`, 'Give e.g. --sample-rate 100', { file });
  }

  // --- time format ---
  let timeFormat: TimeFormat | 'sample-rate' = 'sample-rate';
  let timeFactor = 1;
  if (timeIndex !== null) {
    const cell = cells[timeIndex] ?? null;
    const v = firstValue(timeIndex);
    if (options.timeFormat) {
      timeFormat = options.timeFormat;
    } else {
      const kind = textTimeKind(v);
      const unit = cell ? lookupUnit(cell.unit) : null;
      if (kind === 'iso') timeFormat = 'iso';
      else if (kind === 'hms') {
        const name = cell?.name ?? '';
        const s = parseHmsSeconds(v) ?? 0;
        timeFormat = nameSaysElapsed(name) ? 'elapsed' : nameSaysClock(name) ? 'clock' : s < 60 ? 'elapsed' : 'clock';
      } else if (unit?.kind === 'time') {
        timeFormat = ({ s: 'seconds', ms: 'milliseconds', min: 'minutes', h: 'hours' } as const)[unit.unit.symbol as 's' | 'ms' | 'min' | 'h'];
      } else if (cell && cell.unit !== '') {
        throw new InputError('unknown-unit', `The time column '${cell.header}' has the unit '${cell.unit}', which is not a time unit Lagbench knows`, 'Known time units: s, ms, min, h; or give the format with --time-format seconds|milliseconds|elapsed|clock|iso', { file, line: layout.headerLine ?? undefined, column: timeIndex + 1 });
      } else {
        timeFormat = 'seconds';
        warnings.push({ code: 'time-unit-assumed', message: `The time column${cell ? ` '${cell.header}'` : ''} has no unit; it was read as seconds (override with --time-format)` });
      }
    }
    timeFactor = timeFormat === 'milliseconds' ? 1e-3 : timeFormat === 'minutes' ? 60 : timeFormat === 'hours' ? 3600 : 1;
  }
  // a separate date column (YYYY-MM-DD) next to a time-of-day column: together they are an absolute time
  let dateIndex: number | null = null;
  if (timeIndex !== null && (timeFormat === 'clock' || timeFormat === 'elapsed') && !options.timeFormat) {
    const d = cells.findIndex((_, i) => i !== timeIndex && textTimeKind(firstValue(i)) === 'date');
    if (d >= 0) {
      dateIndex = d;
      timeFormat = 'clock';
    }
  }

  // --- channels ---
  const reports: ColumnReport[] = [];
  const planned: Omit<ChannelPlan, 'name'>[] = [];
  const reportIndexOf: number[] = [];
  const density = options.liquidDensityKgPerM3;
  if (density !== undefined && !(density > 0 && Number.isFinite(density))) {
    throw new InputError('bad-option', `The liquid density must be a positive number of kg/m³, not ${density}`, 'Give e.g. --density 998.2 for water at 20 °C', { file });
  }
  for (let i = 0; i < n; i++) {
    const cell = cells[i] ?? null;
    const header = cell?.header ?? '';
    const override = findOverride(overrides, i, cell);
    if (i === dateIndex) {
      reports.push({ column: i + 1, header, unit: '', role: 'date', quantity: null, factorToSi: Number.NaN, quantityFrom: 'position', unitFrom: 'none' });
      continue;
    }
    if (i === timeIndex) {
      reports.push({ column: i + 1, header, unit: cell?.unit ?? '', role: 'time', quantity: null, factorToSi: timeFactor, quantityFrom: timeFrom, unitFrom: cell?.unit ? (unitFromRow(i) ? 'units-row' : 'header-unit') : 'none' });
      continue;
    }
    if (override?.quantity === 'ignore' || (cell !== null && nameSaysTime(cell.name) && override === undefined)) {
      reports.push({ column: i + 1, header, unit: cell?.unit ?? '', role: 'ignored', quantity: null, factorToSi: Number.NaN, quantityFrom: override ? 'option' : 'header-name', unitFrom: 'none' });
      continue;
    }
    const unitText = override?.unit ?? cell?.unit ?? '';
    const unitFrom: Recognition = override?.unit !== undefined ? 'option' : unitText === '' ? 'none' : unitFromRow(i) ? 'units-row' : 'header-unit';
    const found: FoundUnit | null = unitText === '' ? null : lookupUnit(unitText) ?? lookupUnit(unitText.replace(/_/g, '/'));
    const name = cell?.name ?? '';
    let quantity: Quantity;
    let quantityFrom: Recognition;
    if (override) {
      quantity = override.quantity as Quantity;
      quantityFrom = 'option';
    } else if (found?.kind === 'pressure') {
      quantity = nameSaysHead(name) ? 'hydrostatic_head' : nameSaysSetpoint(name) ? 'pressure_setpoint' : 'pressure';
      quantityFrom = 'header-unit';
    } else if (found?.kind === 'flow') {
      quantity = nameSaysSetpoint(name) ? 'flow_setpoint' : 'flow';
      quantityFrom = 'header-unit';
    } else if (found?.kind === 'head' && nameSaysHead(name)) {
      quantity = 'hydrostatic_head';
      quantityFrom = 'header-name';
    } else if (found === null && unitText !== '' && (nameSaysPressure(name) || nameSaysFlow(name) || nameSaysHead(name) || /bar|pa|psi|\/(min|h|s)\b|l\/|h2o|hg/i.test(unitText))) {
      throw unitError(i + 1, header, unitText, layout.headerLine ?? undefined, file);
    } else if (found === null && unitText === '' && cell !== null && (nameSaysPressure(name) || nameSaysFlow(name))) {
      throw new InputError(
        'missing-unit',
        `Column ${i + 1} ('${header}') looks like a ${nameSaysFlow(name) ? 'flow' : 'pressure'} but has no unit`,
        `Give its unit with the column option, e.g. --column ${i + 1}=${nameSaysFlow(name) ? 'flow:uL/min' : 'pressure:mbar'}`,
        { file, line: layout.headerLine ?? undefined, column: i + 1 },
      );
    } else {
      quantity = 'other';
      quantityFrom = cell ? 'header-name' : 'none';
    }
    let factor = 1;
    if (quantity !== 'other') {
      if (found === null) {
        if (unitText === '') {
          throw new InputError('missing-unit', `Column ${i + 1}${header ? ` ('${header}')` : ''} is set to ${quantity} but has no unit`, `Add the unit to the column option, e.g. --column ${i + 1}=${quantity}:${quantity.startsWith('flow') ? 'uL/min' : 'mbar'}`, { file, column: i + 1 });
        }
        throw unitError(i + 1, header, unitText, layout.headerLine ?? undefined, file);
      }
      const fitting = quantity === 'flow' || quantity === 'flow_setpoint' ? found.kind === 'flow' : found.kind === 'pressure' || (quantity === 'hydrostatic_head' && found.kind === 'head');
      if (!fitting) {
        throw new InputError('unit-mismatch', `Column ${i + 1}${header ? ` ('${header}')` : ''} is ${quantity} but its unit '${unitText}' is a ${found.kind} unit`, `Give a matching unit. ${knownUnitsSentence()}`, { file, column: i + 1 });
      }
      factor = factorToSi(found, density);
    } else if (cell !== null || unitText !== '') {
      warnings.push({ code: 'column-kept-as-other', message: `Column ${i + 1}${header ? ` ('${header}')` : ''} is not a pressure or flow; kept as 'other' in its own unit${unitText ? ` (${unitText})` : ''}` });
    }
    reportIndexOf.push(reports.length);
    reports.push({ column: i + 1, header, unit: unitText, role: 'channel', quantity, factorToSi: factor, quantityFrom, unitFrom });
    planned.push({ index: i, quantity, header, unit: unitText, factorToSi: factor });
  }
  for (const o of overrides) resolveColumnRef(o.column, cells, 'column option', file);
  if (planned.length === 0) {
    throw new InputError('no-channels', 'The file has a time column but no data columns', 'Choose a log with at least one pressure or flow column', { file, line: layout.headerLine ?? layout.bodyStartLine });
  }
  const names = uniqueNames(planned.map((p) => channelBaseName(p.quantity, p.unit)));
  const channels = planned.map((p, k) => ({ ...p, name: names[k] as string }));
  channels.forEach((c, k) => {
    const r = reports[reportIndexOf[k] as number];
    if (r) r.channelName = c.name;
  });
  return { timeIndex, timeFormat, timeFactor, dateIndex, channels, reports, warnings };
}
