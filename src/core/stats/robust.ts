/** Robust location and scale estimates for noisy sensor data. */

/** Consistency factor of the MAD for normal data, 1/Φ⁻¹(3/4) (Hampel 1974; Rousseeuw & Croux 1993). */
export const MAD_TO_SIGMA = 1.482602218505602;

/** Median of the finite values (NaN when there are none). Does not modify the input. */
export function median(values: ArrayLike<number>): number {
  const a = finiteCopy(values);
  return medianInPlace(a, a.length);
}

/** Median absolute deviation from the median, unscaled (NaN for no finite values). */
export function mad(values: ArrayLike<number>): number {
  const a = finiteCopy(values);
  const n = a.length;
  if (n === 0) return NaN;
  const m = medianInPlace(a, n);
  for (let i = 0; i < n; i++) a[i] = Math.abs(a[i]! - m);
  return medianInPlace(a, n);
}

/** MAD scaled to estimate a normal standard deviation: 1.4826 · MAD. */
export function madSigma(values: ArrayLike<number>): number {
  return MAD_TO_SIGMA * mad(values);
}

/**
 * White-noise σ of a slowly varying signal from the MAD of first differences:
 * σ ≈ 1.4826 · MAD(Δy) / √2 (differences of white noise have variance 2σ²; common practice,
 * e.g. Donoho–Johnstone-style MAD scale estimates). Steps and smooth trends barely affect it.
 */
export function noiseSigmaFromDifferences(y: ArrayLike<number>): number {
  const d = new Float64Array(Math.max(0, y.length - 1));
  let k = 0;
  let prev = NaN;
  for (let i = 0; i < y.length; i++) {
    const v = y[i]!;
    if (!Number.isFinite(v)) continue;
    if (Number.isFinite(prev)) d[k++] = v - prev;
    prev = v;
  }
  if (k === 0) return NaN;
  const m = medianInPlace(d, k);
  for (let i = 0; i < k; i++) d[i] = Math.abs(d[i]! - m);
  return (MAD_TO_SIGMA * medianInPlace(d, k)) / Math.SQRT2;
}

function finiteCopy(values: ArrayLike<number>): Float64Array {
  let n = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) n++;
  const a = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (Number.isFinite(v)) a[k++] = v;
  }
  return a;
}

/** Median of a[0..n) by quickselect (Hoare); reorders a. */
export function medianInPlace(a: Float64Array, n: number): number {
  if (n === 0) return NaN;
  const hi = select(a, n, n >> 1);
  if (n % 2 === 1) return hi;
  let lo = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (a[i]! > lo) lo = a[i]!;
  return 0.5 * (lo + hi);
}

/** k-th smallest (0-based) of a[0..n); afterwards a[0..k) ≤ a[k] ≤ a[k+1..n). */
function select(a: Float64Array, n: number, k: number): number {
  let left = 0;
  let right = n - 1;
  while (right > left) {
    const pivot = a[(left + right) >> 1]!;
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i]! < pivot) i++;
      while (a[j]! > pivot) j--;
      if (i <= j) {
        const t = a[i]!;
        a[i] = a[j]!;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return a[k]!;
}
