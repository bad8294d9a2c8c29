/**
 * One QC job: read a log, hash it, import, analyse (with the physics stage), derive the chip ID, the
 * chip measurement and the step plots for the report. Runs in a worker thread (src/cli/qc-worker.ts),
 * in-process in the CLI, or in the desktop app's main process. Results are plain data
 * (structured-clone safe); errors come back as data too.
 */
import { readFileSync } from 'node:fs';
import { analyzeRecording } from '../core/analyze/analyze';
import { addPhysics } from '../core/analyze/physics';
import { parseChipDescription } from '../core/chip/parse';
import { defaultFitter } from '../core/analyze/default-fitter';
import { InputError } from '../core/errors';
import { chipIdFor } from '../core/qc/chip-id';
import { measurementFromAnalysis, nominalComplianceParts } from '../core/qc/from-analysis';
import { stepCurves, type StepCurve } from '../core/qc/step-curves';
import type { ChipMeasurement } from '../core/qc/types';
import { readLogFile } from './read-log';
import { sha256Hex } from './sha256';

export interface QcJob {
  /** Absolute path to read. */
  path: string;
  /** Path as shown to the user and recorded. */
  displayPath: string;
  chipIdFrom: string | null;
  drive: 'flow-driven' | 'pressure-driven' | null;
  /** Chip description (text and the name it is shown by) for the nominal prediction and trapped air. */
  chip: { text: string; displayPath: string } | null;
  /** Software version recorded in the analysis. */
  softwareVersion: string;
}

export interface QcJobValue {
  displayPath: string;
  sha256: string;
  chipId: string;
  measurement: ChipMeasurement;
  steps: StepCurve[];
  setup: string;
  /** Nominal compliance parts (physics stage with a chip description), m³/Pa. */
  nominal: { parts: { label: string; complianceM3PerPa: number }[]; totalM3PerPa: number } | null;
  /** Trapped-air method and statement of the physics stage. */
  trappedAirNote: string | null;
}

export type QcJobResult = { ok: true; value: QcJobValue } | { ok: false; displayPath: string; message: string; inputError: boolean };

export async function runQcJob(job: QcJob): Promise<QcJobResult> {
  try {
    let bytes: Buffer;
    try {
      bytes = readFileSync(job.path);
    } catch {
      throw new InputError('file-unreadable', 'The log cannot be read', 'Check the path and permissions', { file: job.displayPath });
    }
    const sha256 = sha256Hex(bytes);
    const { recording } = await readLogFile(job.path, {}, undefined, job.displayPath);
    const chipId = chipIdFor(job.chipIdFrom, job.displayPath, recording.metadata);
    const base = analyzeRecording(
      recording,
      { setup: job.drive ?? undefined, software: { name: 'lagbench', version: job.softwareVersion } },
      defaultFitter,
    );
    const chip = job.chip ? parseChipDescription(job.chip.text, job.chip.displayPath) : undefined;
    const analysis = addPhysics(base, recording, chip ? { chip } : {});
    const air = analysis.trapped_air;
    return {
      ok: true,
      value: {
        displayPath: job.displayPath,
        sha256,
        chipId,
        measurement: measurementFromAnalysis(analysis, chipId),
        steps: stepCurves(recording, analysis),
        setup: analysis.setup,
        nominal: nominalComplianceParts(analysis),
        trappedAirNote: air ? `Method: ${air.method}. ${air.statement}` : null,
      },
    };
  } catch (err) {
    return {
      ok: false,
      displayPath: job.displayPath,
      message: err instanceof Error ? err.message : String(err),
      inputError: err instanceof InputError,
    };
  }
}
