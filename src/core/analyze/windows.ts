/**
 * Cutting the fit window of one step: relative time from the onset, SI response, optional
 * block averaging of long windows.
 */
import type { TransientData } from '../fit/types';
import type { Step } from '../steps/types';

export interface StepWindow {
  data: TransientData;
  /** Raw samples in the window. */
  samples: number;
  /** Raw samples averaged into one fitted point (1 = none). */
  samplesPerPoint: number;
}

/** Index of the first element of the increasing array `a` that is ≥ x (or > x when `strict`). */
export function lowerBound(a: Float64Array, x: number, strict = false): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    const v = a[mid] as number;
    if (v < x || (strict && v === x)) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The window of `step` in `values`: samples after the onset up to (excluding) the window end; the last
 * window of a recording includes its last sample. For a step on a drive channel or from a user list the
 * sample at the onset itself is left out: the change happened during the interval that ends there, so
 * it straddles the step. For a step found on the response the onset is the last sample still at the old
 * level and is kept.
 *
 * Windows longer than `maxPoints` are block-averaged (equal blocks, time at the block centre). For an
 * exponential this keeps τ exactly — the mean of e^{−t/τ} over a block of width h centred at t_c is
 * e^{−t_c/τ}·sinh(h/2τ)/(h/2τ), the same factor for every block, absorbed in the amplitude (derivation);
 * a linear drift is also kept exactly. The amplitude is biased by that factor (< 0.3 % for h < τ/4).
 */
export function cutWindow(timeS: Float64Array, values: Float64Array, step: Step, endOfRecordS: number, maxPoints: number): StepWindow {
  const strictStart = step.origin !== 'response';
  const from = lowerBound(timeS, step.onsetS, strictStart);
  const to = step.windowEndS >= endOfRecordS ? timeS.length : lowerBound(timeS, step.windowEndS);
  const samples = Math.max(0, to - from);
  const perPoint = maxPoints > 0 && samples > maxPoints ? Math.ceil(samples / maxPoints) : 1;
  const points = Math.ceil(samples / perPoint);
  const tS = new Float64Array(points);
  const y = new Float64Array(points);
  for (let p = 0; p < points; p++) {
    const a = from + p * perPoint;
    const b = Math.min(to, a + perPoint);
    let tSum = 0;
    let ySum = 0;
    let m = 0;
    for (let i = a; i < b; i++) {
      const v = values[i] as number;
      if (Number.isFinite(v)) {
        tSum += (timeS[i] as number) - step.onsetS;
        ySum += v;
        m++;
      }
    }
    // A block with no finite sample stays NaN (the fitter ignores it); time at the block's middle.
    tS[p] = m > 0 ? tSum / m : ((timeS[a] as number) + (timeS[b - 1] as number)) / 2 - step.onsetS;
    y[p] = m > 0 ? ySum / m : Number.NaN;
  }
  return { data: { tS, y }, samples, samplesPerPoint: perPoint };
}
