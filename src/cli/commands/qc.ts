/**
 * `lagbench qc <folder|logs…> --spec <spec.json>`: analyse every log (in parallel), judge each chip
 * against the acceptance spec, record it in the QC store, write reports, print a summary.
 * Exit: 0 all pass, 3 any chip failed, 4 none failed but some inconclusive/retest, 2 bad input.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { parseChipDescription } from '../../core/chip/parse';
import { InputError } from '../../core/errors';
import { formatNumber } from '../../core/qc/format';
import { checkChipIdSource, parseQcSpec } from '../../core/qc/spec';
import type { ChipEvaluation, QcSpec } from '../../core/qc/types';
import { evaluateChip, VERDICT_RULE } from '../../core/qc/verdict';
import { latestPerChip } from '../../core/qc/lot-summary';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { lotStatistics, openQcStore, queryHistory, DEFAULT_QC_STORE, type RecordOutcome } from '../../io/qc-store';
import { signOffChip } from '../../io/qc-signoff';
import { safeFileName, writeChipReports, writeLotReport, writeSummary } from '../../io/qc-reports';
import { sha256Hex } from '../../io/sha256';
import { EXIT, UsageError, type CliIo, type Command } from '../io';
import type { QcJob, QcJobResult, QcJobValue as QcJobSuccess } from '../../io/qc-job';
import { runQcPool } from '../qc-pool';
import { VERSION } from '../version';

const HELP = `Usage: lagbench qc <folder|log…> --spec <spec.json> [options]

Signs chips off against an acceptance spec (docs/qc-spec.md). Every log (a folder: all .csv, .tsv,
.txt, .log and .dat files in it, except *.program.*, *.truth.* and README*) is analysed in parallel; each chip gets pass, fail or inconclusive
with the reason for every limit, is recorded in the QC record store, and gets an HTML/CSV/JSON report.

Rule: a limit passes when the whole 95 % CI lies inside it, fails when the whole CI lies outside it,
and is inconclusive otherwise; a chip fails if any limit fails, else is inconclusive if any is.

Options:
  --spec <file>             acceptance spec (JSON), required
  --chip-id-from <source>   filename:<regex with one (group)> or metadata:<key>
                            (default: the spec's chip_id_from, else the file name without extension)
  --chip <file>             chip description for the nominal R and C and the trapped-air estimate
                            (default: the spec's test.chip_description, relative to the spec file)
  --operator <name>         who ran the test (recorded)
  --lot <name>              lot name (recorded; also writes the lot report lot-<name>.html)
  --db <file>               QC record store (default: ${DEFAULT_QC_STORE} in the current folder)
  --report-dir <dir>        where reports go (default: qc-reports)
  --jobs <n>                at most n parallel workers (default: the number of cores)
  --json                    print the batch summary as JSON

Examples:
  lagbench qc sample-logs/lot-A --spec qc-specs/pdms-mixer-m2.json --lot A --operator "J. Doe"
  lagbench qc run1.csv run2.csv --spec spec.json --chip-id-from metadata:chip --json

Exit codes: 0 every chip passed, 3 at least one chip failed, 4 none failed but at least one was
inconclusive (or to be retested), 2 bad input (spec, logs or options; the batch still records the rest).
`;

const LOG_EXTENSIONS = ['.csv', '.tsv', '.txt', '.log', '.dat'];
/** Files in a lot folder that are not logs: step programs, simulator truth, read-me files. */
const SKIPPED_NAMES = /(\.program\.|\.truth\.|^readme)/i;

interface QcArgs {
  inputs: string[];
  spec: string | null;
  chipIdFrom: string | null;
  chip: string | null;
  operator: string | null;
  lot: string | null;
  db: string;
  reportDir: string;
  jobs: number | null;
  json: boolean;
}

function parseArgs(args: string[]): QcArgs {
  const out: QcArgs = { inputs: [], spec: null, chipIdFrom: null, chip: null, operator: null, lot: null, db: DEFAULT_QC_STORE, reportDir: 'qc-reports', jobs: null, json: false };
  const valueOf = (k: number, name: string): string => {
    const v = args[k + 1];
    if (v === undefined || (v.startsWith('--') && v.length > 2)) throw new UsageError(`${name} needs a value.`);
    return v;
  };
  for (let k = 0; k < args.length; k++) {
    const a = args[k] as string;
    const [flag, inline] = a.startsWith('--') && a.includes('=') ? [a.slice(0, a.indexOf('=')), a.slice(a.indexOf('=') + 1)] : [a, undefined];
    const take = (): string => {
      if (inline !== undefined) return inline;
      const v = valueOf(k, flag);
      k++;
      return v;
    };
    switch (flag) {
      case '--spec': out.spec = take(); break;
      case '--chip-id-from': out.chipIdFrom = take(); break;
      case '--chip': out.chip = take(); break;
      case '--operator': out.operator = take(); break;
      case '--lot': out.lot = take(); break;
      case '--db': out.db = take(); break;
      case '--report-dir': out.reportDir = take(); break;
      case '--jobs': {
        const v = take();
        const n = Number(v);
        if (!Number.isInteger(n) || n < 1) throw new UsageError(`--jobs must be a whole number ≥ 1, not '${v}'.`);
        out.jobs = n;
        break;
      }
      case '--json': out.json = true; break;
      default:
        if (a.startsWith('-') && a !== '-') throw new UsageError(`unknown option ${a}.`);
        out.inputs.push(a);
    }
  }
  return out;
}

/** Log files named directly or found in the named folders (sorted, hidden files skipped). */
function collectLogs(inputs: string[], cwd: string): { path: string; display: string }[] {
  const out: { path: string; display: string }[] = [];
  for (const input of inputs) {
    const abs = resolve(cwd, input);
    let st;
    try {
      st = statSync(abs);
    } catch {
      throw new InputError('file-not-found', 'No such file or folder', 'Check the path', { file: input });
    }
    if (st.isDirectory()) {
      const names = readdirSync(abs)
        .filter((n) => !n.startsWith('.') && !SKIPPED_NAMES.test(n) && LOG_EXTENSIONS.some((e) => n.toLowerCase().endsWith(e)))
        .sort();
      for (const n of names) if (statSync(join(abs, n)).isFile()) out.push({ path: join(abs, n), display: join(input, n) });
    } else out.push({ path: abs, display: input });
  }
  return out;
}

/** The chip description named by --chip (relative to cwd) or the spec (relative to the spec file), validated. */
function readChipDescription(a: QcArgs, spec: QcSpec, cwd: string): { text: string; displayPath: string; sha256: string } | null {
  const given = a.chip ?? spec.test.chipDescription;
  if (given === null) return null;
  const abs = a.chip !== null ? resolve(cwd, a.chip) : resolve(dirname(resolve(cwd, a.spec ?? '.')), given);
  const displayPath = relative(cwd, abs) || abs;
  let text: string;
  try {
    text = readFileSync(abs, 'utf8');
  } catch {
    throw new InputError('file-not-found', 'The chip description cannot be read', a.chip !== null ? 'Check the path given to --chip' : 'Check test.chip_description in the spec (a path relative to the spec file)', { file: displayPath });
  }
  parseChipDescription(text, displayPath); // fail early (exit 2) with a located message
  return { text, displayPath, sha256: sha256Hex(text) };
}

interface ChipOutcome {
  displayPath: string;
  chipId: string | null;
  evaluation: ChipEvaluation | null;
  value: QcJobSuccess | null;
  record: RecordOutcome | null;
  reports: string[];
  error: string | null;
  inputError: boolean;
}

function summaryLine(o: ChipOutcome): string {
  if (o.error) return `${o.displayPath}: error: ${o.error}`;
  return `${o.chipId ?? '?'}: ${o.evaluation?.verdict ?? '?'} (${o.evaluation?.disposition ?? '?'})${o.record?.status === 'already-recorded' ? ', already recorded' : ''}`;
}

function table(outcomes: ChipOutcome[]): string {
  const rows = outcomes.map((o) => {
    const q = o.value?.measurement.quantities;
    const failing = o.evaluation?.results.filter((r) => r.verdict !== 'pass').map((r) => r.label) ?? [];
    return [
      o.chipId ?? o.displayPath,
      o.error ? 'ERROR' : (o.evaluation?.verdict ?? '').toUpperCase(),
      o.error ? '' : (o.evaluation?.disposition ?? ''),
      formatNumber(q?.resistance?.value, 3),
      formatNumber(q?.compliance?.value, 3),
      q?.trapped_air ? formatNumber(q.trapped_air.value * 1e12, 3) : '—',
      formatNumber(q?.t95?.value, 3),
      o.error ? o.error : failing.join('; ') || '—',
      o.record ? (o.record.status === 'recorded' ? `#${o.record.id}` : `#${o.record.id} (already)`) : '—',
    ];
  });
  const header = ['chip', 'verdict', 'disposition', 'R Pa·s/m³', 'C m³/Pa', 'air nL', 't95 s', 'not passed', 'record'];
  const widths = header.map((h, c) => Math.min(60, Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length))));
  const line = (r: string[]): string => r.map((x, c) => x.slice(0, 60).padEnd(widths[c] ?? 0)).join('  ').trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

export const qcCommand: Command = {
  name: 'qc',
  summary: 'sign chips off against an acceptance spec; record verdicts; write reports',
  help: HELP,
  async run(args: string[], io: CliIo): Promise<number> {
    const a = parseArgs(args);
    if (!a.spec) throw new UsageError('--spec <spec.json> is required.');
    if (a.inputs.length === 0) throw new UsageError('give a folder or at least one log file.');
    if (a.chipIdFrom !== null) {
      const problem = checkChipIdSource(a.chipIdFrom);
      if (problem) throw new UsageError(`--chip-id-from ${problem}: write filename:<regex> or metadata:<key>.`);
    }
    let specText: string;
    try {
      specText = readFileSync(resolve(io.cwd, a.spec), 'utf8');
    } catch {
      throw new InputError('file-not-found', 'The spec file cannot be read', 'Check the path given to --spec', { file: a.spec });
    }
    const spec = parseQcSpec(specText, a.spec);
    const specSha256 = sha256Hex(specText);
    const logs = collectLogs(a.inputs, io.cwd);
    if (logs.length === 0) throw new InputError('no-logs', `No log files (${LOG_EXTENSIONS.join(', ')}) were found`, 'Give a folder with logs or name the log files', { file: a.inputs.join(', ') });
    const chipIdFrom = a.chipIdFrom ?? spec.chipIdFrom;
    const chip = readChipDescription(a, spec, io.cwd);
    const jobs: QcJob[] = logs.map((l) => ({ path: l.path, displayPath: l.display, chipIdFrom, drive: spec.test.drive, chip: chip ? { text: chip.text, displayPath: chip.displayPath } : null, softwareVersion: VERSION }));
    const settings = { chip_id_from: chipIdFrom, drive: spec.test.drive, analysis: 'defaults', chip_description_sha256: chip?.sha256 ?? null };
    const chipInput = chip ? [{ path: chip.displayPath, sha256: chip.sha256 }] : [];
    const reportDir = resolve(io.cwd, a.reportDir);
    const dbPath = resolve(io.cwd, a.db);
    const store = openQcStore(dbPath);
    const outcomes: ChipOutcome[] = new Array(jobs.length);
    const stems = new Set<string>();
    let done = 0;
    try {
      const handle = (index: number, result: QcJobResult): void => {
        const o = finishChip(result);
        outcomes[index] = o;
        done++;
        if (io.isTty) io.stderr(`\r\x1b[2K[${done}/${jobs.length}] ${summaryLine(o)}${done === jobs.length ? '\n' : ''}`);
        else io.stderr(`qc ${done}/${jobs.length}: ${summaryLine(o)}\n`);
      };
      const finishChip = (result: QcJobResult): ChipOutcome => {
        if (!result.ok) return { displayPath: result.displayPath, chipId: null, evaluation: null, value: null, record: null, reports: [], error: result.message, inputError: result.inputError };
        const v = result.value;
        let signed;
        try {
          signed = signOffChip(store, {
            spec, specText, specSha256, chipId: v.chipId, chip: v, inputs: [{ path: v.displayPath, sha256: v.sha256 }, ...chipInput],
            lot: a.lot, operator: a.operator, softwareVersion: VERSION, settings, recordedAt: new Date().toISOString(),
          });
        } catch (err) {
          return { displayPath: v.displayPath, chipId: v.chipId, evaluation: evaluateChip(spec, v.measurement), value: v, record: null, reports: [], error: `not recorded: ${err instanceof Error ? err.message : String(err)}`, inputError: false };
        }
        let stem = safeFileName(v.chipId);
        for (let k = 2; stems.has(stem); k++) stem = `${safeFileName(v.chipId)}-${k}`;
        stems.add(stem);
        const reports = writeChipReports(reportDir, stem, signed.report);
        return { displayPath: v.displayPath, chipId: v.chipId, evaluation: signed.evaluation, value: v, record: signed.record, reports, error: null, inputError: false };
      };
      const { workers } = await runQcPool(jobs, { maxWorkers: a.jobs ?? undefined, onResult: handle });
      const recordIds = new Set(outcomes.flatMap((o) => (o.record ? [o.record.id] : [])));
      const batchRecords = queryHistory(store).filter((r) => recordIds.has(r.id));
      const extra: string[] = [];
      if (a.lot !== null) {
        const { statistics, charts } = lotStatistics(store, a.lot);
        const latest = latestPerChip(queryHistory(store, { lot: a.lot }));
        extra.push(writeLotReport(reportDir, { lot: a.lot, records: latest, statistics, charts, generatedAt: new Date().toISOString(), softwareVersion: VERSION, storePath: dbPath }));
      }
      const summary = {
        software: { name: 'lagbench', version: VERSION },
        spec: { file: a.spec, sha256: specSha256, design: spec.design.name, inconclusive_counts_as: spec.inconclusiveCountsAs },
        lot: a.lot,
        operator: a.operator,
        store: dbPath,
        workers,
        rule: VERDICT_RULE,
        chips: outcomes.map((o) => ({
          file: o.displayPath,
          chip_id: o.chipId,
          verdict: o.evaluation?.verdict ?? null,
          disposition: o.evaluation?.disposition ?? null,
          record: o.record ? { id: o.record.id, status: o.record.status } : null,
          checks: o.evaluation?.results ?? [],
          quantities_si: o.value?.measurement.quantities ?? null,
          reports: o.reports.map((p) => relative(io.cwd, p)),
          error: o.error,
        })),
      };
      extra.push(...writeSummary(reportDir, batchRecords, summary));
      if (a.json) io.stdout(`${JSON.stringify(summary, null, 2)}\n`);
      else {
        const n = (d: string): number => outcomes.filter((o) => o.evaluation?.disposition === d).length;
        const errors = outcomes.filter((o) => o.error).length;
        io.stdout(`${table(outcomes)}\n\n`);
        io.stdout(`${outcomes.length} log(s): ${n('pass')} pass, ${n('fail')} fail, ${n('retest')} retest, ${n('inconclusive')} inconclusive${errors ? `, ${errors} error(s)` : ''}.\n`);
        io.stdout(`Records: ${dbPath}. Reports: ${relative(io.cwd, reportDir) || '.'}${workers ? ` (analysed on ${workers} worker threads)` : ''}.\n`);
        io.stdout(`Rule: ${VERDICT_RULE}\n\n${PRESSURE_SAFETY_CAUTION}\n`);
      }
    } finally {
      store.close();
    }
    if (outcomes.some((o) => o.error)) return outcomes.some((o) => o.inputError) ? EXIT.badInput : EXIT.internalError;
    if (outcomes.some((o) => o.evaluation?.disposition === 'fail')) return EXIT.qcFailed;
    if (outcomes.some((o) => o.evaluation?.disposition !== 'pass')) return EXIT.qcInconclusive;
    return EXIT.ok;
  },
};
