/** Pre-filters of step detection: the running median against a plain sort (definition of the median). */
import { describe, expect, it } from 'vitest';
import { fillGaps, runningMedian } from '../../../src/core/steps/prefilter';
import { seededUniform } from './synthetic-logs';

/** Reference: the median by sorting the (shrunk) centred window — the definition. */
function referenceMedian(v: Float64Array, width: number): Float64Array {
  const half = (width - 1) / 2;
  return v.map((_, i) => {
    const w = Array.from(v.subarray(Math.max(0, i - half), Math.min(v.length, i + half + 1))).sort((a, b) => a - b);
    const m = w.length;
    return m % 2 ? w[(m - 1) / 2]! : (w[m / 2 - 1]! + w[m / 2]!) / 2;
  });
}

describe('runningMedian', () => {
  it('runningMedian(width 5) equals the sorted-window median on every permutation of 5 values, with ties', () => {
    const perms = (xs: number[]): number[][] => (xs.length <= 1 ? [xs] : xs.flatMap((x, i) => perms([...xs.slice(0, i), ...xs.slice(i + 1)]).map((p) => [x, ...p])));
    for (const set of [[1, 2, 3, 4, 5], [1, 1, 2, 2, 3], [7, 7, 7, 1, 9], [0, -1, -1, 5, 5]]) {
      for (const p of perms(set)) {
        const v = Float64Array.from(p);
        expect(Array.from(runningMedian(v, 5))).toEqual(Array.from(referenceMedian(v, 5)));
      }
    }
  });

  it('runningMedian(random data, widths 3, 5, 7) equals the sorted-window median', () => {
    const u = seededUniform(5);
    const v = Float64Array.from({ length: 500 }, () => Math.round(u() * 20));
    for (const w of [3, 5, 7]) expect(Array.from(runningMedian(v, w))).toEqual(Array.from(referenceMedian(v, w)));
  });

  it('runningMedian(width 5) removes a two-sample spike and keeps a step edge in place', () => {
    const v = Float64Array.from([0, 0, 0, 0, 9, 9, 0, 0, 0, 0, 5, 5, 5, 5, 5]);
    expect(Array.from(runningMedian(v, 5))).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 5, 5, 5, 5, 5]);
  });
});

describe('fillGaps', () => {
  it('fillGaps(values with NaN) carries the last finite value forward, the first one backward', () => {
    expect(Array.from(fillGaps([Number.NaN, 2, Number.NaN, 4, Number.NaN])!)).toEqual([2, 2, 2, 4, 4]);
    expect(fillGaps([Number.NaN, Number.NaN])).toBeNull();
  });
});
