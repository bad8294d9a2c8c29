/**
 * Signing one analysed chip off: evaluate it against the spec, record it (one transaction; an
 * identical earlier record is reused), and build its report input with the traceability block.
 * Shared by `lagbench qc` and the desktop sign-off screen.
 */
import type { ChipEvaluation, QcSpec } from '../core/qc/types';
import { evaluateChip } from '../core/qc/verdict';
import { chipReportInput, type AnalysedChip } from '../report/chip-input';
import type { ChipReportInput } from '../report/types';
import { queryHistory, recordChip, type QcStore, type RecordOutcome } from './qc-store';

export interface SignOffInput {
  spec: QcSpec;
  /** The spec file's text as read, and its SHA-256. */
  specText: string;
  specSha256: string;
  chipId: string;
  chip: AnalysedChip;
  /** Every input file with its SHA-256 (the log first; a chip description too when used). */
  inputs: { path: string; sha256: string }[];
  lot: string | null;
  operator: string | null;
  softwareVersion: string;
  settings: Record<string, unknown>;
  /** UTC ISO time of the sign-off. */
  recordedAt: string;
}

export interface SignOffResult {
  evaluation: ChipEvaluation;
  record: RecordOutcome;
  report: ChipReportInput;
}

/** Evaluates and records one chip; throws when the store refuses the record (nothing is then written). */
export function signOffChip(store: QcStore, s: SignOffInput): SignOffResult {
  const evaluation = evaluateChip(s.spec, s.chip.measurement);
  const record = recordChip(store, {
    chipId: s.chipId, lot: s.lot, operator: s.operator, recordedAt: s.recordedAt, specText: s.specText, specSha256: s.specSha256,
    specDesign: s.spec.design.name, inputs: s.inputs, softwareVersion: s.softwareVersion, settings: s.settings, measurement: s.chip.measurement, evaluation,
  });
  // An identical earlier record: show its time, operator and version, not today's.
  const stored = record.status === 'already-recorded' ? queryHistory(store, { chip: s.chipId }).find((r) => r.id === record.id) : undefined;
  const report = chipReportInput(s.spec, s.chip, evaluation, {
    chipId: s.chipId, lot: s.lot, operator: stored ? stored.operator : s.operator, recordedAt: stored?.recordedAt ?? s.recordedAt,
    specDesign: s.spec.design.name, specSha256: s.specSha256, inputs: s.inputs, softwareVersion: stored?.softwareVersion ?? s.softwareVersion,
    settings: s.settings, record: { status: record.status, id: record.id, store: store.path },
  });
  return { evaluation, record, report };
}
