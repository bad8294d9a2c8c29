/**
 * Messages between the renderer and its analysis worker (src/ui/worker/analysis.worker.ts), and the
 * view models the worker returns. The worker holds the full-resolution recording; the window only gets
 * what it draws (decimated series, fit windows), so large logs never freeze it.
 */
import type { Warning } from '../../core/errors';
import type { ImportOptions, ImportReport } from '../../core/import/types';
import type { Quantity } from '../../core/recording/types';
import type { Setup, Step } from '../../core/steps/types';
import type { TransientFit } from '../../core/fit/types';
import type { AnalysedChip } from '../../report/chip-input';
import type { WhatIfRequest, WhatIfView } from './whatif-protocol';

/** Which core pieces the worker could load (a missing piece is shown as "not available yet"). */
export interface Capabilities {
  importer: boolean;
  stepDetection: boolean;
  fitting: boolean;
  circuits: boolean;
  chip: boolean;
  nominal: boolean;
  trappedAir: boolean;
  fingerprint: boolean;
}

export interface ChannelInfo {
  name: string;
  quantity: Quantity;
  originalHeader: string;
  originalUnit: string;
  sourceIndex: number;
}

export interface RecordingSummary {
  channels: ChannelInfo[];
  sampleCount: number;
  durationS: number;
  startEpochMs: number | null;
  sources: string[];
  reports: ImportReport[];
  warnings: Warning[];
  /** The setup the channels suggest (core chooseSetup) and why. */
  suggestedSetup: Setup;
  setupReason: string;
}

/** Min/max-decimated series for drawing (SI values, time on the recording's base). */
export interface SeriesSet {
  tS: Float64Array;
  channels: Array<{ name: string; y: Float64Array }>;
}

export interface StepsResult {
  steps: Step[];
  channel: string | null;
  quantity: Quantity;
  noiseSigma: number;
  warnings: Warning[];
}

/** A derived quantity with CI, as shown (SI). */
export interface ShownEstimate {
  value: number;
  ci95: [number, number];
  inconclusive?: boolean;
}

export interface StepFitView {
  stepIndex: number;
  onsetS: number;
  windowEndS: number;
  responseChannel: string;
  responseQuantity: Quantity;
  /** Data in the window, time since onset (decimated for drawing), SI. */
  tS: Float64Array;
  y: Float64Array;
  /** Fitted curve and residuals at tS (empty when the fit failed). */
  fitY: Float64Array;
  residual: Float64Array;
  fit: TransientFit | null;
  /** Why there is no fit, when there is none. */
  error: string | null;
  resistancePaSPerM3: ShownEstimate | null;
  complianceM3PerPa: ShownEstimate | null;
  /** Mean absolute pressure at the node in the window, Pa (gauge + ambient). */
  pressureAbsPa: number | null;
  notes: string[];
  warnings: Warning[];
}

export interface ComplianceSource {
  source: string;
  valueM3PerPa: number;
  rangeM3PerPa: [number, number] | null;
}

export interface NominalView {
  resistancePaSPerM3: number;
  complianceM3PerPa: number;
  complianceRangeM3PerPa: [number, number] | null;
  breakdown: ComplianceSource[];
  tauS: number | null;
  notes: string[];
}

export interface FingerprintView {
  points: Array<{ stepIndex: number; pressureAbsPa: number; complianceM3PerPa: number; ci95: [number, number] }>;
  /** C = C_rigid + V_atm·p_atm/p_abs² fitted to the points. */
  cRigidM3PerPa: ShownEstimate;
  vAtmM3: ShownEstimate;
  ambientPa: number;
}

export interface TrappedAirView {
  volumeM3AtAtm: ShownEstimate;
  volumeM3AtWorking: ShownEstimate | null;
  method: string;
  /** Whether the data support trapped gas (CI above zero). */
  evidence: 'gas' | 'none' | 'inconclusive';
  conclusion: string;
}

export interface AnalysisView {
  setup: Setup;
  fits: StepFitView[];
  /** Fitted compliance summarised over steps (weighted), when available. */
  fittedComplianceM3PerPa: ShownEstimate | null;
  nominal: NominalView | null;
  /** Why nominal is missing (no chip description, core piece missing, chip error). */
  nominalNote: string | null;
  fingerprint: FingerprintView | null;
  fingerprintNote: string | null;
  trappedAir: TrappedAirView | null;
  trappedAirNote: string | null;
  warnings: Warning[];
}

/** A log's raw bytes (the worker decodes them in chunks, reporting progress). */
export interface LogBytes {
  name: string;
  bytes: Uint8Array;
}

export interface FitSettings {
  terms: 1 | 2 | 3 | 'auto';
  deadTime: boolean;
  drift: boolean;
  robust: 'none' | 'huber' | 'tukey';
}

export type WorkerRequest =
  | { id: number; type: 'capabilities' }
  | { id: number; type: 'import'; files: LogBytes[]; options: ImportOptions[]; mergeOffsetS: number | null }
  | { id: number; type: 'series'; fromS: number | null; toS: number | null; maxPoints: number }
  | { id: number; type: 'detect'; setup: Setup }
  | { id: number; type: 'analyze'; setup: Setup; steps: Step[]; chipText: string | null; chipName: string | null; fit: FitSettings; stepIndices: number[] | null }
  | ({ id: number; type: 'whatif' } & WhatIfRequest)
  | { id: number; type: 'qc-chip'; chipId: string };

export interface WorkerResults {
  capabilities: Capabilities;
  import: RecordingSummary;
  series: SeriesSet;
  detect: StepsResult;
  analyze: AnalysisView;
  whatif: WhatIfView;
  'qc-chip': AnalysedChip & { setup: string };
}

export type WorkerResponse =
  | { id: number; type: 'progress'; fraction: number; label: string }
  | { id: number; type: 'result'; result: unknown }
  | { id: number; type: 'error'; message: string; inputError: boolean };
