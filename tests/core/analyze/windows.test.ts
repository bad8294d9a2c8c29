/** cutWindow: which samples a step's window holds, and block averaging that keeps τ. */
import { describe, expect, it } from 'vitest';
import { cutWindow, lowerBound } from '../../../src/core/analyze/windows';
import type { Step } from '../../../src/core/steps/types';

const step = (onsetS: number, windowEndS: number, origin: Step['origin']): Step => ({
  index: 0,
  onsetS,
  windowEndS,
  origin,
  direction: 'up',
  drive: { channel: null, quantity: 'flow_setpoint', before: 0, after: 1 },
});
const timeS = Float64Array.from({ length: 101 }, (_, i) => i * 0.1);

describe('cutWindow', () => {
  it('cutWindow(drive step) leaves out the onset sample, which straddles the change', () => {
    const w = cutWindow(timeS, timeS, step(2, 5, 'drive'), 10, 0);
    expect(w.samples).toBe(29); // t = 2.1 … 4.9
    expect(w.data.tS[0]).toBeCloseTo(0.1, 12);
    expect(w.data.y[0]).toBeCloseTo(2.1, 12);
  });

  it('cutWindow(response step) keeps the onset sample; the last window reaches the last sample', () => {
    const w = cutWindow(timeS, timeS, step(2, 10, 'response'), 10, 0);
    expect(w.samples).toBe(81); // t = 2.0 … 10.0
    expect(w.data.tS[0]).toBe(0);
    expect(w.data.tS[80]).toBeCloseTo(8, 12);
  });

  it('cutWindow(maxPoints) block-averages so that consecutive points of e^{−t/τ} keep the ratio e^{−Δt/τ}', () => {
    // Derivation: the mean of e^{−t/τ} over a block centred at t_c is e^{−t_c/τ}·sinh(h/2τ)/(h/2τ), so
    // the ratio of two blocks depends only on the distance of their centres.
    const tau = 0.37;
    const t = Float64Array.from({ length: 10_000 }, (_, i) => i * 1e-3);
    const y = t.map((v) => 2 * Math.exp(-v / tau));
    const w = cutWindow(t, y, step(0, 10, 'response'), 10, 1000);
    expect(w.samplesPerPoint).toBe(10);
    expect(w.data.tS.length).toBe(1000);
    for (let p = 1; p < 1000; p++) {
      const ratio = w.data.y[p]! / w.data.y[p - 1]!;
      expect(ratio).toBeCloseTo(Math.exp(-(w.data.tS[p]! - w.data.tS[p - 1]!) / tau), 10);
    }
  });

  it('cutWindow(NaN samples) averages only finite samples', () => {
    const y = Float64Array.from(timeS, (v, i) => (i % 2 === 0 ? Number.NaN : v));
    const w = cutWindow(timeS, y, step(0, 10, 'response'), 10, 50);
    expect(w.samplesPerPoint).toBe(3);
    expect(w.data.y[0]).toBeCloseTo(0.1, 12); // samples 0,1,2: only t = 0.1 is finite
    expect(w.data.tS[0]).toBeCloseTo(0.1, 12);
  });
});

describe('lowerBound', () => {
  it('lowerBound(a, x, strict) finds the first index ≥ x (or > x)', () => {
    const a = Float64Array.from([0, 1, 1, 2]);
    expect(lowerBound(a, 1)).toBe(1);
    expect(lowerBound(a, 1, true)).toBe(3);
    expect(lowerBound(a, 5)).toBe(4);
    expect(lowerBound(a, -1)).toBe(0);
  });
});
