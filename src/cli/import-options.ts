/**
 * The import options shared by every command that reads logs (inspect, export, and later analyze):
 * their specs for parseCommandArgs and their translation into core ImportOptions / MergeOptions.
 */
import { isQuantity, type ColumnOverride, type Delimiter, type ImportOptions, type TimeFormat } from '../core/import/index';
import { UsageError } from './io';
import { booleanOption, numberOption, parseNumberArg, stringList, stringOption, type OptionSpecs, type OptionValues } from './args';

export const importOptionSpecs: OptionSpecs = {
  delimiter: { type: 'string', valueName: '<comma|semicolon|tab|space>', description: 'field separator (default: detected)' },
  decimal: { type: 'string', valueName: '<point|comma>', description: 'decimal sign (default: detected)' },
  'time-column': { type: 'string', valueName: '<n|name>', description: 'time column by number (from 1) or header (default: detected)' },
  'time-format': { type: 'string', valueName: '<fmt>', description: 'seconds, milliseconds, minutes, hours, elapsed (hh:mm:ss), clock (time of day), iso' },
  timezone: { type: 'string', valueName: '<±hh:mm>', description: 'UTC offset of ISO or clock times written without a zone (default: UTC, with a warning)' },
  'sample-rate': { type: 'string', valueName: '<Hz>', description: 'sample rate of a file without a time column' },
  column: { type: 'string', multiple: true, valueName: '<n|name>=<quantity>[:<unit>]', description: 'set a column, e.g. 2=pressure:mbar, Flow=flow_setpoint:uL/min, 4=ignore' },
  density: { type: 'string', valueName: '<kg/m3>', description: 'liquid density for heads in mm/cm of liquid (default 998.2, water at 20 °C)' },
  'skip-bad-rows': { type: 'boolean', description: 'skip rows with text or a wrong number of fields (counted as a warning)' },
  'sort-time': { type: 'boolean', description: 'sort rows by time instead of refusing time that goes backwards' },
  'drop-repeated-time': { type: 'boolean', description: 'drop rows that repeat the previous time (the first is kept)' },
  offset: { type: 'string', multiple: true, valueName: '<s>', description: 'two logs: start of the 2nd log in s on the 1st log\'s time (default: absolute timestamps)' },
};

const DELIMITERS: Record<string, Delimiter> = { comma: ',', ',': ',', semicolon: ';', ';': ';', tab: '\t', '\\t': '\t', space: 'whitespace', spaces: 'whitespace', whitespace: 'whitespace' };
const DECIMALS: Record<string, '.' | ','> = { point: '.', dot: '.', '.': '.', comma: ',', ',': ',' };
const TIME_FORMATS: TimeFormat[] = ['seconds', 'milliseconds', 'minutes', 'hours', 'elapsed', 'clock', 'iso'];

/** `+02:00`, `-0530`, `Z`, `UTC` → minutes east of UTC. */
export function parseUtcOffset(text: string): number {
  const t = text.trim();
  if (/^(z|utc)$/i.test(t)) return 0;
  const m = /^(?:UTC)?([+-])(\d{1,2})(?::?(\d{2}))?$/i.exec(t);
  if (!m || Number(m[2]) > 14 || Number(m[3] ?? 0) > 59) throw new UsageError(`--timezone needs an offset like +01:00, -05:00 or Z, not '${text}'`);
  return (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3] ?? 0));
}

function columnRef(text: string): number | string {
  return /^\d+$/.test(text) ? Number(text) : text;
}

/** `2=pressure:mbar` → a column override. */
export function parseColumnOption(text: string): ColumnOverride {
  const eq = text.lastIndexOf('=');
  if (eq <= 0) throw new UsageError(`--column needs <n|name>=<quantity>[:<unit>], e.g. 2=pressure:mbar, not '${text}'`);
  const ref = text.slice(0, eq).trim();
  const rest = text.slice(eq + 1).trim();
  const colon = rest.indexOf(':');
  const quantity = (colon < 0 ? rest : rest.slice(0, colon)).trim().replace(/-/g, '_');
  const unit = colon < 0 ? undefined : rest.slice(colon + 1).trim();
  if (quantity !== 'ignore' && !isQuantity(quantity)) {
    throw new UsageError(`--column: unknown quantity '${quantity}'. Use pressure, flow, pressure_setpoint, flow_setpoint, hydrostatic_head, other or ignore`);
  }
  return { column: columnRef(ref), quantity, ...(unit ? { unit } : {}) };
}

/** Translates parsed CLI values into core ImportOptions. */
export function parseImportOptions(values: OptionValues): ImportOptions {
  const options: ImportOptions = {};
  const delimiter = stringOption(values, 'delimiter');
  if (delimiter !== undefined) {
    const d = DELIMITERS[delimiter.toLowerCase()];
    if (!d) throw new UsageError(`--delimiter must be comma, semicolon, tab or space, not '${delimiter}'`);
    options.delimiter = d;
  }
  const decimal = stringOption(values, 'decimal');
  if (decimal !== undefined) {
    const d = DECIMALS[decimal.toLowerCase()];
    if (!d) throw new UsageError(`--decimal must be point or comma, not '${decimal}'`);
    options.decimal = d;
  }
  const timeColumn = stringOption(values, 'time-column');
  if (timeColumn !== undefined) options.timeColumn = columnRef(timeColumn);
  const timeFormat = stringOption(values, 'time-format');
  if (timeFormat !== undefined) {
    const f = ({ s: 'seconds', ms: 'milliseconds', hms: 'elapsed' } as Record<string, TimeFormat>)[timeFormat] ?? timeFormat;
    if (!TIME_FORMATS.includes(f as TimeFormat)) throw new UsageError(`--time-format must be one of ${TIME_FORMATS.join(', ')}, not '${timeFormat}'`);
    options.timeFormat = f as TimeFormat;
  }
  const tz = stringOption(values, 'timezone');
  if (tz !== undefined) options.timezoneOffsetMin = parseUtcOffset(tz);
  const rate = numberOption(values, 'sample-rate', { min: 0, exclusiveMin: true });
  if (rate !== undefined) options.sampleRateHz = rate;
  const columns = stringList(values, 'column').map(parseColumnOption);
  if (columns.length) options.columns = columns;
  const density = numberOption(values, 'density', { min: 0, exclusiveMin: true });
  if (density !== undefined) options.liquidDensityKgPerM3 = density;
  if (booleanOption(values, 'skip-bad-rows')) options.skipBadRows = true;
  if (booleanOption(values, 'sort-time')) options.sortTime = true;
  if (booleanOption(values, 'drop-repeated-time')) options.dropRepeatedTime = true;
  return options;
}

/** Offsets for merging (seconds), or undefined to use absolute timestamps. */
export function parseMergeOffsets(values: OptionValues): number[] | undefined {
  const list = stringList(values, 'offset');
  return list.length ? list.map((t) => parseNumberArg(t, 'offset')) : undefined;
}
