/**
 * Weighted least-squares straight line y = a + b·x with the parameter covariance, used by
 * the pressure fingerprint and the time trend. Closed-form normal equations for two
 * parameters (e.g. Press et al., Numerical Recipes 3rd ed. §15.2, "fitting data to a straight
 * line"), computed about the weighted mean of x to avoid cancellation.
 *
 * Weights wᵢ = 1/σᵢ² when every point has a positive σ; otherwise unweighted. The covariance
 * is scaled by the reduced χ² when that exceeds 1 (data scatter more than their σ's say;
 * Birge ratio, common practice) and always for unweighted data (σ estimated from the residuals).
 */
export interface LinePoint {
  x: number;
  y: number;
  /** 1σ of y; absent or ≤ 0 on any point → unweighted fit. */
  standardError?: number;
}

export interface LineFit {
  intercept: number;
  slope: number;
  /** Covariance [[var a, cov ab], [cov ab, var b]] after scaling. */
  covariance: [[number, number], [number, number]];
  /** Σ wᵢ rᵢ² (weighted) or SSR (unweighted). */
  chiSquare: number;
  dof: number;
  weighted: boolean;
  /** Factor applied to the covariance (1 = none). */
  scale: number;
}

export function fitWeightedLine(points: LinePoint[]): LineFit {
  const weighted = points.every((p) => (p.standardError ?? 0) > 0 && Number.isFinite(p.standardError));
  const w = points.map((p) => (weighted ? 1 / (p.standardError as number) ** 2 : 1));
  const sw = w.reduce((a, b) => a + b, 0);
  const xm = points.reduce((a, p, i) => a + (w[i] as number) * p.x, 0) / sw;
  const ym = points.reduce((a, p, i) => a + (w[i] as number) * p.y, 0) / sw;
  let stt = 0;
  let sty = 0;
  points.forEach((p, i) => {
    const t = p.x - xm;
    stt += (w[i] as number) * t * t;
    sty += (w[i] as number) * t * (p.y - ym);
  });
  const slope = sty / stt;
  const intercept = ym - slope * xm;
  const chiSquare = points.reduce((a, p, i) => a + (w[i] as number) * (p.y - intercept - slope * p.x) ** 2, 0);
  const dof = points.length - 2;
  const reduced = dof > 0 ? chiSquare / dof : Number.NaN;
  const scale = weighted ? (reduced > 1 ? reduced : 1) : reduced;
  const varB = scale / stt;
  const varA = scale * (1 / sw + (xm * xm) / stt);
  const covAB = -scale * (xm / stt);
  return { intercept, slope, covariance: [[varA, covAB], [covAB, varB]], chiSquare, dof, weighted, scale };
}
