/**
 * Weights for iteratively reweighted least squares (IRLS) with outlier-robust losses, scale from
 * the MAD of the residuals (Huber 1964; Holland & Welsch 1977; tuning constants for 95 %
 * efficiency at the normal: Huber k = 1.345, Tukey biweight c = 4.685).
 */
import { MAD_TO_SIGMA, medianInPlace } from '../stats/robust';
import type { RobustLoss } from './types';

export const HUBER_K = 1.345;
export const TUKEY_C = 4.685;

/**
 * Fills `weights` (IRLS weights w_i ∈ [0, 1]) from residuals r for the given loss.
 * Returns the robust scale s = 1.4826·MAD(r) used (median-centred).
 */
export function robustWeights(loss: RobustLoss, r: Float64Array, weights: Float64Array): number {
  const n = r.length;
  const tmp = Float64Array.from(r);
  const med = medianInPlace(tmp, n);
  for (let i = 0; i < n; i++) tmp[i] = Math.abs(r[i]! - med);
  let s = MAD_TO_SIGMA * medianInPlace(tmp, n);
  if (!(s > 0)) {
    // More than half the residuals are equal: fall back to the RMS so weights stay defined.
    let ss = 0;
    for (let i = 0; i < n; i++) ss += r[i]! * r[i]!;
    s = Math.sqrt(ss / Math.max(1, n));
  }
  for (let i = 0; i < n; i++) {
    if (loss === 'none' || !(s > 0)) {
      weights[i] = 1;
      continue;
    }
    const u = Math.abs(r[i]!) / s;
    if (loss === 'huber') weights[i] = u <= HUBER_K ? 1 : HUBER_K / u;
    else weights[i] = u < TUKEY_C ? (1 - (u / TUKEY_C) ** 2) ** 2 : 0;
  }
  return s;
}
