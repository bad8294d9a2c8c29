/**
 * How a log is written: every dialect the importer reads can be produced, for export, for the property tests
 * that read written logs back, and for the simulator's demo logs.
 */
import type { Quantity } from '../recording/types';

export interface LogDialect {
  delimiter: ',' | ';' | '\t' | 'whitespace';
  decimal: '.' | ',';
  lineEnding: '\n' | '\r\n';
  /** Start with a UTF-8 byte-order mark (U+FEFF). */
  bom: boolean;
  /** `date-clock`: a Date column (YYYY-MM-DD) and a Time column (hh:mm:ss.sss), local time in `utcOffsetMin`. */
  timeFormat: 'seconds' | 'milliseconds' | 'elapsed' | 'clock' | 'date-clock' | 'iso' | 'none';
  /** Decimals of the seconds in elapsed/clock/ISO times (0–6). */
  timeDecimals: number;
  /** ISO timestamps: zone written as `Z`, as a numeric offset, or not at all (then local time in `utcOffsetMin`). */
  isoZone: 'Z' | 'offset' | 'none';
  /** Minutes east of UTC for clock and ISO times (0 = UTC). */
  utcOffsetMin: number;
  /** Decimal sign inside ISO / clock seconds (ISO 8601 allows both). */
  timeDecimalSign: '.' | ',';
  /** Where the unit goes: `Pressure [mbar]`, `Pressure (mbar)`, `Pressure_mbar`, or a second header row. */
  unitStyle: 'brackets' | 'parens' | 'underscore' | 'units-row';
  /** Unit written for each quantity (any spelling the importer knows); SI when absent. */
  units: Partial<Record<Quantity, string>>;
  /** Density for liquid-head heights written in mm/cm, kg/m³. */
  liquidDensityKgPerM3?: number;
  /** Put every number in double quotes. */
  quoteNumbers: boolean;
  /** End every row with an extra delimiter (an empty trailing column). */
  trailingDelimiter: boolean;
  /** Write the recording's metadata as `# key: value` lines before the header. */
  metadataLines: boolean;
  /** No header at all (read back with a sample rate). */
  headerless: boolean;
  /** Significant digits of values; 'shortest' = shortest text that reads back to the same double. */
  digits: number | 'shortest';
}

/** A plain comma-separated dialect in SI units, seconds, shortest round-trip numbers. */
export const DEFAULT_DIALECT: LogDialect = {
  delimiter: ',',
  decimal: '.',
  lineEnding: '\n',
  bom: false,
  timeFormat: 'seconds',
  timeDecimals: 3,
  isoZone: 'Z',
  utcOffsetMin: 0,
  timeDecimalSign: '.',
  unitStyle: 'brackets',
  units: {},
  quoteNumbers: false,
  trailingDelimiter: false,
  metadataLines: true,
  headerless: false,
  digits: 'shortest',
};
