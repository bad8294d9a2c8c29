/**
 * The export format: CSV in SI units, header `time_s` then one column per channel named by its
 * `Channel.name` (`pressure_Pa`, `flow_m3_per_s`, `pressure_setpoint_Pa`, `flow_setpoint_m3_per_s`, `_2`…),
 * values at full precision (the shortest text that reads back to the same double), empty where missing.
 * The importer reads it back exactly.
 */
import type { Recording } from '../recording/types';

/** Formats a recording as SI CSV. */
export function formatSiCsv(recording: Recording): string {
  const header = ['time_s', ...recording.channels.map((c) => c.name)].join(',');
  const parts: string[] = [];
  if (recording.startEpochMs !== null) parts.push(`# start: ${new Date(recording.startEpochMs).toISOString()}\n`);
  parts.push(`${header}\n`);
  const cols = recording.channels.map((c) => c.values);
  const rows: string[] = [];
  for (let i = 0; i < recording.timeS.length; i++) {
    let line = String(recording.timeS[i]);
    for (const v of cols) {
      const x = v[i] as number;
      line += Number.isNaN(x) ? ',' : `,${x}`;
    }
    rows.push(line);
    if (rows.length === 10000) {
      parts.push(rows.join('\n') + '\n');
      rows.length = 0;
    }
  }
  if (rows.length > 0) parts.push(rows.join('\n') + '\n');
  return parts.join('');
}
