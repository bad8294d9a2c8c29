/**
 * Pre-filters of step detection: gap filling and a running median that removes isolated spikes
 * while keeping step edges sharp (a median filter preserves monotone edges; Tukey 1977,
 * "Exploratory Data Analysis", running medians — from memory).
 */

/**
 * Copy of `values` with NaN replaced by the last finite value before it (leading NaN by the first
 * finite value). Returns null when no value is finite.
 */
export function fillGaps(values: ArrayLike<number>): Float64Array | null {
  const n = values.length;
  const out = new Float64Array(n);
  let first = Number.NaN;
  for (let i = 0; i < n; i++) {
    const v = values[i] as number;
    if (Number.isFinite(v)) {
      first = v;
      break;
    }
  }
  if (!Number.isFinite(first)) return null;
  let last = first;
  for (let i = 0; i < n; i++) {
    const v = values[i] as number;
    if (Number.isFinite(v)) last = v;
    out[i] = last;
  }
  return out;
}

/**
 * Running median of odd width `width` (centred; the window shrinks at the ends).
 * An isolated spike of up to (width − 1)/2 samples disappears; a step edge stays where it was.
 * Cost O(n·width) with an insertion sort, fine for the small widths used here (3–11).
 */
export function runningMedian(values: Float64Array, width: number): Float64Array {
  const n = values.length;
  const w = Math.max(1, Math.floor(width) | 1);
  if (w === 1 || n === 0) return values.slice();
  const half = (w - 1) / 2;
  const out = new Float64Array(n);
  const buf = new Float64Array(w);
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - half);
    const hi = Math.min(n - 1, i + half);
    let m = 0;
    for (let j = lo; j <= hi; j++) {
      const v = values[j] as number;
      let k = m - 1;
      while (k >= 0 && (buf[k] as number) > v) {
        buf[k + 1] = buf[k] as number;
        k--;
      }
      buf[k + 1] = v;
      m++;
    }
    out[i] = m % 2 === 1 ? (buf[(m - 1) / 2] as number) : ((buf[m / 2 - 1] as number) + (buf[m / 2] as number)) / 2;
  }
  return out;
}

/** Prefix sums S[i] = Σ_{j<i} (values[j] − offset), length n + 1; the offset keeps the sums small (fewer lost digits). */
export function prefixSums(values: Float64Array, offset: number): Float64Array {
  const s = new Float64Array(values.length + 1);
  let acc = 0;
  for (let i = 0; i < values.length; i++) {
    acc += (values[i] as number) - offset;
    s[i + 1] = acc;
  }
  return s;
}
