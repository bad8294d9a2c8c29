/**
 * Pre-filters of step detection: gap filling and a running median that removes isolated spikes
 * while keeping step edges sharp (a median filter preserves monotone edges; Tukey 1977,
 * "Exploratory Data Analysis", running medians — from memory).
 */

/**
 * `values` with NaN replaced by the last finite value before it (leading NaN by the first finite
 * value): a new array, or `values` itself when it is a Float64Array without gaps (treat as read-only).
 * Returns null when no value is finite.
 */
export function fillGaps(values: ArrayLike<number>): Float64Array | null {
  const n = values.length;
  if (values instanceof Float64Array && n > 0) {
    let allFinite = true;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(values[i] as number)) {
        allFinite = false;
        break;
      }
    }
    if (allFinite) return values;
  }
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
  if (w === 5 && n >= 5) return runningMedian5(values);
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

/** Median of five numbers with a fixed network of comparisons (no allocation, no branches on sorting state). */
function median5(a: number, b: number, c: number, d: number, e: number): number {
  // Order (a,b) and (c,d), drop the smaller of the two minima, then the median is the
  // median of the remaining three-way comparison (Paeth's median-of-5 scheme; from memory, checked by test).
  let t: number;
  if (a > b) { t = a; a = b; b = t; }
  if (c > d) { t = c; c = d; d = t; }
  if (a > c) { t = b; b = d; d = t; c = a; }
  // a is now the smallest of a,b,c,d and is out; continue with e in its place.
  a = e;
  if (a > b) { t = a; a = b; b = t; }
  if (a > c) { t = b; b = d; d = t; c = a; }
  return Math.min(b, c);
}

/** Width-5 running median, the default spike filter (ends: median of 3, then the sample itself). */
function runningMedian5(v: Float64Array): Float64Array {
  const n = v.length;
  const out = new Float64Array(n);
  const med3 = (a: number, b: number, c: number): number => Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
  out[0] = med3(v[0] as number, v[1] as number, v[2] as number);
  out[1] = runningMedianAt(v, 1);
  for (let i = 2; i < n - 2; i++) {
    out[i] = median5(v[i - 2] as number, v[i - 1] as number, v[i] as number, v[i + 1] as number, v[i + 2] as number);
  }
  out[n - 2] = runningMedianAt(v, n - 2);
  out[n - 1] = med3(v[n - 3] as number, v[n - 2] as number, v[n - 1] as number);
  return out;
}

/** Median of the width-5 window at i, shrunk at the ends (same rule as the general path). */
function runningMedianAt(v: Float64Array, i: number): number {
  const lo = Math.max(0, i - 2);
  const hi = Math.min(v.length - 1, i + 2);
  const w = Array.from(v.subarray(lo, hi + 1)).sort((x, y) => x - y);
  const m = w.length;
  return m % 2 === 1 ? (w[(m - 1) / 2] as number) : ((w[m / 2 - 1] as number) + (w[m / 2] as number)) / 2;
}
