/** Student's t distribution: CDF, density and quantile. */
import { incompleteBeta, lnGamma } from './special';
import { normalCdf, normalQuantile } from './normal';

/**
 * P(T ≤ t) for Student's t with `dof` degrees of freedom (dof may be fractional or Infinity).
 * Uses P(|T| > t) = I_{ν/(ν+t²)}(ν/2, 1/2) (Abramowitz & Stegun 26.7.1 with 26.5.27).
 */
export function studentTCdf(t: number, dof: number): number {
  if (Number.isNaN(t) || !(dof > 0)) return NaN;
  if (dof === Infinity) return normalCdf(t);
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  const [tailBoth] = incompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  const tail = 0.5 * tailBoth;
  return t > 0 ? 1 - tail : tail;
}

/** Density of Student's t (A&S 26.7.1). */
export function studentTPdf(t: number, dof: number): number {
  if (dof === Infinity) return Math.exp(-0.5 * t * t) / Math.sqrt(2 * Math.PI);
  const lnC = lnGamma((dof + 1) / 2) - lnGamma(dof / 2) - 0.5 * Math.log(dof * Math.PI);
  return Math.exp(lnC - ((dof + 1) / 2) * Math.log1p((t * t) / dof));
}

/** Upper-tail probability P(T > t) for t ≥ 0, without cancellation. */
function upperTail(t: number, dof: number): number {
  return 0.5 * incompleteBeta(dof / (dof + t * t), dof / 2, 0.5)[0];
}

/**
 * The p-quantile of Student's t with `dof` degrees of freedom, e.g. studentTQuantile(0.975, 10) ≈ 2.228.
 * Closed forms for 1 and 2 dof; otherwise Newton iterations on the CDF from the normal quantile,
 * safeguarded by bisection, to a relative accuracy of about 1e-13.
 */
export function studentTQuantile(p: number, dof: number): number {
  // Fits ask for the same (0.975, dof) again and again: remember the last few answers.
  const key = `${p}|${dof}`;
  const cached = quantileCache.get(key);
  if (cached !== undefined) return cached;
  const value = studentTQuantileUncached(p, dof);
  if (quantileCache.size > 256) quantileCache.clear();
  quantileCache.set(key, value);
  return value;
}

const quantileCache = new Map<string, number>();

function studentTQuantileUncached(p: number, dof: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1 || !(dof > 0)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  if (dof === Infinity) return normalQuantile(p);
  if (p < 0.5) return -studentTQuantile(1 - p, dof);
  const q = 1 - p; // target upper tail
  if (dof === 1) return Math.tan(Math.PI * (p - 0.5));
  if (dof === 2) return (2 * p - 1) / Math.sqrt(2 * p * (1 - p)); // A&S 26.7.1 for ν = 2, inverted
  // Bracket [lo, hi] with upperTail(lo) ≥ q ≥ upperTail(hi).
  let lo = 0;
  let hi = Math.max(1, normalQuantile(p));
  while (upperTail(hi, dof) > q) {
    lo = hi;
    hi *= 2;
    if (hi > 1e300) return Infinity;
  }
  let x = Math.min(Math.max(normalQuantile(p), lo), hi);
  for (let i = 0; i < 200; i++) {
    const f = upperTail(x, dof) - q; // decreasing in x
    if (f > 0) lo = x;
    else hi = x;
    const newton = x + f / studentTPdf(x, dof);
    const next = newton > lo && newton < hi ? newton : 0.5 * (lo + hi);
    if (Math.abs(next - x) <= 1e-15 * Math.abs(x) || hi - lo <= 1e-15 * hi) return next;
    x = next;
  }
  return x;
}
