/**
 * NIST StRD nonlinear regression (the exponential problems), both NIST starting points.
 * Certified values, standard deviations, RSS and residual SD are parsed from the files in
 * ../shared/reference/nist-strd/ (NIST ITL Statistical Reference Datasets, public domain).
 * Accuracy is the StRD log relative error (LRE, agreeing significant digits, capped at 11).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { covarianceFromJacobian } from '../../../src/core/fit/covariance';
import { solveLeastSquares } from '../../../src/core/fit/least-squares';
import { ScaledSvd } from '../../../src/core/fit/linalg';
import { solveSeparable } from '../../../src/core/fit/separable';
import { add, exp, mul, neg, parseDD, type DD } from './double-double';
import { offsetTwoExponentials, saturatingExponential, threeExponentials, type NistModel } from './nist-models';
import { lre, NIST_AVAILABLE, NIST_DIR, readNist } from './nist-strd';

if (!NIST_AVAILABLE) console.warn(`NIST StRD tests skipped: reference files not found in ${NIST_DIR}`);

const problems: [string, NistModel][] = [
  ['Misra1a', saturatingExponential],
  ['BoxBOD', saturatingExponential],
  ['MGH17', offsetTwoExponentials],
  ['Lanczos1', threeExponentials],
  ['Lanczos2', threeExponentials],
  ['Lanczos3', threeExponentials],
];

const summary: string[] = [];
afterAll(() => {
  if (summary.length) console.log(`NIST StRD digits reached (min LRE over parameters):\n${summary.join('\n')}`);
});

interface Outcome {
  converged: boolean;
  paramsLre: number;
  sdLre: number;
  rssLre: number;
  residualSdLre: number;
  stopReason: string;
}

function evaluate(name: string, b: Float64Array, sd: Float64Array, ssr: number, converged: boolean, stopReason: string): Outcome {
  const prob = readNist(name);
  return {
    converged,
    stopReason,
    paramsLre: Math.min(...prob.parameters.map((p, i) => lre(b[i]!, p.certified))),
    sdLre: Math.min(...prob.parameters.map((p, i) => lre(sd[i]!, p.certifiedSd))),
    rssLre: lre(ssr, prob.rss),
    residualSdLre: lre(Math.sqrt(ssr / prob.dof), prob.residualSd),
  };
}

function runSeparable(name: string, model: NistModel, start: 1 | 2): Outcome {
  const prob = readNist(name);
  const sep = model.separable(prob);
  const alpha0 = model.order.slice(0, sep.nNonlinear).map((k) => (start === 1 ? prob.parameters[k]!.start1 : prob.parameters[k]!.start2));
  const res = solveSeparable(sep, alpha0);
  const cov = covarianceFromJacobian(res.jacobian, prob.n, prob.parameters.length, res.ssr);
  const b = new Float64Array(prob.parameters.length);
  const sd = new Float64Array(prob.parameters.length);
  model.order.forEach((k, j) => {
    b[k] = res.x[j]!;
    sd[k] = cov.standardErrors[j]!;
  });
  return evaluate(name, b, sd, res.ssr, res.converged, res.stopReason);
}

function runDirect(name: string, model: NistModel, start: 1 | 2): Outcome {
  const prob = readNist(name);
  const x0 = prob.parameters.map((p) => (start === 1 ? p.start1 : p.start2));
  const res = solveLeastSquares(model.direct(prob), x0, { maxIterations: 2000 });
  const cov = covarianceFromJacobian(res.jacobian, prob.n, prob.parameters.length, res.ssr);
  return evaluate(name, res.x, cov.standardErrors, res.ssr, res.converged, res.stopReason);
}

describe.skipIf(!NIST_AVAILABLE)('solveSeparable on NIST StRD exponential problems', () => {
  for (const [name, model] of problems) {
    for (const start of [1, 2] as const) {
      it(`solveSeparable(${name}, start ${start}) reaches the certified values and standard deviations`, () => {
        const o = runSeparable(name, model, start);
        summary.push(
          `  ${name.padEnd(8)} start ${start} (variable projection): params ${o.paramsLre.toFixed(1)}, SDs ${o.sdLre.toFixed(1)}, RSS ${o.rssLre.toFixed(1)}, residual SD ${o.residualSdLre.toFixed(1)}`,
        );
        expect(o.converged, o.stopReason).toBe(true);
        // Issue 3 asks ≥ 6 digits; double precision with an exact Jacobian reaches ≥ 10 (NIST README, scipy check).
        expect(o.paramsLre).toBeGreaterThanOrEqual(10);
        if (name === 'Lanczos1') {
          // Lanczos1's RSS (1.43e-25) lies at the rounding floor of double precision, so s² = RSS/dof and
          // the SDs carry only ~3 digits in any double-precision engine (NIST StRD README, scipy check: ~3).
          expect(o.sdLre).toBeGreaterThanOrEqual(2);
          expect(o.rssLre).toBeGreaterThanOrEqual(2);
        } else {
          expect(o.sdLre).toBeGreaterThanOrEqual(9.5);
          expect(o.rssLre).toBeGreaterThanOrEqual(9.5);
          expect(o.residualSdLre).toBeGreaterThanOrEqual(9.5);
        }
      });
    }
  }
});

describe.skipIf(!NIST_AVAILABLE)('solveLeastSquares (no projection) on NIST StRD', () => {
  const direct: [string, NistModel, 1 | 2][] = [
    ['Misra1a', saturatingExponential, 1],
    ['Misra1a', saturatingExponential, 2],
    ['BoxBOD', saturatingExponential, 2],
    ['MGH17', offsetTwoExponentials, 2],
    ['Lanczos2', threeExponentials, 1],
    ['Lanczos3', threeExponentials, 1],
    ['Lanczos3', threeExponentials, 2],
  ];
  for (const [name, model, start] of direct) {
    it(`solveLeastSquares(${name}, start ${start}) reaches the certified values`, () => {
      const o = runDirect(name, model, start);
      summary.push(`  ${name.padEnd(8)} start ${start} (plain LM): params ${o.paramsLre.toFixed(1)}, SDs ${o.sdLre.toFixed(1)}, RSS ${o.rssLre.toFixed(1)}`);
      expect(o.converged, o.stopReason).toBe(true);
      expect(o.paramsLre).toBeGreaterThanOrEqual(10);
      expect(o.sdLre).toBeGreaterThanOrEqual(9.5);
    });
  }

  it('solveLeastSquares(BoxBOD, start 1) reports that it did not converge instead of a wrong answer', () => {
    // NIST BoxBOD Start 1 (b1 = 1, b2 = 1) leads plain LM onto the flat plateau b2 → large (NIST StRD README notes the same
    // for scipy with Jacobian scaling); the engine must say so. Variable projection solves it (test above).
    const o = runDirect('BoxBOD', saturatingExponential, 1);
    summary.push(`  BoxBOD   start 1 (plain LM): converged=${o.converged}: ${o.stopReason}`);
    expect(o.converged).toBe(false);
  });
});

describe.skipIf(!NIST_AVAILABLE)('Lanczos1 standard deviations with an extended-precision RSS', () => {
  for (const start of [1, 2] as const) {
    it(`covarianceFromJacobian(Lanczos1, start ${start}) reaches the certified SDs once the RSS is computed in double-double`, () => {
      // Lanczos1's RSS (1.43e-25, NIST file) is below what double residuals can resolve, which caps the SDs at ~3
      // digits. Refining the double optimum by two Gauss–Newton steps with residuals in double-double arithmetic
      // (data parsed exactly from the file) and passing that RSS to covarianceFromJacobian shows that the engine's
      // (JᵀJ)⁻¹ part is accurate to all certified digits.
      const prob = readNist('Lanczos1');
      const model = threeExponentials;
      const res = solveSeparable(model.separable(prob), model.order.slice(0, 3).map((k) => (start === 1 ? prob.parameters[k]!.start1 : prob.parameters[k]!.start2)));
      const n = prob.n;
      const p = 6;
      let b: DD[] = new Array<DD>(p);
      model.order.forEach((k, j) => (b[k] = [res.x[j]!, 0]));
      const xs = prob.xText.map(parseDD);
      const ys = prob.yText.map(parseDD);
      const residuals = (bb: DD[]): DD[] =>
        xs.map((x, i) => {
          let f: DD = [0, 0];
          for (let j = 0; j < 3; j++) f = add(f, mul(bb[2 * j]!, exp(neg(mul(bb[2 * j + 1]!, x)))));
          return add(f, neg(ys[i]!));
        });
      const direct = model.direct(prob);
      const jac = new Float64Array(n * p);
      const svd = new ScaledSvd(n, p);
      const scales = new Float64Array(p);
      const delta = new Float64Array(p);
      for (let it = 0; it < 3; it++) {
        const r = Float64Array.from(residuals(b), (v) => v[0] + v[1]);
        direct.jacobian(Float64Array.from(b, (v) => v[0]), jac);
        for (let j = 0; j < p; j++) scales[j] = Math.hypot(...jac.subarray(j * n, (j + 1) * n));
        svd.factor(jac, scales, r);
        svd.step(0, delta, 1e-15);
        b = b.map((v, j) => add(v, [delta[j]!, 0]));
      }
      const rss = residuals(b).reduce<DD>((sum, v) => add(sum, mul(v, v)), [0, 0])[0];
      direct.jacobian(Float64Array.from(b, (v) => v[0]), jac);
      const cov = covarianceFromJacobian(jac, n, p, rss);
      const sdLre = Math.min(...prob.parameters.map((q, i) => lre(cov.standardErrors[i]!, q.certifiedSd)));
      const paramsLre = Math.min(...prob.parameters.map((q, i) => lre(b[i]![0] + b[i]![1], q.certified)));
      summary.push(`  Lanczos1 start ${start} (double-double RSS): params ${paramsLre.toFixed(1)}, SDs ${sdLre.toFixed(1)}, RSS ${lre(rss, prob.rss).toFixed(1)}`);
      expect(paramsLre).toBeGreaterThanOrEqual(10);
      expect(sdLre).toBeGreaterThanOrEqual(10);
      expect(lre(rss, prob.rss)).toBeGreaterThanOrEqual(10);
    });
  }
});
