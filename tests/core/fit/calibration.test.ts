/**
 * Calibration of the reported uncertainties (issue 3: the true τ must lie inside the reported
 * 95 % interval in 90–98 % of ≥ 200 seeded noisy transients). The generating model is the
 * derivation; with 400 trials the binomial SD of the coverage is 1.1 % around 95 %, so the band
 * 90–98 % is about −4.5σ … +2.7σ. The standardised errors (τ̂ − τ)/SE should have SD ≈ 1.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { fitTransient } from '../../../src/core/fit';
import { createRng } from '../../../src/core/stats';
import { inside, synthesize } from './synthetic';

const report: string[] = [];
afterAll(() => console.log(report.join('\n')));

describe('fitTransient uncertainty calibration', () => {
  it('fitTransient 95 % intervals of τ cover the true τ in 90–98 % of 400 single-exponential transients', () => {
    const rng = createRng(20261201);
    let covered = 0;
    let converged = 0;
    const trials = 400;
    const z: number[] = [];
    for (let k = 0; k < trials; k++) {
      const tau = 0.5 * Math.exp(rng.uniform() * Math.log(20)); // 0.5–10 s, log-uniform
      const windowS = tau * (5 + 5 * rng.uniform()); // 5–10 τ
      const n = Math.floor(100 + rng.uniform() * 1900); // 100–2000 samples
      const step = (rng.uniform() < 0.5 ? -1 : 1) * (1 + 9 * rng.uniform());
      const sigma = Math.abs(step) * (0.002 + 0.048 * rng.uniform()); // 0.2–5 % of the step
      const data = synthesize({ n, windowS, yInf: 10 * rng.normal(), terms: [{ amplitude: -step, tauS: tau }], sigma }, rng);
      const fit = fitTransient(data, { terms: 1 });
      if (fit.converged) converged++;
      if (inside(tau, fit.terms[0]!.tauS.ci95)) covered++;
      z.push((fit.terms[0]!.tauS.value - tau) / fit.terms[0]!.tauS.standardError);
    }
    const zMean = z.reduce((a, b) => a + b, 0) / z.length;
    const zSd = Math.sqrt(z.reduce((a, b) => a + (b - zMean) ** 2, 0) / (z.length - 1));
    report.push(
      `calibration, 1 term: τ inside its 95 % CI in ${covered}/${trials} = ${((100 * covered) / trials).toFixed(1)} % (${converged} converged); (τ̂ − τ)/SE mean ${zMean.toFixed(3)}, SD ${zSd.toFixed(3)}`,
    );
    // SD of z for an honest SE is 1; 400 trials estimate it to ±0.035 (1σ).
    expect(zSd).toBeGreaterThan(0.9);
    expect(zSd).toBeLessThan(1.12);
    expect(converged).toBe(trials);
    expect(covered / trials).toBeGreaterThanOrEqual(0.9);
    expect(covered / trials).toBeLessThanOrEqual(0.98);
  });

  it('fitTransient 95 % intervals of both τ cover the truth in 88–99 % of 60 bi-exponential transients', () => {
    const rng = createRng(77);
    let in1 = 0;
    let in2 = 0;
    const trials = 60;
    for (let k = 0; k < trials; k++) {
      const tau1 = 0.2 + 0.3 * rng.uniform();
      const tau2 = tau1 * (6 + 6 * rng.uniform()); // ratio 6–12
      const windowS = tau2 * (6 + 4 * rng.uniform());
      const n = Math.floor(1000 + rng.uniform() * 2000);
      const data = synthesize(
        { n, windowS, yInf: 3, terms: [{ amplitude: -(1 + rng.uniform()), tauS: tau1 }, { amplitude: -(0.5 + rng.uniform()), tauS: tau2 }], sigma: 0.003 + 0.007 * rng.uniform() },
        rng,
      );
      const fit = fitTransient(data, { terms: 2 });
      if (inside(tau1, fit.terms[0]!.tauS.ci95)) in1++;
      if (inside(tau2, fit.terms[1]!.tauS.ci95)) in2++;
    }
    report.push(`calibration, 2 terms: τ1 covered ${in1}/${trials}, τ2 covered ${in2}/${trials}`);
    // Wider band: 60 trials give a binomial SD of 2.8 % around 95 %.
    for (const c of [in1, in2]) {
      expect(c / trials).toBeGreaterThanOrEqual(0.88);
      expect(c / trials).toBeLessThanOrEqual(0.99);
    }
  });
});
