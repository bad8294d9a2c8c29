/**
 * Min/max decimation for drawing: per time bucket keep the samples holding each channel's minimum and
 * maximum, so spikes and steps survive at any zoom (common practice for plotting long logs, no source).
 */
export function decimateMinMax(timeS: Float64Array, channels: Float64Array[], from: number, to: number, buckets: number): { idx: Int32Array } {
  const n = to - from;
  if (n <= buckets * 2) {
    const idx = new Int32Array(n);
    for (let i = 0; i < n; i++) idx[i] = from + i;
    return { idx };
  }
  const picked: number[] = [];
  const per = n / buckets;
  for (let b = 0; b < buckets; b++) {
    const s = from + Math.floor(b * per);
    const e = Math.min(to, from + Math.floor((b + 1) * per));
    if (e <= s) continue;
    const set = new Set<number>([s]);
    for (const ch of channels) {
      let lo = s;
      let hi = s;
      for (let i = s; i < e; i++) {
        const v = ch[i] as number;
        if (v < (ch[lo] as number) || Number.isNaN(ch[lo] as number)) lo = i;
        if (v > (ch[hi] as number) || Number.isNaN(ch[hi] as number)) hi = i;
      }
      set.add(lo);
      set.add(hi);
    }
    picked.push(...[...set].sort((a, b2) => a - b2));
  }
  return { idx: Int32Array.from(picked) };
}

/** First index with timeS[i] >= t (binary search). */
export function lowerBound(timeS: Float64Array, t: number): number {
  let lo = 0;
  let hi = timeS.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((timeS[mid] as number) < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
