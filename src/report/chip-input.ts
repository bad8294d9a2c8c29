/** Assembles a {@link ChipReportInput} from an analysed chip (shared by the CLI and the desktop app). */
import type { StepCurve } from '../core/qc/step-curves';
import type { ChipEvaluation, ChipMeasurement, QcSpec } from '../core/qc/types';
import type { ChipReportInput, Traceability } from './types';

export interface AnalysedChip {
  measurement: ChipMeasurement;
  steps: StepCurve[];
  /** Nominal compliance parts and total, m³/Pa (physics stage with a chip description). */
  nominal: { parts: { label: string; complianceM3PerPa: number }[]; totalM3PerPa: number } | null;
  trappedAirNote: string | null;
}

export function chipReportInput(spec: QcSpec, chip: AnalysedChip, evaluation: ChipEvaluation, trace: Traceability): ChipReportInput {
  const q = chip.measurement.quantities;
  return {
    spec,
    measurement: chip.measurement,
    evaluation,
    trace,
    steps: chip.steps,
    breakdown: chip.nominal ? { parts: chip.nominal.parts, nominalTotalM3PerPa: chip.nominal.totalM3PerPa, fitted: q.compliance ?? null } : null,
    trappedAir: q.trapped_air ? { volumeM3: q.trapped_air, absolutePressurePa: null, note: chip.trappedAirNote } : null,
  };
}
