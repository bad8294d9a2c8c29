/**
 * Pieces shared by the setups: picking the chip's time constant from a multi-term fit,
 * the pre-step baseline, and the warnings every setup adds.
 */
import { InputError } from '../errors';
import type { Warning } from '../errors';
import type { TransientFit } from '../fit/types';
import { amplitudeName, tauName, withIndependent } from './parameter-set';
import type { ParameterReader, ParameterSet } from './parameter-set';
import type { LevelEstimate, PhysicalEstimate } from './types';

/** 1-based index of the slowest term (the fit sorts τ ascending, so the last one). */
export function slowestTermIndex(fit: TransientFit, setupName: string): number {
  if (fit.terms.length === 0) {
    throw new InputError(
      'fit-without-terms',
      `The ${setupName} setup needs a fit with at least one exponential term, but the fit has none`,
      'Fit the step with 1 to 3 terms (the default chooses automatically)',
    );
  }
  return fit.terms.length;
}

/** A note saying which term was used, when the fit has more than one. */
export function slowTermNote(fit: TransientFit, termIndex: number, fastMeaning: string): string[] {
  if (fit.terms.length <= 1) return [];
  const tau = fit.terms[termIndex - 1]?.tauS.value ?? Number.NaN;
  return [
    `The fit has ${fit.terms.length} exponential terms; the slowest (τ = ${tau.toPrecision(4)} s) was used as the ` +
      `chip's time constant. ${fastMeaning}`,
  ];
}

/**
 * The standing caveat of every lumped estimate (physics.md §3.7 [D]): a compliance spread along a
 * long soft line relaxes with τ₁ = 4RC/π² (flow-driven) or RC/π² (pressure-driven), so a
 * single-node C from the slowest τ is about 4/π² ≈ 0.41 of the line's total.
 */
export const LUMPED_NOTE =
  'Lumped model: if the compliance is spread along a long soft tube or channel, C from the slowest τ is about 0.41 of its total (physics.md §3.7).';

/** Warnings about the fit that limit what the derived R and C mean. */
export function fitQualityWarnings(fit: TransientFit): Warning[] {
  const out: Warning[] = [];
  if (!fit.converged) {
    out.push({ code: 'fit-not-converged', message: `The fit did not converge (${fit.stopReason}); R and C derived from it are unreliable.` });
  }
  if (!fit.settled) {
    out.push({
      code: 'plateau-extrapolated',
      message: `The window covers only ${fit.windowInTaus.toFixed(1)} time constants, so the final level is extrapolated; the CIs include that.`,
    });
  }
  return out;
}

/** Adds a warning when an estimate is not significantly determined; a value ≤ 0 is reported as `non-physical` (not as a wide CI). */
export function inconclusiveWarning(what: string, estimate: PhysicalEstimate | null): Warning[] {
  if (estimate === null || !estimate.inconclusive) return [];
  const nonPhysical = nonPhysicalWarning(what, estimate);
  if (nonPhysical.length > 0) return nonPhysical;
  const [lo, hi] = estimate.ci95;
  return [
    {
      code: 'inconclusive',
      message: `${what} is not significantly determined (95 % CI ${lo.toPrecision(3)} to ${hi.toPrecision(3)} includes 0 or spans more than a factor of 10): inconclusive.`,
    },
  ];
}

/**
 * A resistance or compliance that came out ≤ 0 with its whole 95 % CI ≤ 0 (or no CI) is physically
 * impossible: the model does not fit the step (a tight CI does not make it meaningful). Marks the estimate inconclusive and returns a
 * `non-physical` warning (empty when the value is positive).
 */
export function nonPhysicalWarning(what: string, estimate: PhysicalEstimate | null): Warning[] {
  if (estimate === null || Number.isNaN(estimate.value) || estimate.value > 0) return [];
  const [lo, hi] = estimate.ci95;
  // A negative value whose CI reaches positive values is merely undetermined (the wide-CI message says so);
  // only a CI entirely ≤ 0 (or none) says the model itself does not fit.
  if (hi > 0) return [];
  estimate.inconclusive = true;
  const sign = estimate.value < 0 ? 'negative' : estimate.value === 0 ? 'zero' : 'not finite';
  return [
    {
      code: 'non-physical',
      message: `${what} came out ${sign} (${estimate.value.toPrecision(3)}, 95 % CI ${lo.toPrecision(3)} to ${hi.toPrecision(3)}): physically impossible, so the model does not fit this step; inconclusive.`,
    },
  ];
}

/**
 * The baseline the plateau is compared with: a measured pre-step level (independent of the
 * fit, with its SE) or, when absent and the response is continuous at the step, the fit's
 * own start level y∞ + Σ aᵢ (the model value held before t_d).
 */
export function withBaseline(
  set: ParameterSet,
  fit: TransientFit,
  measured: LevelEstimate | undefined,
): { set: ParameterSet; baseline: (p: ParameterReader) => number } {
  if (measured) {
    return { set: withIndependent(set, 'baseline', measured.value, measured.standardError ?? 0), baseline: (p) => p('baseline') };
  }
  const n = fit.terms.length;
  return {
    set,
    baseline: (p) => {
      let start = p('yInf');
      for (let i = 1; i <= n; i++) start += p(amplitudeName(i));
      return start;
    },
  };
}

export { amplitudeName, tauName };
