import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/core/stats';
import { applySensor, IDEAL_SENSOR, jitteredTimes } from '../../../src/core/simulate/sensor';

describe('sensor model', () => {
  it('applySensor(noise σ) adds zero-mean Gaussian noise of that σ (sample SD within 3 % for n = 20 000)', () => {
    // For normal data the SD of the sample SD is σ/√(2(n−1)) ≈ 0.5 % here (textbook result), so 3 % is > 5 SE.
    const n = 20_000;
    const truth = new Float64Array(n).fill(1000);
    const t = Float64Array.from({ length: n }, (_, k) => k * 0.01);
    const y = applySensor(truth, t, { ...IDEAL_SENSOR, noiseSigma: 5 }, createRng(3));
    let mean = 0;
    for (const v of y) mean += v / n;
    let ss = 0;
    for (const v of y) ss += (v - mean) ** 2;
    expect(Math.abs(Math.sqrt(ss / (n - 1)) / 5 - 1)).toBeLessThan(0.03);
    expect(Math.abs(mean - 1000)).toBeLessThan((4 * 5) / Math.sqrt(n)); // 4 standard errors of the mean
  });

  it('applySensor(spikes, offset, drift, quantum) behaves as specified', () => {
    const n = 50_000;
    const truth = new Float64Array(n);
    const t = Float64Array.from({ length: n }, (_, k) => k);
    const y = applySensor(truth, t, { ...IDEAL_SENSOR, spikeProbability: 0.01, spikeSizeSI: 100, offsetSI: 2, driftPerS: 1e-4, quantumSI: 0.5 }, createRng(9));
    const spikes = Array.from(y).filter((v, k) => Math.abs(v - (2 + 1e-4 * k)) > 40).length;
    // Binomial(50 000, 0.01): mean 500, SD 22 (derived here); allow ±5 SD.
    expect(Math.abs(spikes - 500)).toBeLessThan(110);
    for (let k = 0; k < n; k += 997) expect((y[k]! / 0.5) % 1).toBe(0);
    expect(y[n - 1]).toBeCloseTo(2 + 1e-4 * (n - 1), 0);
  });

  it('jitteredTimes keeps time increasing and within ±0.45 periods of the nominal grid', () => {
    const t = jitteredTimes(100, 60, 0.02, createRng(1)); // σ twice the period: clipping must hold it
    // 60 s at 100 Hz → 6001 samples including t = 0; the ±0.45-period clip is a rule of our own.
    expect(t.length).toBe(6001);
    for (let k = 1; k < t.length; k++) {
      expect(t[k]!).toBeGreaterThan(t[k - 1]!);
      expect(Math.abs(t[k]! - k / 100)).toBeLessThanOrEqual(0.0045 + 1e-9);
    }
  });
});
