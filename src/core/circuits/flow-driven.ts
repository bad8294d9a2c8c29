/**
 * Flow-driven setup: a pump imposes the flow Q into a compliant node (tubing, syringe,
 * inlet), a pressure sensor reads that node, and the chip's resistance R drains it to the
 * outlet (physics.md §4.2):
 *
 *   C dp/dt = Q − p/R   ⇒   p(t) = p₀ + ΔQ·R·(1 − e^(−t/τ)),  τ = R·C
 *
 * so R = Δp∞/ΔQ (steady state, Hagen–Poiseuille-type linear law dp = R·Q, §1.1) and
 * C = τ/R (τ = R_th·C with R_th = R because an ideal flow source is an open circuit, §4.1).
 * ΔQ is the setpoint change (taken as exact); Δp∞ = y∞ − baseline from the fit.
 */
import type { TransientFit } from '../fit/types';
import { parameterSetFromFit } from './parameter-set';
import { propagate } from './propagate';
import {
  fitQualityWarnings,
  inconclusiveWarning,
  LUMPED_NOTE,
  slowestTermIndex,
  slowTermNote,
  tauName,
  withBaseline,
} from './setup-common';
import type { CircuitEstimate, LevelEstimate } from './types';

export interface FlowDrivenInput {
  /** Fit of the pressure at the compliant node (Pa, gauge) after the step. */
  pressureFit: TransientFit;
  /** Pump flow before and after the step (setpoint), m³/s. */
  flowBeforeM3PerS: number;
  flowAfterM3PerS: number;
  /** Pressure before the step (Pa); default: the fit's start level y∞ + Σaᵢ. */
  pressureBefore?: LevelEstimate;
}

/** R and C of a flow-driven circuit from one pressure step response (§4.2). */
export function estimateFlowDriven(input: FlowDrivenInput): CircuitEstimate {
  const fit = input.pressureFit;
  const k = slowestTermIndex(fit, 'flow-driven');
  const deltaQ = input.flowAfterM3PerS - input.flowBeforeM3PerS;
  const fromFit = parameterSetFromFit(fit);
  const { set, baseline } = withBaseline(fromFit.set, fit, input.pressureBefore);
  const warnings = [...fromFit.warnings, ...fitQualityWarnings(fit)];
  const tauKey = tauName(k);

  const tauS = propagate(set, (p) => p(tauKey), fit.dof);
  const resistance = propagate(set, (p) => (p('yInf') - baseline(p)) / deltaQ, fit.dof);
  const compliance = propagate(set, (p) => (p(tauKey) * deltaQ) / (p('yInf') - baseline(p)), fit.dof);

  if (!(deltaQ !== 0)) {
    warnings.push({ code: 'no-drive-change', message: 'The pump flow did not change at this step, so R and C cannot be derived.' });
  } else if (resistance.value <= 0) {
    warnings.push({
      code: 'resistance-sign',
      message: 'The pressure moved against the flow change (R ≤ 0): check which channel is the drive and which the response.',
    });
  }
  warnings.push(...inconclusiveWarning('The resistance R', resistance), ...inconclusiveWarning('The compliance C', compliance));

  return {
    setup: 'flow-driven',
    resistancePaSPerM3: resistance,
    complianceM3PerPa: compliance,
    tauS,
    tauTermIndex: k,
    notes: [
      'R = Δp∞/ΔQ and C = τ/R (flow source: the node sees R alone).',
      LUMPED_NOTE,
      ...slowTermNote(fit, k, 'Faster terms are taken as the pump or sensor lag, or a second compliant node (use the ladder setup for that).'),
    ],
    warnings,
  };
}
