// Min/max decimation for drawing (src/ui/worker/decimate.ts): extremes survive (common practice for
// plotting long logs, no source).
import { describe, expect, it } from 'vitest';
import { decimateMinMax, lowerBound } from '../../src/ui/worker/decimate';

describe('decimateMinMax', () => {
  it('decimateMinMax keeps every sample when there are few', () => {
    const t = Float64Array.from({ length: 10 }, (_, i) => i);
    expect(Array.from(decimateMinMax(t, [t], 0, 10, 100).idx)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it('decimateMinMax keeps an isolated spike and the global minimum of a long series', () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const y = new Float64Array(n);
    y[31_337] = 50;
    y[77_777] = -20;
    const { idx } = decimateMinMax(t, [y], 0, n, 500);
    expect(idx.length).toBeLessThanOrEqual(1500);
    expect(Array.from(idx)).toContain(31_337);
    expect(Array.from(idx)).toContain(77_777);
    for (let i = 1; i < idx.length; i++) expect(idx[i]).toBeGreaterThan(idx[i - 1] as number);
  });

  it('lowerBound finds the first time at or after t', () => {
    const t = Float64Array.from([0, 0.5, 1, 1.5]);
    expect(lowerBound(t, 1)).toBe(2);
    expect(lowerBound(t, 1.2)).toBe(3);
    expect(lowerBound(t, 9)).toBe(4);
  });
});
