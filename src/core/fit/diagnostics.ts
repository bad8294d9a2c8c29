/** Residual diagnostics and settling times of a fitted transient. */

/** Lag-1 autocorrelation Σ r_i r_{i+1} / Σ r_i² (Box, Jenkins & Reinsel, Time Series Analysis, §2.1.4). */
export function lag1Autocorrelation(r: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < r.length; i++) {
    den += r[i]! * r[i]!;
    if (i + 1 < r.length) num += r[i]! * r[i + 1]!;
  }
  return den > 0 ? num / den : 0;
}

/**
 * Wald–Wolfowitz runs test on the residual signs (zeros skipped): z = (R − μ)/σ with
 * μ = 2n₊n₋/N + 1, σ² = (μ − 1)(μ − 2)/(N − 1) (Wald & Wolfowitz 1940; NIST/SEMATECH e-Handbook
 * §1.3.5.13). Strongly negative z means too few runs: systematic misfit.
 */
export function runsTestZ(r: ArrayLike<number>): number {
  let nPos = 0;
  let nNeg = 0;
  let runs = 0;
  let last = 0;
  for (let i = 0; i < r.length; i++) {
    const s = Math.sign(r[i]!);
    if (s === 0) continue;
    if (s > 0) nPos++;
    else nNeg++;
    if (s !== last) runs++;
    last = s;
  }
  const total = nPos + nNeg;
  if (nPos === 0 || nNeg === 0 || total < 3) return 0;
  const mu = (2 * nPos * nNeg) / total + 1;
  const variance = ((mu - 1) * (mu - 2)) / (total - 1);
  return variance > 0 ? (runs - mu) / Math.sqrt(variance) : 0;
}

/**
 * Time after the step onset at which the model has reached — and stays within — the given
 * fraction of its total change: the smallest t with |Σ aᵢ e^{−(s−t_d)/τᵢ}| ≤ (1 − fraction)·|Σ aᵢ|
 * for all s ≥ t. One term: t_d + τ·ln(1/(1 − fraction)) (physics.md §4.1: 2.9957τ for 95 %).
 * Several terms: scanned on a fine grid, then bisection. NaN when the total change is zero.
 */
export function settlingTime(amplitudes: number[], taus: number[], deadTime: number, fraction: number): number {
  const total = amplitudes.reduce((s, a) => s + a, 0);
  if (!(Math.abs(total) > 0) || taus.some((tau) => !(tau > 0))) return NaN;
  const limit = (1 - fraction) * Math.abs(total);
  if (amplitudes.length === 1) return deadTime + taus[0]! * Math.log(1 / (1 - fraction));
  const g = (s: number): number => {
    let v = 0;
    for (let i = 0; i < amplitudes.length; i++) v += amplitudes[i]! * Math.exp(-s / taus[i]!);
    return Math.abs(v);
  };
  const tauMax = Math.max(...taus);
  const tauMin = Math.min(...taus);
  const end = tauMax * (Math.log(1 / (1 - fraction)) + Math.log(amplitudes.reduce((s, a) => s + Math.abs(a), 0) / Math.abs(total)) + 5);
  const steps = 4000;
  // Scan backwards for the last grid point above the limit.
  const ds = Math.max(Math.min(end / steps, tauMin / 4), end / 200_000);
  const count = Math.ceil(end / ds);
  let lastAbove = -1;
  for (let k = count; k >= 0; k--) {
    if (g(k * ds) > limit) {
      lastAbove = k;
      break;
    }
  }
  if (lastAbove < 0) return deadTime;
  let lo = lastAbove * ds;
  let hi = (lastAbove + 1) * ds;
  for (let i = 0; i < 60; i++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) > limit) lo = mid;
    else hi = mid;
  }
  return deadTime + 0.5 * (lo + hi);
}
