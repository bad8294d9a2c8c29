/**
 * First-order (RC) step-response facts, physics.md §4.1 (fractions reached 0.63212 at τ, 0.95021 at
 * 3τ, 0.99326 at 5τ; times to 95 % and 99 %: 2.9957τ and 4.6052τ), checked on the fitter's own
 * settling-time and evaluation functions and on a fit of noise-free data.
 */
import { describe, expect, it } from 'vitest';
import { evaluateTransient, fitTransient } from '../../../src/core/fit';
import { settlingTime } from '../../../src/core/fit/diagnostics';
import { synthesize } from './synthetic';

describe('first-order step response', () => {
  const tau = 2.5;
  const fit = fitTransient(synthesize({ n: 500, windowS: 10 * tau, yInf: 4, terms: [{ amplitude: -3, tauS: tau }], sigma: 0 }, 1), { terms: 1 });

  it('fitTransient recovers τ exactly from noise-free data', () => {
    // Derivation: the data are the model itself, so the fit must return τ to rounding.
    expect(fit.converged).toBe(true);
    expect(fit.terms[0]!.tauS.value / tau).toBeCloseTo(1, 9);
  });

  it('evaluateTransient reaches 63.2 %, 95.0 % and 99.3 % of the change at τ, 3τ and 5τ', () => {
    // physics.md §4.1: 0.63212 at τ, 0.95021 at 3τ, 0.99326 at 5τ.
    const y = evaluateTransient(fit, new Float64Array([0, tau, 3 * tau, 5 * tau]));
    const fraction = (v: number): number => (v - y[0]!) / (fit.yInf.value - y[0]!);
    expect(fraction(y[1]!)).toBeCloseTo(0.63212, 5);
    expect(fraction(y[2]!)).toBeCloseTo(0.95021, 5);
    expect(fraction(y[3]!)).toBeCloseTo(0.99326, 5);
  });

  it('fitTransient reports t63 = τ, t95 = 2.9957τ and t99 = 4.6052τ', () => {
    // physics.md §4.1: time to 95 % = 2.9957τ, to 99 % = 4.6052τ; 63.2 % at τ.
    expect(fit.t63S / tau).toBeCloseTo(1, 6);
    expect(fit.t95S / tau).toBeCloseTo(2.9957, 4);
    expect(fit.t99S / tau).toBeCloseTo(4.6052, 4);
  });

  it('settlingTime of a two-term response is where the model reaches the fraction', () => {
    // Derivation: at the returned time the remaining fraction Σaᵢe^{−t/τᵢ}/Σaᵢ equals 1 − level (monotone response).
    const a = [2, 1];
    const taus = [0.5, 4];
    for (const level of [1 - Math.exp(-1), 0.95, 0.99]) {
      const t = settlingTime(a, taus, 0, level);
      const remaining = (a[0]! * Math.exp(-t / taus[0]!) + a[1]! * Math.exp(-t / taus[1]!)) / 3;
      expect(remaining).toBeCloseTo(1 - level, 10);
    }
    // With a dead time the times shift by t_d (definition of the model).
    expect(settlingTime(a, taus, 1.5, 0.95) - settlingTime(a, taus, 0, 0.95)).toBeCloseTo(1.5, 10);
  });
});
