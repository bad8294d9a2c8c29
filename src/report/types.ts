/** Inputs of the QC reports. Plain data: the CLI and the desktop app fill them the same way. */
import type { ChipEvaluation, ChipMeasurement, MeasuredValue, QcRecord, QcSpec } from '../core/qc/types';
import type { ControlCharts, LotStatistics } from '../core/qc/lot-summary';

/** Who, what, when and from which files: printed in every report. */
export interface Traceability {
  chipId: string;
  lot: string | null;
  operator: string | null;
  /** UTC ISO 8601. */
  recordedAt: string;
  specDesign: string;
  specSha256: string;
  inputs: { path: string; sha256: string }[];
  softwareVersion: string;
  settings: Record<string, unknown>;
  /** Store outcome, when recorded. */
  record: { status: 'recorded' | 'already-recorded'; id: number; store: string } | null;
}

/** One step window with its fitted curve (for the step plot and the residuals). */
export interface StepPlot {
  title: string;
  /** Seconds since the step onset. */
  tS: readonly number[];
  /** Measured response, SI. */
  y: readonly number[];
  /** Fitted model at tS, SI; null when no fit. */
  fitY: readonly number[] | null;
  /** SI unit of y, e.g. 'm3_per_s' or 'Pa'. */
  yUnit: string;
  /** Display: value shown = y / displayScale, with displayUnit (e.g. 1e-9/60 and 'µL/min'). */
  displayScale: number;
  displayUnit: string;
  /** Fitted τ of the step (display in the caption), s. */
  tauS?: MeasuredValue | null;
}

/** Nominal compliance parts versus the fitted total, m³/Pa. */
export interface ComplianceBreakdown {
  parts: { label: string; complianceM3PerPa: number }[];
  nominalTotalM3PerPa: number;
  fitted: MeasuredValue | null;
}

/** Trapped-air estimate (physics.md §3.4: V ≈ C_excess·(p_abs − p_v)). */
export interface TrappedAirEstimate {
  volumeM3: MeasuredValue;
  /** Absolute pressure used, Pa. */
  absolutePressurePa: number | null;
  note: string | null;
}

export interface ChipReportInput {
  spec: QcSpec;
  measurement: ChipMeasurement;
  evaluation: ChipEvaluation;
  trace: Traceability;
  steps: StepPlot[];
  breakdown: ComplianceBreakdown | null;
  trappedAir: TrappedAirEstimate | null;
}

export interface LotReportInput {
  lot: string;
  /** Newest record per chip in this lot. */
  records: QcRecord[];
  statistics: LotStatistics;
  charts: ControlCharts[];
  /** When the report was made, UTC ISO. */
  generatedAt: string;
  softwareVersion: string;
  storePath: string;
}
