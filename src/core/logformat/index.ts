/** Writing logs: every dialect the importer reads, and the SI CSV export format. */
export { DEFAULT_DIALECT, type LogDialect } from './dialect';
export { writeLog, formatNumber } from './write-log';
export { formatSiCsv } from './si-csv';
