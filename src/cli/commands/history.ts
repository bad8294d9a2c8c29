/**
 * `lagbench history`: query the QC record store by lot, chip and time; print a table, JSON or CSV.
 * With --lot it also prints the lot statistics (mean, SD, n, Cpk against the limits).
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { InputError } from '../../core/errors';
import { formatNumber } from '../../core/qc/format';
import { QC_QUANTITY_LABEL } from '../../core/qc/units';
import { DEFAULT_QC_STORE, lotStatistics, openQcStore, queryHistory, type HistoryQuery } from '../../io/qc-store';
import { historyCsv } from '../../report/exports';
import { EXIT, UsageError, type CliIo, type Command } from '../io';

const HELP = `Usage: lagbench history [--lot <name>] [--chip <id>] [--since <date>] [--db <file>] [--json|--csv]

Lists QC records (oldest first) from the record store written by 'lagbench qc'. Records are never
changed; a re-test appears as a further record of the same chip.

Options:
  --lot <name>      only this lot (and print its statistics: n, mean, SD, Cp, Cpk per quantity)
  --chip <id>       only this chip
  --since <date>    only records at or after this time (ISO 8601, e.g. 2026-12-01 or 2026-12-01T08:00Z; UTC
                    when no offset is given)
  --db <file>       record store (default: ${DEFAULT_QC_STORE} in the current folder)
  --json            records (and lot statistics) as JSON, values in SI units
  --csv             one row per record as CSV (SI units; text cells protected against formula injection)

Examples:
  lagbench history --lot A
  lagbench history --chip M2-007 --json
  lagbench history --since 2026-11-01 --csv > records.csv
`;

/** Parses --since: an ISO date or date-time; no offset → UTC. */
export function parseSince(text: string): string {
  const iso = /^\d{4}-\d{2}-\d{2}$/.test(text) ? `${text}T00:00:00Z` : /[zZ]|[+-]\d{2}:?\d{2}$/.test(text) ? text : `${text}Z`;
  const ms = Date.parse(iso);
  if (!/^\d{4}-\d{2}-\d{2}/.test(text) || Number.isNaN(ms)) throw new UsageError(`--since '${text}' is not a date; write e.g. 2026-12-01 or 2026-12-01T08:00Z.`);
  return new Date(ms).toISOString();
}

export const historyCommand: Command = {
  name: 'history',
  summary: 'list QC records by lot, chip or date; lot statistics',
  help: HELP,
  async run(args: string[], io: CliIo): Promise<number> {
    const q: HistoryQuery = {};
    let db = DEFAULT_QC_STORE;
    let format: 'table' | 'json' | 'csv' = 'table';
    for (let k = 0; k < args.length; k++) {
      const a = args[k] as string;
      const val = (): string => {
        const v = args[++k];
        if (v === undefined) throw new UsageError(`${a} needs a value.`);
        return v;
      };
      if (a === '--lot') q.lot = val();
      else if (a === '--chip') q.chip = val();
      else if (a === '--since') q.since = parseSince(val());
      else if (a === '--db') db = val();
      else if (a === '--json') format = 'json';
      else if (a === '--csv') format = 'csv';
      else throw new UsageError(`unknown ${a.startsWith('-') ? 'option' : 'argument'} ${a}.`);
    }
    const path = resolve(io.cwd, db);
    if (!existsSync(path)) throw new InputError('no-record-store', 'There is no QC record store here', "Run 'lagbench qc' first, or point --db at the store", { file: db });
    const store = openQcStore(path);
    try {
      const records = queryHistory(store, q);
      const stats = q.lot !== undefined ? lotStatistics(store, q.lot).statistics : null;
      if (format === 'json') {
        io.stdout(`${JSON.stringify({ store: path, query: q, records, lot_statistics: stats }, null, 2)}\n`);
      } else if (format === 'csv') {
        io.stdout(historyCsv(records));
      } else {
        const rows = records.map((r) => [
          `#${r.id}`, r.recordedAt, r.lot ?? '—', r.chipId, r.verdict.toUpperCase(), r.disposition, r.operator ?? '—',
          formatNumber(r.quantities.resistance?.value, 3), formatNumber(r.quantities.compliance?.value, 3),
          r.quantities.trapped_air ? formatNumber(r.quantities.trapped_air.value * 1e12, 3) : '—',
        ]);
        const header = ['record', 'time (UTC)', 'lot', 'chip', 'verdict', 'disposition', 'operator', 'R Pa·s/m³', 'C m³/Pa', 'air nL'];
        const w = header.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
        const line = (r: string[]): string => r.map((x, c) => x.padEnd(w[c] ?? 0)).join('  ').trimEnd();
        io.stdout(`${[line(header), line(w.map((n) => '-'.repeat(n))), ...rows.map(line)].join('\n')}\n${records.length} record(s).\n`);
        if (stats) {
          io.stdout(`\nLot ${q.lot}: ${stats.counts.pass} pass, ${stats.counts.fail} fail, ${stats.counts.retest} retest, ${stats.counts.inconclusive} inconclusive (newest record per chip)\n`);
          for (const s of stats.quantities) {
            io.stdout(`  ${QC_QUANTITY_LABEL[s.quantity]} [${s.unit}]: n ${s.stats.n}, mean ${formatNumber(s.stats.mean)}, SD ${formatNumber(s.stats.sd)}, Cpk ${formatNumber(s.capability?.cpk ?? null, 3)}\n`);
          }
        }
      }
    } finally {
      store.close();
    }
    return EXIT.ok;
  },
};
