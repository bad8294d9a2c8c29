/**
 * Recovery tests of fitTransient on seeded synthetic data. The generating model (tests/core/fit/
 * synthetic.ts) is the derivation: a correct fitter must return the generating parameters within
 * its stated uncertainty. Thresholds for flags are the documented constants of src/core/fit.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { evaluateTransient, fitSharedTaus, fitTransient } from '../../../src/core/fit';
import { createRng } from '../../../src/core/stats';
import { inside, synthesize } from './synthetic';

/** Secondary parameters: |estimate − truth| < 3 SE (99.7 % for an honest SE); τ uses the 95 % interval. */
const within3se = (truth: number, e: { value: number; standardError: number }): boolean => Math.abs(e.value - truth) < 3 * e.standardError;
const codes = (fit: { flags: { code: string }[] }): string[] => fit.flags.map((f) => f.code);

describe('fitTransient recovery', () => {
  it('fitTransient recovers a single exponential with τ inside its 95 % interval', () => {
    const data = synthesize({ n: 1000, windowS: 10, yInf: 5, terms: [{ amplitude: -3, tauS: 1.5 }], sigma: 0.01 }, 11);
    const fit = fitTransient(data, { terms: 1 });
    expect(fit.converged).toBe(true);
    expect(inside(1.5, fit.terms[0]!.tauS.ci95)).toBe(true);
    expect(within3se(5, fit.yInf)).toBe(true);
    expect(within3se(-3, fit.terms[0]!.amplitude)).toBe(true);
    expect(fit.noiseSigma).toBeCloseTo(0.01, 2);
    expect(fit.flags).toEqual([]);
    expect(fit.parameterNames).toEqual(['yInf', 'a1', 'tau1_s']);
    expect(fit.correlation[0]![0]).toBeCloseTo(1, 12);
  });

  it('fitTransient recovers a bi-exponential with τ ratio 10, both τ inside their intervals', () => {
    const data = synthesize({ n: 3000, windowS: 25, yInf: 2, terms: [{ amplitude: 1.5, tauS: 0.4 }, { amplitude: 1, tauS: 4 }], sigma: 0.005 }, 12);
    const fit = fitTransient(data, { terms: 2 });
    expect(fit.converged).toBe(true);
    expect(fit.terms[0]!.tauS.value).toBeLessThan(fit.terms[1]!.tauS.value); // sorted ascending
    expect(inside(0.4, fit.terms[0]!.tauS.ci95)).toBe(true);
    expect(inside(4, fit.terms[1]!.tauS.ci95)).toBe(true);
    expect(within3se(1.5, fit.terms[0]!.amplitude)).toBe(true);
    expect(within3se(1, fit.terms[1]!.amplitude)).toBe(true);
  });

  it('fitTransient recovers a bi-exponential with τ ratio 5 and amplitudes of opposite sign (overshoot)', () => {
    const data = synthesize({ n: 4000, windowS: 15, yInf: 1, terms: [{ amplitude: 2, tauS: 0.3 }, { amplitude: -1.2, tauS: 1.5 }], sigma: 0.003 }, 13);
    const fit = fitTransient(data, { terms: 2 });
    expect(fit.converged).toBe(true);
    expect(inside(0.3, fit.terms[0]!.tauS.ci95)).toBe(true);
    expect(inside(1.5, fit.terms[1]!.tauS.ci95)).toBe(true);
  });

  it('fitTransient recovers three exponentials (τ 0.1, 1, 6 s) and auto order finds three', () => {
    const data = synthesize(
      { n: 8000, windowS: 40, yInf: 5, terms: [{ amplitude: -1.5, tauS: 0.1 }, { amplitude: -1, tauS: 1 }, { amplitude: -0.8, tauS: 6 }], sigma: 0.002 },
      19,
    );
    const fit = fitTransient(data, { terms: 3 });
    expect(fit.converged).toBe(true);
    // Three τ at once: check each within 3 SE (a 95 % check on three would fail 14 % of seeds by chance).
    [0.1, 1, 6].forEach((tau, k) => expect(within3se(tau, fit.terms[k]!.tauS)).toBe(true));
    const auto = fitTransient(data);
    expect(auto.model.terms).toBe(3);
    expect(auto.orderSelection!.candidates.map((c) => c.terms)).toEqual([1, 2, 3]);
  });

  it('fitTransient with deadTime recovers the dead time and holds the pre-step level before it', () => {
    const data = synthesize({ n: 1500, windowS: 12, yInf: 3, terms: [{ amplitude: -2, tauS: 1.2 }], deadTimeS: 0.8, sigma: 0.01 }, 14);
    const fit = fitTransient(data, { terms: 1, deadTime: true });
    expect(fit.converged).toBe(true);
    expect(fit.deadTimeS).not.toBeNull();
    expect(inside(0.8, fit.deadTimeS!.ci95)).toBe(true);
    expect(Math.abs(fit.deadTimeS!.value - 0.8)).toBeLessThan(0.05);
    expect(inside(1.2, fit.terms[0]!.tauS.ci95)).toBe(true);
    expect(fit.parameterNames).toContain('t_d_s');
    // Model definition: constant y∞ + a before t_d; t63 measured from the onset includes t_d.
    const y = evaluateTransient(fit, new Float64Array([0, 0.5 * fit.deadTimeS!.value]));
    expect(y[0]).toBeCloseTo(fit.yInf.value + fit.terms[0]!.amplitude.value, 12);
    expect(y[1]).toBeCloseTo(y[0]!, 12);
    expect(fit.t63S).toBeCloseTo(fit.deadTimeS!.value + fit.terms[0]!.tauS.value, 9);
  });

  it('fitTransient with deadTime finds a zero dead time when there is none', () => {
    const data = synthesize({ n: 1000, windowS: 10, yInf: 0, terms: [{ amplitude: 1, tauS: 1 }], sigma: 0.01 }, 15);
    const fit = fitTransient(data, { terms: 1, deadTime: true });
    expect(fit.converged).toBe(true);
    expect(fit.deadTimeS!.value).toBeLessThan(0.03);
    expect(inside(1, fit.terms[0]!.tauS.ci95)).toBe(true);
  });

  it('fitTransient with drift recovers the drift rate and τ', () => {
    const data = synthesize({ n: 2000, windowS: 10, yInf: 5, terms: [{ amplitude: -3, tauS: 1.5 }], driftPerS: 0.02, sigma: 0.01 }, 16);
    const fit = fitTransient(data, { terms: 1, drift: true });
    expect(fit.converged).toBe(true);
    expect(inside(0.02, fit.driftPerS!.ci95)).toBe(true);
    expect(inside(1.5, fit.terms[0]!.tauS.ci95)).toBe(true);
    // Without the drift term the same data leave structure in the residuals or bias τ beyond its interval.
    const plain = fitTransient(data, { terms: 1 });
    expect(codes(plain).includes('residual-structure') || !inside(1.5, plain.terms[0]!.tauS.ci95)).toBe(true);
  });

  it('fitTransient with a robust loss ignores spikes that bias the plain fit', () => {
    const data = synthesize({ n: 1000, windowS: 10, yInf: 5, terms: [{ amplitude: -3, tauS: 1.5 }], sigma: 0.01 }, 17);
    const rng = createRng(170);
    for (let i = 3; i < data.y.length; i += 37) data.y[i] = data.y[i]! + (rng.uniform() < 0.5 ? -1 : 1) * (0.5 + rng.uniform());
    const plain = fitTransient(data, { terms: 1 });
    for (const robust of ['huber', 'tukey'] as const) {
      const fit = fitTransient(data, { terms: 1, robust });
      expect(fit.converged).toBe(true);
      expect(fit.model.robust).toBe(robust);
      expect(inside(1.5, fit.terms[0]!.tauS.ci95)).toBe(true);
      expect(Math.abs(fit.terms[0]!.tauS.value - 1.5)).toBeLessThan(Math.abs(plain.terms[0]!.tauS.value - 1.5));
    }
    // The plain fit's interval is inflated by the spikes (honest, but much wider).
    const tukey = fitTransient(data, { terms: 1, robust: 'tukey' });
    expect(plain.terms[0]!.tauS.standardError).toBeGreaterThan(3 * tukey.terms[0]!.tauS.standardError);
  });

  it('fitTransient ignores NaN samples and reports the points used', () => {
    const data = synthesize({ n: 500, windowS: 5, yInf: 1, terms: [{ amplitude: 1, tauS: 0.5 }], sigma: 0.01 }, 18);
    data.y[10] = NaN;
    data.y[200] = NaN;
    const fit = fitTransient(data, { terms: 1 });
    expect(fit.n).toBe(498);
    expect(inside(0.5, fit.terms[0]!.tauS.ci95)).toBe(true);
  });
});

describe('fitTransient order selection', () => {
  it("fitTransient(terms: 'auto') picks 1 term for single-exponential data", () => {
    let ones = 0;
    for (let seed = 0; seed < 10; seed++) {
      const fit = fitTransient(synthesize({ n: 800, windowS: 8, yInf: 1, terms: [{ amplitude: -1, tauS: 1 }], sigma: 0.02 }, 100 + seed));
      if (fit.model.terms === 1) ones++;
      expect(fit.orderSelection?.candidates[0]?.terms).toBe(1);
    }
    // BIC is consistent; with a ln(800) ≈ 6.7 penalty per extra parameter pair, over-fitting is rare (Schwarz 1978).
    expect(ones).toBeGreaterThanOrEqual(9);
  });

  it("fitTransient(terms: 'auto') picks 2 terms for clear bi-exponential data and shows the F-test", () => {
    const fit = fitTransient(synthesize({ n: 3000, windowS: 25, yInf: 2, terms: [{ amplitude: 1.5, tauS: 0.4 }, { amplitude: 1, tauS: 4 }], sigma: 0.005 }, 21));
    expect(fit.model.terms).toBe(2);
    const sel = fit.orderSelection!;
    expect(sel.chosenTerms).toBe(2);
    expect(sel.candidates[1]!.fTestP).toBeLessThan(1e-6);
    expect(sel.candidates[1]!.bic).toBeLessThan(sel.candidates[0]!.bic);
    // The one-term fit of these data leaves structure in the residuals.
    expect(codes(fitTransient(synthesize({ n: 3000, windowS: 25, yInf: 2, terms: [{ amplitude: 1.5, tauS: 0.4 }, { amplitude: 1, tauS: 4 }], sigma: 0.005 }, 21), { terms: 1 }))).toContain('residual-structure');
  });

  it('fitTransient rejects nearly equal time constants as degenerate', () => {
    // τ ratio 1.2: a sum of two such exponentials is indistinguishable from one at this noise level.
    const data = synthesize({ n: 1000, windowS: 10, yInf: 0, terms: [{ amplitude: 1, tauS: 1 }, { amplitude: 1, tauS: 1.2 }], sigma: 0.01 }, 22);
    const auto = fitTransient(data);
    expect(auto.model.terms).toBe(1);
    expect(auto.orderSelection!.candidates.find((c) => c.terms === 2)?.acceptable).toBe(false);
    const forced = fitTransient(data, { terms: 2 });
    expect(codes(forced)).toContain('degenerate-taus');
  });
});

describe('fitTransient flags', () => {
  it('fitTransient flags not-settled when the window is shorter than 5 τ', () => {
    const fit = fitTransient(synthesize({ n: 600, windowS: 2, yInf: 1, terms: [{ amplitude: -1, tauS: 1 }], sigma: 0.005 }, 31), { terms: 1 });
    expect(fit.settled).toBe(false);
    expect(fit.windowInTaus).toBeCloseTo(2, 0);
    expect(codes(fit)).toContain('not-settled');
    expect(inside(1, fit.terms[0]!.tauS.ci95)).toBe(true);
  });

  it('fitTransient flags tau-beyond-window and inconclusive for a barely started response', () => {
    const fit = fitTransient(synthesize({ n: 300, windowS: 0.5, yInf: 1, terms: [{ amplitude: -1, tauS: 5 }], sigma: 0.01 }, 32), { terms: 1 });
    expect(codes(fit)).toContain('tau-beyond-window');
    expect(codes(fit)).toContain('inconclusive');
  });

  it('fitTransient flags tau-below-resolution for a τ of about one sample interval', () => {
    // 1000 samples over 10 s: Δt = 0.01 s; τ = 0.015 s < 3Δt.
    const fit = fitTransient(synthesize({ n: 1001, windowS: 10, yInf: 1, terms: [{ amplitude: -1, tauS: 0.015 }], sigma: 0.001 }, 33), { terms: 1 });
    expect(codes(fit)).toContain('tau-below-resolution');
  });

  it('fitTransient flags too-few-points and still answers', () => {
    const few = fitTransient(synthesize({ n: 8, windowS: 5, yInf: 1, terms: [{ amplitude: -1, tauS: 1 }], sigma: 0.01 }, 34), { terms: 1 });
    expect(codes(few)).toContain('too-few-points');
    expect(few.dof).toBe(5);
    const none = fitTransient(synthesize({ n: 3, windowS: 5, yInf: 1, terms: [{ amplitude: -1, tauS: 1 }], sigma: 0.01 }, 35), { terms: 1 });
    expect(none.converged).toBe(false);
    expect(codes(none)).toEqual(['too-few-points', 'not-converged', 'inconclusive']);
    expect(Number.isNaN(none.terms[0]!.tauS.value)).toBe(true);
  });

  it('fitTransient flags inconclusive when noise swamps the step', () => {
    const fit = fitTransient(synthesize({ n: 200, windowS: 5, yInf: 0, terms: [{ amplitude: 0.05, tauS: 1 }], sigma: 0.2 }, 36), { terms: 1 });
    expect(codes(fit)).toContain('inconclusive');
  });

  it('fitTransient throws an InputError for absolute (epoch) time stamps', () => {
    // GUIDE §3: fit in time relative to the step onset; epoch seconds would lose the digits.
    const tS = Float64Array.from({ length: 100 }, (_, i) => 1.7e9 + i * 0.01);
    expect(() => fitTransient({ tS, y: new Float64Array(100) })).toThrow(/relative to the step onset/);
  });

  it('fitTransient throws a located InputError for time stamps out of order', () => {
    const data = { tS: new Float64Array([0, 1, 1, 2]), y: new Float64Array([0, 1, 2, 3]) };
    expect(() => fitTransient(data)).toThrow(InputError);
    expect(() => fitTransient(data)).toThrow(/time stamps must increase/);
  });
});

describe('fitSharedTaus', () => {
  it('fitSharedTaus fits windows with a common τ and gives a tighter interval than one window', () => {
    const rng = createRng(41);
    const windows = [1, 2.5, -1.5, 4].map((amp, k) =>
      synthesize({ n: 500 + 100 * k, windowS: 6 + k, yInf: 10 * k, terms: [{ amplitude: amp, tauS: 0.8 }], sigma: 0.02 * (1 + k) }, rng),
    );
    const shared = fitSharedTaus(windows, { terms: 1 });
    expect(shared.converged).toBe(true);
    expect(shared.windows).toHaveLength(4);
    expect(inside(0.8, shared.tausS[0]!.ci95)).toBe(true);
    shared.windows.forEach((w, k) => {
      expect(within3se([1, 2.5, -1.5, 4][k]!, w.amplitudes[0]!)).toBe(true);
      expect(within3se(10 * k, w.yInf)).toBe(true);
    });
    const single = fitTransient(windows[0]!, { terms: 1 });
    expect(shared.tausS[0]!.standardError).toBeLessThan(single.terms[0]!.tauS.standardError);
  });

  it("fitSharedTaus(terms: 'auto') finds two common time constants", () => {
    const rng = createRng(42);
    const windows = [1, 2].map((scale) =>
      synthesize({ n: 2000, windowS: 20, yInf: 0, terms: [{ amplitude: scale, tauS: 0.3 }, { amplitude: 0.7 * scale, tauS: 3 }], sigma: 0.005 }, rng),
    );
    const shared = fitSharedTaus(windows);
    expect(shared.model.terms).toBe(2);
    expect(inside(0.3, shared.tausS[0]!.ci95)).toBe(true);
    expect(inside(3, shared.tausS[1]!.ci95)).toBe(true);
  });
});
