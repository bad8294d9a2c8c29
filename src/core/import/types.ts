/**
 * Options, detected dialect and report of the log importer. Every detected setting can be overridden
 * by the matching option; the report says what was used and how each column was recognised.
 */
import type { Warning } from '../errors';
import type { Quantity } from '../recording/types';

/** Field separator. `whitespace` = runs of spaces and/or tabs. */
export type Delimiter = ',' | ';' | '\t' | 'whitespace' | 'none';

/** How the time column is written. */
export type TimeFormat =
  | 'seconds'
  | 'milliseconds'
  | 'minutes'
  | 'hours'
  | 'elapsed' // hh:mm:ss(.sss) since the start; hours may exceed 23
  | 'clock' // hh:mm:ss(.sss) time of day; passing midnight adds 24 h
  | 'iso'; // ISO 8601 date and time, with or without zone

/** An override for one column, by 1-based number or exact header text. */
export interface ColumnOverride {
  /** 1-based column number, or the header text (name part or whole header). */
  column: number | string;
  /** `ignore` drops the column. */
  quantity: Quantity | 'ignore';
  /** Unit text (any spelling `lookupUnit` accepts); required for pressure/flow/head if the header has none. */
  unit?: string;
}

/** What the user may force; anything absent is detected. */
export interface ImportOptions {
  /** File name used in messages and in Recording.sources. */
  sourceName?: string;
  delimiter?: Delimiter;
  decimal?: '.' | ',';
  /** 1-based column number or header text of the time column. */
  timeColumn?: number | string;
  timeFormat?: TimeFormat;
  /**
   * UTC offset for ISO timestamps without a zone and for clock times, minutes east of UTC (+120 = UTC+02:00).
   * Without it such times are taken as UTC and a warning says so.
   */
  timezoneOffsetMin?: number;
  /** Sample rate (Hz) for a file without a time column; time = row index / rate. */
  sampleRateHz?: number;
  columns?: ColumnOverride[];
  /** Liquid density for liquid-head heights, kg/m³ (default 998.2, water at 20 °C). */
  liquidDensityKgPerM3?: number;
  /** Skip rows with non-numeric values or the wrong number of fields, counting them as a warning. */
  skipBadRows?: boolean;
  /** Sort rows by time instead of refusing time that goes backwards. */
  sortTime?: boolean;
  /** Drop rows whose time repeats the previous row's (the first is kept) instead of refusing them. */
  dropRepeatedTime?: boolean;
  /** Size of the whole text in characters (≈ bytes), when known: lets the parser allocate its columns once. */
  sizeHintChars?: number;
}

/** How a column's quantity or unit was decided. */
export type Recognition = 'header-name' | 'header-unit' | 'units-row' | 'option' | 'position' | 'none';

/** One column as recognised. */
export interface ColumnReport {
  /** 1-based column number in the file. */
  column: number;
  header: string;
  /** Unit text as found (or given by option), '' if none. */
  unit: string;
  /** `date`: a YYYY-MM-DD column completing a clock-time column. */
  role: 'time' | 'date' | 'channel' | 'ignored';
  quantity: Quantity | null;
  /** Factor applied to reach SI (1 for time in s; NaN when not converted). */
  factorToSi: number;
  quantityFrom: Recognition;
  unitFrom: Recognition;
  /** Name of the channel in the recording, when a channel. */
  channelName?: string;
}

/** The detected (or forced) text dialect. */
export interface DialectReport {
  delimiter: Delimiter;
  decimal: '.' | ',';
  hadBom: boolean;
  lineEnding: 'LF' | 'CRLF' | 'CR';
  /** Lines before the header (metadata, comments), count. */
  preambleLines: number;
  /** 0 = no header, 1 = names, 2 = names and a units row. */
  headerRows: number;
  /** 1-based line of the first header row, or null. */
  headerLine: number | null;
  timeFormat: TimeFormat | 'sample-rate';
  /** 1-based time column, or null when time comes from the sample rate. */
  timeColumn: number | null;
  /** 1-based date column (YYYY-MM-DD) that completes a clock-time column, or null. */
  dateColumn: number | null;
  /** Which settings came from options rather than detection. */
  forced: string[];
}

/** Everything the importer can tell the user about one file. */
export interface ImportReport {
  source: string;
  dialect: DialectReport;
  columns: ColumnReport[];
  /** Data rows kept. */
  rows: number;
  /** Data rows skipped (bad rows, repeated times). */
  skippedRows: number;
  bytes: number;
  metadata: Record<string, string>;
  warnings: Warning[];
}
