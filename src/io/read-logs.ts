/**
 * Reads one or more logs of one run and merges them onto one time base (src/core/recording/merge.ts).
 */
import type { ImportOptions, ImportReport } from '../core/import/index';
import { mergeRecordings } from '../core/recording/merge';
import type { Recording } from '../core/recording/types';
import { readLogFile, type ProgressCallback } from './read-log';

export interface ReadLogsResult {
  /** The merged recording (the only one when a single log was read). */
  recording: Recording;
  /** Each log as imported, before merging. */
  parts: { path: string; recording: Recording; report: ImportReport }[];
}

/**
 * Reads `paths` (resolved by the caller) one after another; `displayNames` name them in messages.
 * Progress is reported per file as (file index, bytes done, bytes total).
 */
export async function readLogs(
  paths: readonly string[],
  options: ImportOptions,
  merge: { offsetsS?: number[] } = {},
  onProgress?: (fileIndex: number, ...args: Parameters<ProgressCallback>) => void,
  displayNames: readonly string[] = paths,
): Promise<ReadLogsResult> {
  const parts: ReadLogsResult['parts'] = [];
  for (let k = 0; k < paths.length; k++) {
    const path = paths[k] as string;
    const { recording, report } = await readLogFile(path, options, onProgress ? (d, t) => onProgress(k, d, t) : undefined, displayNames[k] ?? path);
    parts.push({ path, recording, report });
  }
  const recording = parts.length === 1 ? (parts[0] as ReadLogsResult['parts'][number]).recording : mergeRecordings(parts.map((p) => p.recording), merge);
  return { recording, parts };
}
