/**
 * A saved piece of work: which logs (by path and SHA-256 of their bytes), the import overrides, the
 * setup, the chip description (path + hash), fit settings and the manual step edits. It never holds
 * the data themselves; on reopening, the logs are read again and their hashes checked.
 */
import type { ImportOptions } from '../../core/import/types';
import type { Setup, Step } from '../../core/steps/types';
import type { FitSettings } from '../worker/protocol';
import type { StepEdit } from '../steps-edit';

export const WORK_FORMAT = 'lagbench-work';
export const WORK_VERSION = 1;

export interface WorkInput {
  path: string;
  name: string;
  sha256: string;
  bytes: number;
}

export interface WorkFile {
  format: typeof WORK_FORMAT;
  version: typeof WORK_VERSION;
  savedAt: string;
  inputs: WorkInput[];
  importOptions: ImportOptions[];
  /** Start of the second log on the first log's time axis, s (null = by timestamps). */
  mergeOffsetS: number | null;
  setup: Setup;
  chip: WorkInput | null;
  fit: FitSettings;
  /** The step list after manual edits (null = use detection as is). */
  steps: Array<Pick<Step, 'onsetS' | 'origin' | 'drive' | 'direction'>> | null;
  /** The edits in the order they were made (a record for the reader). */
  stepEdits: StepEdit[];
}

export function serializeWork(work: WorkFile): string {
  return `${JSON.stringify(work, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2)}\n`;
}

/** Thrown with a readable message when a work file is not one of ours or is damaged. */
export class WorkFileError extends Error {
  override readonly name = 'WorkFileError';
}

function isInput(v: unknown): v is WorkInput {
  if (typeof v !== 'object' || v === null) return false;
  const o = v as Record<string, unknown>;
  return typeof o.path === 'string' && typeof o.name === 'string' && typeof o.sha256 === 'string' && /^[0-9a-f]{64}$/.test(o.sha256) && typeof o.bytes === 'number';
}

const SETUPS: readonly Setup[] = ['flow-driven', 'pressure-driven'];

/** Parses and checks a work file; `name` is used in messages. */
export function parseWork(text: string, name: string): WorkFile {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    throw new WorkFileError(`${name}: not valid JSON (${err instanceof Error ? err.message : String(err)}). Choose a file saved with Save work.`);
  }
  const o = (typeof data === 'object' && data !== null ? data : {}) as Record<string, unknown>;
  if (o.format !== WORK_FORMAT) throw new WorkFileError(`${name}: not a Lagbench work file (format is ${JSON.stringify(o.format)}, expected "${WORK_FORMAT}").`);
  if (o.version !== WORK_VERSION) throw new WorkFileError(`${name}: work file version ${String(o.version)} is not supported (this version reads ${WORK_VERSION}).`);
  if (!Array.isArray(o.inputs) || o.inputs.length < 1 || o.inputs.length > 2 || !o.inputs.every(isInput)) throw new WorkFileError(`${name}: "inputs" must list one or two logs with path, name, sha256 and bytes.`);
  if (typeof o.setup !== 'string' || !SETUPS.includes(o.setup as Setup)) throw new WorkFileError(`${name}: "setup" must be one of ${SETUPS.join(', ')}.`);
  if (o.chip !== null && !isInput(o.chip)) throw new WorkFileError(`${name}: "chip" must be null or a file reference with path, name, sha256 and bytes.`);
  const steps = o.steps;
  if (steps !== null && !(Array.isArray(steps) && steps.every((s) => typeof s === 'object' && s !== null && typeof (s as { onsetS?: unknown }).onsetS === 'number'))) {
    throw new WorkFileError(`${name}: "steps" must be null or a list of steps with onsetS (s).`);
  }
  const restored = (steps as WorkFile['steps'])?.map((s) => ({
    ...s,
    drive: { ...s.drive, before: s.drive?.before ?? Number.NaN, after: s.drive?.after ?? Number.NaN },
  })) ?? null;
  return {
    format: WORK_FORMAT,
    version: WORK_VERSION,
    savedAt: typeof o.savedAt === 'string' ? o.savedAt : '',
    inputs: o.inputs as WorkInput[],
    importOptions: Array.isArray(o.importOptions) ? (o.importOptions as ImportOptions[]) : [],
    mergeOffsetS: typeof o.mergeOffsetS === 'number' && Number.isFinite(o.mergeOffsetS) ? o.mergeOffsetS : null,
    setup: o.setup as Setup,
    chip: (o.chip as WorkInput | null) ?? null,
    fit: (o.fit as FitSettings) ?? { terms: 'auto', deadTime: false, drift: false, robust: 'none' },
    steps: restored,
    stepEdits: Array.isArray(o.stepEdits) ? (o.stepEdits as StepEdit[]) : [],
  };
}
