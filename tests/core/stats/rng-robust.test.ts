import { describe, expect, it } from 'vitest';
import { createRng, mad, madSigma, median, noiseSigmaFromDifferences } from '../../../src/core/stats';

describe('createRng', () => {
  it('createRng gives the same sequence for the same seed and a different one for another seed', () => {
    const a = createRng(42);
    const b = createRng(42);
    const c = createRng(43);
    // Determinism contract of our own (DEVELOPERS.md: seeded RNG); no reference values involved.
    const sa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(sa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(sa);
  });

  it('createRng uniform and normal have the right moments', () => {
    // Derivation: U(0,1) has mean 1/2 and variance 1/12; N(0,1) has mean 0, variance 1, P(|z|<1.96) = 0.95.
    // Tolerances are ~5 standard errors for n = 200 000.
    const rng = createRng(7);
    const n = 200_000;
    let su = 0;
    let su2 = 0;
    let sz = 0;
    let sz2 = 0;
    let inside = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.uniform();
      expect(u >= 0 && u < 1).toBe(true);
      su += u;
      su2 += u * u;
      const z = rng.normal();
      sz += z;
      sz2 += z * z;
      if (Math.abs(z) < 1.959963984540054) inside++;
    }
    expect(Math.abs(su / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - (su / n) ** 2 - 1 / 12)).toBeLessThan(0.002);
    expect(Math.abs(sz / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sz2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    expect(Math.abs(inside / n - 0.95)).toBeLessThan(5 * Math.sqrt((0.95 * 0.05) / n));
  });
});

describe('median / mad / noiseSigmaFromDifferences', () => {
  it('median handles odd, even, NaN and empty input without modifying it', () => {
    const x = new Float64Array([5, 1, NaN, 3, 2]);
    expect(median(x)).toBe(2.5); // finite values 1,2,3,5 → (2+3)/2 (definition)
    expect(Number.isNaN(x[2]!)).toBe(true);
    expect(x[0]).toBe(5);
    expect(median([3, 1, 2])).toBe(2);
    expect(Number.isNaN(median([]))).toBe(true);
  });

  it('mad is the median absolute deviation and ignores outliers', () => {
    // Definition: MAD([1,1,2,2,4,6,9]) = median(|x − 2|) = median([1,1,0,0,2,4,7]) = 1 (textbook example, common practice).
    expect(mad([1, 1, 2, 2, 4, 6, 9])).toBe(1);
    expect(mad([1, 1, 2, 2, 4, 6, 9000])).toBe(1);
  });

  it('madSigma and noiseSigmaFromDifferences estimate the σ of Gaussian noise', () => {
    // Derivation: 1.4826·MAD is consistent for σ; differences of white noise have σ√2. n = 100 000 → ~1 % error.
    const rng = createRng(3);
    const n = 100_000;
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) y[i] = 0.25 * rng.normal() + 10 * (1 - Math.exp(-i / 2000)) + (i % 9973 === 0 ? 50 : 0);
    expect(noiseSigmaFromDifferences(y)).toBeCloseTo(0.25, 2);
    const z = new Float64Array(n);
    for (let i = 0; i < n; i++) z[i] = 0.25 * rng.normal();
    expect(madSigma(z)).toBeCloseTo(0.25, 2);
  });
});
