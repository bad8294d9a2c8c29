/** Pure QC report rendering: HTML pages, CSV and JSON exports. */
export * from './types';
export { escapeHtml } from './escape';
export { csvCell, toCsv, type CsvValue } from './csv';
export { renderChipReportHtml } from './chip-report';
export { renderLotReportHtml } from './lot-report';
export { chipChecksCsv, chipReportJson, historyCsv } from './exports';
export { renderXyChart, renderBarChart, niceTicks } from './svg';
export { chipReportInput, type AnalysedChip } from './chip-input';
