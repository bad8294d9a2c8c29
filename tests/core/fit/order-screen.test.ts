/**
 * The order screen (src/core/fit/order-screen.ts) only saves work: on seeded synthetic windows — single
 * exponentials, and bi-exponentials whose second term ranges from invisible to clear — the automatic
 * order with the screen is the one chosen by fitting every order (orderScreen: false), the reference.
 * The generating model (./synthetic.ts) is the derivation; the BIC rule is Schwarz (1978).
 */
import { describe, expect, it } from 'vitest';
import { fitTransient } from '../../../src/core/fit';
import { screenSecondTerm } from '../../../src/core/fit/order-screen';
import { createRng } from '../../../src/core/stats';
import { synthesize } from './synthetic';

describe('fitTransient order screen', () => {
  it('fitTransient(auto) chooses the same order with and without the screen on 1- and 2-term windows', () => {
    const rng = createRng(4242);
    let screened = 0;
    let twoTerm = 0;
    for (let k = 0; k < 48; k++) {
      const kind = k % 4;
      const tau1 = 0.3 + 1.5 * rng.uniform();
      // Second term: none, weak (near the detection limit), moderate, clear; τ ratio 3–10.
      const a2 = [0, 0.004, 0.015, 0.2][kind]!;
      const terms = [{ amplitude: -1, tauS: tau1 }];
      if (a2 > 0) terms.push({ amplitude: -a2, tauS: tau1 * (3 + 7 * rng.uniform()) });
      const data = synthesize({ n: 1500, windowS: 12 * tau1 * (a2 > 0 ? 3 : 1), yInf: 1, terms, deadTimeS: 0, sigma: 0.005 }, 1000 + k);
      const withScreen = fitTransient(data);
      const reference = fitTransient(data, { orderScreen: false });
      expect(withScreen.model.terms).toBe(reference.model.terms);
      expect(withScreen.flags.map((f) => f.code).sort()).toEqual(reference.flags.map((f) => f.code).sort());
      if (withScreen.orderSelection?.screenedOut) screened++;
      if (reference.model.terms === 2) twoTerm++;
    }
    // The screen must actually act on the single exponentials, and the set must hold real 2-term choices.
    expect(screened).toBeGreaterThan(8);
    expect(twoTerm).toBeGreaterThan(8);
  });

  it('screenSecondTerm(residuals holding a second exponential) returns its exact linearised gain', () => {
    // Residuals = c·g⊥ for g = e^{−t/τ₂} made orthogonal to the 1-term columns: the gain is c²‖g⊥‖² (derivation).
    const n = 400;
    const t = Float64Array.from({ length: n }, (_, i) => i / (n - 1));
    const tau1 = 0.1;
    const tau2 = Math.exp(Math.log(0.001) + 0.2 * 30); // a grid value of the screen's ln τ₂ grid from 0.001
    const cols = [t.map(() => 1), t.map((v) => Math.exp(-v / tau1)), t.map((v) => (-1 * Math.exp(-v / tau1) * v) / tau1)];
    const g = t.map((v) => Math.exp(-v / tau2));
    // Gram–Schmidt of g against the columns (least squares on 3 columns, done directly).
    const q: Float64Array[] = [];
    for (const c of cols) {
      const v = Float64Array.from(c);
      for (const b of q) {
        const d = v.reduce((s, x, i) => s + x * b[i]!, 0);
        for (let i = 0; i < n; i++) v[i] = v[i]! - d * b[i]!;
      }
      const norm = Math.sqrt(v.reduce((s, x) => s + x * x, 0));
      q.push(v.map((x) => x / norm));
    }
    for (const b of q) {
      const d = g.reduce((s, x, i) => s + x * b[i]!, 0);
      for (let i = 0; i < n; i++) g[i] = g[i]! - d * b[i]!;
    }
    const r = g.map((x) => 0.01 * x);
    const expected = r.reduce((s, x) => s + x * x, 0);
    const x = Float64Array.from([Math.log(tau1), 0, -1]);
    const s = screenSecondTerm({ t, y: new Float64Array(n), weight: 1 }, { terms: 1, deadTime: false, drift: false }, x, r, 1, 0.001, Math.exp(Math.log(0.001) + 0.2 * 40));
    expect(s.maxGain).toBeCloseTo(expected, 12);
    // Required BIC gain for 2 more parameters: SSR₁·(1 − n^(−2/n)) (Schwarz 1978).
    expect(s.requiredGain).toBeCloseTo(1 - n ** (-2 / n), 12);
  });
});
