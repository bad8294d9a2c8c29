/**
 * Pressure-driven setup: a regulator or hydrostatic head imposes p through the upstream
 * resistance R_up (tubing, flow sensor) into the compliant node C, and the chip R_down
 * drains it to the outlet (physics.md §4.3, check values there):
 *
 *   τ = C·R_up·R_down/(R_up + R_down)                    (R_th = R_up ∥ R_down, §4.1)
 *   outlet flow: Q₂(t) = Δp/(R_up + R_down)·(1 − e^(−t/τ))        rises from 0
 *   inlet flow:  Q₁(t) = Δp/(R_up + R_down) + Δp·R_down/(R_up(R_up + R_down))·e^(−t/τ)
 *                jumps by Δp/R_up at t = 0⁺, then decays to the plateau
 *
 * Recipe (§4.3): R_total = Δp/ΔQ∞; R_up = Δp/ΔQ(0⁺) with an inlet sensor; then
 * C = τ·R_total/(R_up·R_down), R_down = R_total − R_up. With an outlet sensor alone R_up
 * must come from elsewhere (chip description, --upstream-resistance); without it only the
 * product τ = C·R_th is identified, and C ≥ 4τ/R_total (R_th ≤ R_total/4, equality at R_up = R_down).
 *
 * A source's own lag (regulator, head settling) shows as a fast second term or a dead time:
 * with several terms the slowest is the chip's τ, and the inlet jump is extrapolated from the
 * slow term alone (y∞ + a_slow), i.e. the jump the chip would see from an ideal source.
 */
import { InputError } from '../errors';
import type { TransientFit } from '../fit/types';
import { amplitudeName, parameterSetFromFit, withIndependent } from './parameter-set';
import type { ParameterReader } from './parameter-set';
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
import type { CircuitEstimate, LevelEstimate, PhysicalEstimate } from './types';

export interface PressureDrivenInput {
  /** Fit of the flow after the step (m³/s). */
  flowFit: TransientFit;
  /** Where the flow sensor sits: before the compliant node ('inlet') or after the chip ('outlet'). */
  sensor: 'inlet' | 'outlet';
  /** Imposed pressure before and after the step (setpoint or ρ·g·h), Pa gauge. */
  pressureBeforePa: number;
  pressureAfterPa: number;
  /**
   * Flow before the step (m³/s). Required with an inlet sensor (the flow jumps, so the fit's
   * start level is not the old plateau); default for the outlet: the fit's start level.
   */
  flowBefore?: LevelEstimate;
  /** Known upstream resistance (Pa·s/m³) with its 1σ, from the chip description or the user. */
  upstreamResistance?: LevelEstimate;
}

export interface PressureDrivenEstimate extends CircuitEstimate {
  setup: 'pressure-driven-outlet-flow' | 'pressure-driven-inlet-flow';
  /** R_up: from the inlet jump, or the given value (its σ enters the propagation), or null. */
  upstreamResistancePaSPerM3: PhysicalEstimate | null;
  /** R_down = R_total − R_up (the chip), or null without R_up. */
  downstreamResistancePaSPerM3: PhysicalEstimate | null;
  /** Lower bound 4τ/R_total on C, given when R_up is unknown (null otherwise). */
  complianceLowerBoundM3PerPa: number | null;
  /** Where R_up came from. */
  upstreamResistanceSource: 'inlet-jump' | 'given' | 'unknown';
}

/** R_total, R_up, R_down and C of a pressure-driven circuit from one flow step response (§4.3). */
export function estimatePressureDriven(input: PressureDrivenInput): PressureDrivenEstimate {
  const fit = input.flowFit;
  const k = slowestTermIndex(fit, 'pressure-driven');
  const deltaP = input.pressureAfterPa - input.pressureBeforePa;
  if (input.sensor === 'inlet' && !input.flowBefore) {
    throw new InputError(
      'missing-pre-step-flow',
      'An inlet flow sensor jumps at the step, so the flow before the step is needed to measure the jump',
      'Pass the mean flow of the window before the step',
    );
  }
  const fromFit = parameterSetFromFit(fit);
  const withBase = withBaseline(fromFit.set, fit, input.flowBefore);
  let set = withBase.set;
  const baseline = withBase.baseline;
  const warnings = [...fromFit.warnings, ...fitQualityWarnings(fit)];
  const tauKey = tauName(k);
  const aSlow = amplitudeName(k);

  const rTotal = (p: ParameterReader): number => deltaP / (p('yInf') - baseline(p));
  let rUp: ((p: ParameterReader) => number) | null = null;
  let source: PressureDrivenEstimate['upstreamResistanceSource'] = 'unknown';
  if (input.sensor === 'inlet') {
    rUp = (p) => deltaP / (p('yInf') + p(aSlow) - baseline(p));
    source = 'inlet-jump';
  } else if (input.upstreamResistance) {
    set = withIndependent(set, 'rUp', input.upstreamResistance.value, input.upstreamResistance.standardError ?? 0);
    rUp = (p) => p('rUp');
    source = 'given';
  }

  const dof = fit.dof;
  const tauS = propagate(set, (p) => p(tauKey), dof);
  const total = propagate(set, rTotal, dof);
  let upstream: PhysicalEstimate | null = null;
  let downstream: PhysicalEstimate | null = null;
  let compliance: PhysicalEstimate | null = null;
  let lowerBound: number | null = null;
  if (rUp) {
    const up = rUp;
    upstream = propagate(set, up, dof);
    downstream = propagate(set, (p) => rTotal(p) - up(p), dof);
    compliance = propagate(set, (p) => (p(tauKey) * rTotal(p)) / (up(p) * (rTotal(p) - up(p))), dof);
    if (downstream.value <= 0) {
      warnings.push({
        code: 'upstream-exceeds-total',
        message: 'R_up is not smaller than the total resistance Δp/ΔQ∞, so R_down and C cannot be derived; check R_up and the sensor position.',
      });
      compliance = null;
    }
  } else {
    lowerBound = (4 * tauS.value) / total.value;
    warnings.push({
      code: 'upstream-resistance-unknown',
      message:
        'With an outlet flow sensor only, C needs the upstream resistance R_up (give a chip description or --upstream-resistance); ' +
        `without it C ≥ 4τ/R_total = ${lowerBound.toPrecision(3)} m³/Pa is all the step shows.`,
    });
  }
  if (!(deltaP !== 0)) {
    warnings.push({ code: 'no-drive-change', message: 'The imposed pressure did not change at this step, so R and C cannot be derived.' });
  } else if (total.value <= 0) {
    warnings.push({ code: 'resistance-sign', message: 'The flow moved against the pressure change (R ≤ 0): check the channel assignment.' });
  }
  warnings.push(
    ...inconclusiveWarning('The total resistance', total),
    ...inconclusiveWarning('The upstream resistance R_up', source === 'inlet-jump' ? upstream : null),
    ...inconclusiveWarning('The chip resistance R_down', downstream),
    ...inconclusiveWarning('The compliance C', compliance),
  );

  return {
    setup: input.sensor === 'inlet' ? 'pressure-driven-inlet-flow' : 'pressure-driven-outlet-flow',
    resistancePaSPerM3: total,
    complianceM3PerPa: compliance,
    tauS,
    tauTermIndex: k,
    upstreamResistancePaSPerM3: upstream,
    downstreamResistancePaSPerM3: downstream,
    complianceLowerBoundM3PerPa: lowerBound,
    upstreamResistanceSource: source,
    notes: [
      'R_total = Δp/ΔQ∞; τ = C·R_up·R_down/(R_up + R_down) (pressure source: the node sees R_up ∥ R_down).',
      ...(source === 'inlet-jump' ? ['R_up = Δp/(jump of the inlet flow at t = 0⁺), extrapolated from the slow term.'] : []),
      ...(source === 'given' ? ['R_up was given (chip description or --upstream-resistance).'] : []),
      LUMPED_NOTE,
      ...slowTermNote(fit, k, 'Faster terms are taken as the pressure source lag (regulator, head settling), not chip compliance.'),
    ],
    warnings,
  };
}
