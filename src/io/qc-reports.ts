/**
 * Writes QC reports to a folder, each file atomically: per chip `<chip>.html`, `<chip>.csv`,
 * `<chip>.json`; per batch `summary.csv` and `summary.json`; per lot `lot-<lot>.html`.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chipChecksCsv, chipReportJson, historyCsv } from '../report/exports';
import { renderChipReportHtml } from '../report/chip-report';
import { renderLotReportHtml } from '../report/lot-report';
import type { ChipReportInput, LotReportInput } from '../report/types';
import type { QcRecord } from '../core/qc/types';
import { writeFileAtomic } from './atomic-write';

/** A file-name-safe form of a chip ID or lot name (letters, digits, . _ - kept; others → _). */
export function safeFileName(name: string): string {
  const s = name.replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '_').slice(0, 100);
  return s === '' ? '_' : s;
}

/** Writes the chip's HTML, CSV and JSON; returns the paths written. `stem` must be unique in the batch. */
export function writeChipReports(dir: string, stem: string, input: ChipReportInput): string[] {
  mkdirSync(dir, { recursive: true });
  const files = [
    [join(dir, `${stem}.html`), renderChipReportHtml(input)],
    [join(dir, `${stem}.csv`), chipChecksCsv(input)],
    [join(dir, `${stem}.json`), chipReportJson(input)],
  ] as const;
  for (const [path, text] of files) writeFileAtomic(path, text);
  return files.map(([p]) => p);
}

export function writeLotReport(dir: string, input: LotReportInput): string {
  mkdirSync(dir, { recursive: true });
  const path = join(dir, `lot-${safeFileName(input.lot)}.html`);
  writeFileAtomic(path, renderLotReportHtml(input));
  return path;
}

/** Batch summary as CSV (history format) and JSON. */
export function writeSummary(dir: string, records: readonly QcRecord[], summaryJson: unknown): string[] {
  mkdirSync(dir, { recursive: true });
  const csv = join(dir, 'summary.csv');
  const json = join(dir, 'summary.json');
  writeFileAtomic(csv, historyCsv(records));
  writeFileAtomic(json, `${JSON.stringify(summaryJson, null, 2)}\n`);
  return [csv, json];
}
