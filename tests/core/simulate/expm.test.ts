import { describe, expect, it } from 'vitest';
import { expm } from '../../../src/core/simulate/expm';
import type { Mat } from '../../../src/core/simulate/matrix';

const mat = (rows: number[][]): Mat => ({ n: rows.length, a: Float64Array.from(rows.flat()) });

describe('expm', () => {
  it('expm(rotation generator) gives cos/sin (exp of [[0, t], [−t, 0]], textbook identity)', () => {
    const t = 7.3;
    const e = expm(mat([[0, t], [-t, 0]]));
    expect(e.a[0]).toBeCloseTo(Math.cos(t), 13);
    expect(e.a[1]).toBeCloseTo(Math.sin(t), 13);
    expect(e.a[2]).toBeCloseTo(-Math.sin(t), 13);
  });

  it('expm(stiff, badly scaled 2×2) matches the eigen-decomposition written out by hand', () => {
    // Upper-triangular [[a, b], [0, d]]: exp = [[e^a, b·(e^a − e^d)/(a − d)], [0, e^d]] (textbook identity).
    const a = -0.5;
    const d = -400;
    const b = 3e13; // a Pa-per-(m³/s) coupling, as in the network matrices
    const e = expm(mat([[a, b], [0, d]]));
    // ‖A‖ = 400 needs 10 squarings, each of which may double the rounding error: ~1e-13 is expected.
    expect(e.a[0]).toBeCloseTo(Math.exp(a), 12);
    expect((e.a[1] as number) / ((b * (Math.exp(a) - Math.exp(d))) / (a - d))).toBeCloseTo(1, 12);
    expect(e.a[2]).toBe(0);
    expect(e.a[3]).toBeCloseTo(Math.exp(d), 14); // e^−400 ≈ 1.9e−174
  });

  it('expm(zero matrix) is the identity', () => {
    // Definition: exp(0) = I (power series with only the identity term).
    const e = expm(mat([[0, 0, 0], [0, 0, 0], [0, 0, 0]]));
    expect(Array.from(e.a)).toEqual([1, 0, 0, 0, 1, 0, 0, 0, 1]);
  });
});
