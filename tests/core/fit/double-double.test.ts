import { describe, expect, it } from 'vitest';
import { add, div, exp, mul, parseDD } from './double-double';

describe('double-double helper (used for the Lanczos1 RSS)', () => {
  it('exp([1, 0]) gives e to about 32 digits', () => {
    // e = 2.71828182845904523536028747135266… (OEIS A001113, from memory) and Math.E = 2.71828182845904509079559829842765…
    // (its exact binary value, from memory): the correction is e − Math.E = 1.445646891729250…e-16.
    const e = exp([1, 0]);
    expect(e[0]).toBe(Math.E);
    expect(e[1]).toBeCloseTo(1.4456468917292502e-16, 28);
  });

  it('parseDD holds 0.1 exactly enough that 10 × 0.1 − 1 vanishes to 1e-32', () => {
    // Derivation: 0.1 is not a double; in double-double 10·0.1 − 1 is below 1e-32.
    const tenth = parseDD('1.000000000000E-01');
    const r = add(mul(tenth, [10, 0]), [-1, 0]);
    expect(Math.abs(r[0] + r[1])).toBeLessThan(1e-32);
    const third = div([1, 0], [3, 0]);
    const back = add(mul(third, [3, 0]), [-1, 0]);
    expect(Math.abs(back[0])).toBeLessThan(1e-31);
  });
});
