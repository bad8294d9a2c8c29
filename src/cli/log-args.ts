/** Shared by the commands that read logs: positional log paths → the merged recording, with progress. */
import { resolve } from 'node:path';
import { readLogs, type ReadLogsResult } from '../io/read-logs';
import { importOptionSpecs, parseImportOptions, parseMergeOffsets } from './import-options';
import { UsageError, type CliIo } from './io';
import type { OptionValues } from './args';

export { importOptionSpecs };

/** Reads the logs named on the command line (paths relative to io.cwd), showing progress on a terminal. */
export async function readLogsFromArgs(positionals: string[], values: OptionValues, io: CliIo, command: string): Promise<ReadLogsResult> {
  if (positionals.length === 0) throw new UsageError('give at least one log file', command);
  const options = parseImportOptions(values);
  const offsetsS = parseMergeOffsets(values);
  if (offsetsS !== undefined && offsetsS.length !== positionals.length - 1) {
    throw new UsageError(`--offset: give one offset per log after the first (${positionals.length - 1}), not ${offsetsS.length}`, command);
  }
  let lastShown = -1;
  const progress = io.isTty
    ? (k: number, done: number, total: number): void => {
        const pct = total > 0 ? Math.floor((100 * done) / total) : 100;
        if (pct === lastShown) return;
        lastShown = pct;
        io.stderr(`\rreading ${positionals[k]}: ${pct}%${pct === 100 ? '\n' : ''}`);
      }
    : undefined;
  return readLogs(
    positionals.map((p) => resolve(io.cwd, p)),
    options,
    offsetsS ? { offsetsS } : {},
    progress,
    positionals,
  );
}
