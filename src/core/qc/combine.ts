/**
 * Combining per-step estimates of one quantity into one chip value.
 *
 * Inverse-variance weighted mean x̄ = Σwᵢxᵢ/Σwᵢ, wᵢ = 1/σᵢ², internal SE = 1/√Σwᵢ, inflated by the
 * Birge ratio S = √(χ²/(n−1)) when the steps scatter more than their own errors allow (S > 1) —
 * the scale-factor procedure of the Particle Data Group's Review of Particle Physics, "Introduction:
 * averaging procedures" (from memory). CI95 = x̄ ± t₀.₉₇₅,ₙ₋₁·SE when inflated, x̄ ± z₀.₉₇₅·SE otherwise.
 * A single estimate passes through with its own interval.
 */
import { normalQuantile } from '../stats/normal';
import { studentTQuantile } from '../stats/student-t';
import type { MeasuredValue } from './types';

/** Combines estimates that carry a standard error; those without one are ignored. Null if none usable. */
export function combineEstimates(estimates: readonly MeasuredValue[]): MeasuredValue | null {
  const usable = estimates.filter((e) => Number.isFinite(e.value) && e.standardError !== null && Number.isFinite(e.standardError) && (e.standardError as number) > 0);
  if (usable.length === 0) return null;
  if (usable.length === 1) return usable[0] as MeasuredValue;
  let sw = 0;
  let swx = 0;
  for (const e of usable) {
    const w = 1 / ((e.standardError as number) ** 2);
    sw += w;
    swx += w * e.value;
  }
  const mean = swx / sw;
  const chi2 = usable.reduce((a, e) => a + ((e.value - mean) / (e.standardError as number)) ** 2, 0);
  const n = usable.length;
  const birge = Math.sqrt(chi2 / (n - 1));
  const inflated = birge > 1;
  const se = Math.sqrt(1 / sw) * (inflated ? birge : 1);
  const q = inflated ? studentTQuantile(0.975, n - 1) : normalQuantile(0.975);
  return { value: mean, standardError: se, ci95: [mean - q * se, mean + q * se] };
}

/** A measured value from a value and a 95 % CI only (SE = half-width / z₀.₉₇₅, symmetric approximation). */
export function fromCi(value: number, ci95: [number, number] | null, standardError: number | null): MeasuredValue {
  const z = normalQuantile(0.975);
  const se = standardError ?? (ci95 ? (ci95[1] - ci95[0]) / (2 * z) : null);
  return { value, standardError: se, ci95 };
}
