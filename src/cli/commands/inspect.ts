/** `lagbench inspect <log…>`: what the importer recognised in each log, and the merged recording. */
import type { ImportReport } from '../../core/import/index';
import { summarizeRecording, type RecordingSummary } from '../../core/recording/summary';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { booleanOption, formatOptionHelp, parseCommandArgs, type OptionSpecs } from '../args';
import type { Command } from '../io';
import { importOptionSpecs, readLogsFromArgs } from '../log-args';

const specs: OptionSpecs = {
  json: { type: 'boolean', description: 'print JSON (fields: files[].report, files[].summary, merged, warnings)' },
  ...importOptionSpecs,
};

const help = `lagbench inspect <log…> [options]

Shows what Lagbench recognised in each log: delimiter, decimal sign, header and metadata lines, the time
column and its format, each column's quantity and unit (and how they were recognised), rows, duration,
sample rate and gaps, metadata and warnings. Two logs of one run are also shown merged onto one time base.

Options:
${formatOptionHelp(specs)}

Examples:
  lagbench inspect sample-logs/pressure-controller.csv
  lagbench inspect sample-logs/syringe-pump-semicolon.csv --json
  lagbench inspect sample-logs/pressure-logger-iso.csv sample-logs/flow-logger-iso.tsv
  lagbench inspect run.txt --delimiter tab --column 3=flow:uL/min --time-format elapsed
`;

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', whitespace: 'runs of spaces', none: 'none (one column)' };

function fmt(v: number | null, digits = 6): string {
  if (v === null || Number.isNaN(v)) return '—';
  return String(Number(v.toPrecision(digits)));
}

function reportText(r: ImportReport): string {
  const d = r.dialect;
  const lines: string[] = [];
  lines.push(`${r.source}`);
  lines.push(
    `  dialect: ${DELIMITER_NAMES[d.delimiter]} delimiter, decimal ${d.decimal === '.' ? 'point' : 'comma'}, ${d.lineEnding} line ends` +
      `${d.hadBom ? ', byte-order mark' : ''}; ${d.preambleLines} line(s) before the header; ` +
      `${d.headerRows === 0 ? 'no header' : `header at line ${d.headerLine}${d.headerRows === 2 ? ' with a units row' : ''}`}` +
      `${d.forced.length ? `; set by options: ${d.forced.join(', ')}` : ''}`,
  );
  lines.push(`  time: ${d.timeColumn === null ? 'from the sample rate' : `column ${d.timeColumn}, ${d.timeFormat}${d.dateColumn !== null ? `, date from column ${d.dateColumn}` : ''}`}`);
  lines.push('  columns:');
  const rows = r.columns.map((c) => [
    String(c.column),
    c.header === '' ? '(no header)' : c.header,
    c.role === 'time' || c.role === 'date' || c.role === 'ignored' ? c.role : `${c.quantity} → ${c.channelName}`,
    c.unit === '' ? '' : `${c.unit}${c.role === 'channel' && c.factorToSi !== 1 ? ` (×${fmt(c.factorToSi, 7)} to SI)` : ''}`,
    c.role === 'channel' ? `quantity from ${c.quantityFrom}, unit from ${c.unitFrom}` : c.role === 'time' || c.role === 'date' ? `recognised by ${c.quantityFrom}` : '',
  ]);
  const widths = [0, 1, 2, 3].map((k) => Math.max(...rows.map((row) => (row[k] as string).length)));
  for (const row of rows) lines.push(`    ${row.map((cell, k) => (k < 4 ? cell.padEnd(widths[k] as number) : cell)).join('  ').trimEnd()}`);
  lines.push(`  rows: ${r.rows}${r.skippedRows ? ` (${r.skippedRows} skipped)` : ''}, ${r.bytes} bytes`);
  const meta = Object.entries(r.metadata);
  if (meta.length) lines.push(`  metadata: ${meta.map(([k, v]) => `${k}: ${v}`).join('; ')}`);
  return lines.join('\n');
}

function summaryText(s: RecordingSummary, title: string): string {
  const lines: string[] = [];
  lines.push(`  ${title}: ${s.rows} samples over ${fmt(s.durationS)} s; sample rate ${fmt(s.sampleRateHz, 5)} Hz (median interval ${fmt(s.medianIntervalS)} s)`);
  lines.push(`  gaps (> 1.5 × median interval): ${s.gaps.count === 0 ? 'none' : `${s.gaps.count}, largest ${fmt(s.gaps.largestS)} s, first at t = ${fmt(s.gaps.firstAtS)} s`}`);
  lines.push(`  start: ${s.startIso ?? 'unknown (no absolute time in the log)'}`);
  for (const c of s.channels) {
    lines.push(`    ${c.name}: ${fmt(c.min)} … ${fmt(c.max)}${c.missing ? `, ${c.missing} missing` : ''}  (from '${c.originalHeader}'${c.originalUnit ? ` in ${c.originalUnit}` : ''})`);
  }
  return lines.join('\n');
}

export const inspectCommand: Command = {
  name: 'inspect',
  summary: 'show what was recognised in a log: columns, units, rate, gaps, warnings',
  help,
  async run(args, io) {
    const { values, positionals } = parseCommandArgs(args, specs, 'inspect');
    const { recording, parts } = await readLogsFromArgs(positionals, values, io, 'inspect');
    const merged = parts.length > 1 ? summarizeRecording(recording) : null;
    if (booleanOption(values, 'json')) {
      const json = {
        files: parts.map((p) => ({ report: p.report, summary: summarizeRecording(p.recording) })),
        merged,
        warnings: recording.warnings,
      };
      io.stdout(`${JSON.stringify(json, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2)}\n`);
      return 0;
    }
    const out: string[] = [];
    for (const p of parts) {
      out.push(reportText(p.report));
      out.push(summaryText(summarizeRecording(p.recording), 'values in SI (Pa, m³/s)'));
      if (p.report.warnings.length) out.push(`  warnings:\n${p.report.warnings.map((w) => `    - ${w.message}`).join('\n')}`);
    }
    if (merged) {
      out.push(`merged (${parts.length} logs on the time base of the faster one; linear interpolation, NaN outside a log's span)`);
      out.push(summaryText(merged, 'merged'));
      const mw = recording.warnings.filter((w) => w.code.startsWith('merge'));
      if (mw.length) out.push(`  warnings:\n${mw.map((w) => `    - ${w.message}`).join('\n')}`);
    }
    if (recording.channels.some((c) => c.quantity === 'pressure' || c.quantity === 'pressure_setpoint' || c.quantity === 'hydrostatic_head')) {
      out.push(`\n${PRESSURE_SAFETY_CAUTION}`);
    }
    io.stdout(`${out.join('\n')}\n`);
    return 0;
  },
};
