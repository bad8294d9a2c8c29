/**
 * Shewhart individuals (X) control chart data.
 *
 * W. A. Shewhart, *Economic Control of Quality of Manufactured Product*, Van Nostrand 1931 (3σ limits).
 * Individuals chart with the moving range of span 2 as in D. C. Montgomery, *Introduction to Statistical
 * Quality Control*, 6th ed., 2009, §6.4 (from memory):
 *   centre = x̄,  σ̂ = MR̄ / d₂,  UCL/LCL = x̄ ± 3σ̂,  d₂ = 2/√π ≈ 1.128 for n = 2
 * (d₂ is the expected range of two independent standard normal values, E|Z₁ − Z₂| = 2/√π — a derivation).
 * Points are plotted in time order; lot means across lots can be charted the same way (X̄ as individuals).
 */

/** d₂ for subgroups of two: E|Z₁ − Z₂| = √2·√(2/π) = 2/√π. */
export const D2_N2 = 2 / Math.sqrt(Math.PI);

export interface ChartPoint {
  /** What the point is (chip ID, lot name). */
  label: string;
  /** Group the point belongs to (lot), for drawing boundaries. */
  group: string;
  value: number;
  /** Outside the 3σ limits. */
  outOfControl: boolean;
}

export interface IndividualsChart {
  points: ChartPoint[];
  centre: number | null;
  /** σ̂ = MR̄ / d₂; null with fewer than 2 points. */
  sigma: number | null;
  ucl: number | null;
  lcl: number | null;
}

/** Builds an individuals chart from values in time order (non-finite values are dropped). */
export function individualsChart(input: ReadonlyArray<{ label: string; group: string; value: number }>): IndividualsChart {
  const pts = input.filter((p) => Number.isFinite(p.value));
  if (pts.length === 0) return { points: [], centre: null, sigma: null, ucl: null, lcl: null };
  const centre = pts.reduce((a, p) => a + p.value, 0) / pts.length;
  let sigma: number | null = null;
  if (pts.length >= 2) {
    let mr = 0;
    for (let k = 1; k < pts.length; k++) mr += Math.abs((pts[k]?.value ?? 0) - (pts[k - 1]?.value ?? 0));
    sigma = mr / (pts.length - 1) / D2_N2;
  }
  const ucl = sigma === null ? null : centre + 3 * sigma;
  const lcl = sigma === null ? null : centre - 3 * sigma;
  return {
    points: pts.map((p) => ({ ...p, outOfControl: ucl !== null && lcl !== null && (p.value > ucl || p.value < lcl) })),
    centre,
    sigma,
    ucl,
    lcl,
  };
}

/** Lot means in first-seen order, for an X̄ chart across lots. */
export function lotMeans(input: ReadonlyArray<{ group: string; value: number }>): { label: string; group: string; value: number }[] {
  const sums = new Map<string, { s: number; n: number }>();
  for (const p of input) {
    if (!Number.isFinite(p.value)) continue;
    const e = sums.get(p.group) ?? { s: 0, n: 0 };
    e.s += p.value;
    e.n += 1;
    sums.set(p.group, e);
  }
  return [...sums].map(([g, e]) => ({ label: g, group: g, value: e.s / e.n }));
}
