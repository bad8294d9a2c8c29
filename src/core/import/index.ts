/** Delimited-text log import: dialect detection, headers and units, time formats, streaming body parser. */
export { createLogParser, parseLogText, DETECTION_SAMPLE_CHARS, type LogParser, type ImportResult } from './parser';
export type { ImportOptions, ImportReport, DialectReport, ColumnReport, ColumnOverride, Delimiter, TimeFormat, Recognition } from './types';
export { isQuantity } from './columns';
export { parseIsoTime, parseHmsSeconds } from './time-text';
export { formatOffset } from './body';
