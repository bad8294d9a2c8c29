/**
 * The sign-off screen's chip data, computed in the analysis worker from the current analysis (with
 * its physics stage) exactly as `lagbench qc` does per log (src/io/qc-job.ts): the measurement
 * (core measurementFromAnalysis), the step plots (stepCurves) and the nominal compliance parts.
 */
import type { AnalysisWithPhysicsJson } from '../../core/analyze/physics';
import { measurementFromAnalysis, nominalComplianceParts } from '../../core/qc/from-analysis';
import { stepCurves } from '../../core/qc/step-curves';
import type { Recording } from '../../core/recording/types';
import type { AnalysedChip } from '../../report/chip-input';

let last: { analysis: AnalysisWithPhysicsJson; recording: Recording } | null = null;

/** Called by the worker after every analysis (the sign-off screen judges the newest one). */
export function rememberAnalysis(analysis: AnalysisWithPhysicsJson, recording: Recording): void {
  last = { analysis, recording };
}

/** The analysed chip for the QC report and the store; throws when there is no analysis yet. */
export function analysedChip(chipId: string): AnalysedChip & { setup: string } {
  if (!last) throw new Error('No analysis yet: open a log and let the fits finish.');
  const { analysis, recording } = last;
  const air = analysis.trapped_air;
  return {
    measurement: measurementFromAnalysis(analysis, chipId),
    steps: stepCurves(recording, analysis),
    nominal: nominalComplianceParts(analysis),
    trappedAirNote: air ? `Method: ${air.method}. ${air.statement}` : null,
    setup: analysis.setup,
  };
}
