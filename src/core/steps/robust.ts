/**
 * Small robust-statistics helpers used by step detection: medians of slices and the
 * noise σ from the median absolute first difference. Kept local to steps/ so the
 * detector does not depend on the order in which the shared stats module lands.
 */

/** Median of `values[from, to)` ignoring NaN; NaN when the slice holds no finite value. Does not modify the input. */
export function medianOfSlice(values: ArrayLike<number>, from: number, to: number): number {
  const lo = Math.max(0, from);
  const hi = Math.min(values.length, to);
  const buf = new Float64Array(Math.max(0, hi - lo));
  let m = 0;
  for (let i = lo; i < hi; i++) {
    const v = values[i] as number;
    if (Number.isFinite(v)) buf[m++] = v;
  }
  if (m === 0) return Number.NaN;
  const view = buf.subarray(0, m);
  view.sort();
  return m % 2 === 1 ? (view[(m - 1) / 2] as number) : ((view[m / 2 - 1] as number) + (view[m / 2] as number)) / 2;
}

/** Consistency factor of the MAD for a normal distribution, 1/Φ⁻¹(3/4) = 1.482602… (Rousseeuw & Croux 1993). */
export const MAD_TO_SIGMA = 1.482602218505602;

/**
 * Noise standard deviation of a sampled signal from its first differences:
 * σ ≈ 1.4826 · median(|x[i+1] − x[i]|) / √2.
 *
 * Differencing removes levels, slow drift and ramps; the median ignores the few large differences
 * at steps and spikes. For white noise, Var(Δx) = 2σ², hence the √2 (a derivation; the MAD factor
 * is from Rousseeuw & Croux, JASA 88 (1993) 1273). Uses at most `maxPairs` evenly spread differences
 * for speed on million-sample logs. Returns 0 for a noise-free (e.g. commanded setpoint) signal.
 */
export function noiseSigmaFromDifferences(values: ArrayLike<number>, maxPairs = 100_001): number {
  const n = values.length;
  if (n < 2) return 0;
  const pairs = n - 1;
  const stride = Math.max(1, Math.floor(pairs / maxPairs));
  const diffs: number[] = [];
  for (let i = 0; i < pairs; i += stride) {
    const a = values[i] as number;
    const b = values[i + 1] as number;
    if (Number.isFinite(a) && Number.isFinite(b)) diffs.push(Math.abs(b - a));
  }
  if (diffs.length === 0) return 0;
  return (MAD_TO_SIGMA * medianOfSlice(diffs, 0, diffs.length)) / Math.SQRT2;
}

/** Median spacing of a time base (s), from at most ~10 000 evenly spread intervals. */
export function medianSpacing(timeS: ArrayLike<number>): number {
  const n = timeS.length;
  if (n < 2) return Number.NaN;
  const stride = Math.max(1, Math.floor((n - 1) / 10_000));
  const d: number[] = [];
  for (let i = 0; i + 1 < n; i += stride) d.push((timeS[i + 1] as number) - (timeS[i] as number));
  return medianOfSlice(d, 0, d.length);
}
