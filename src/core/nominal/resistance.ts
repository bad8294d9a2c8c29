/**
 * Hydraulic resistance of straight channels in steady, fully developed laminar flow of a Newtonian
 * liquid with rigid, no-slip walls: Δp = R·Q, R in Pa·s/m³ (physics.md §1).
 */

/**
 * Circular tube, Hagen–Poiseuille: R = 8 μ L / (π a⁴), a = inner radius.
 * Source: H. Bruus, Theoretical Microfluidics (2008), ch. 4; physics.md §1.2.
 */
export function circularResistancePaSPerM3(viscosityPaS: number, innerDiameterM: number, lengthM: number): number {
  const a = innerDiameterM / 2;
  return (8 * viscosityPaS * lengthM) / (Math.PI * a ** 4);
}

/** Number of odd terms used in the rectangular series (converges as n⁻⁵; 20 terms → 7e-8 at α = 1). */
export const RECTANGULAR_SERIES_TERMS = 50;

/**
 * Shape factor F(α) of the exact rectangular-duct solution, α = h/w ≤ 1:
 * F(α) = 1 − (192 α / π⁵) Σ_{n odd} tanh(n π / (2 α)) / n⁵, F(0) = 1 (parallel plates).
 * Source: Bruus (2008), ch. 2 (Poiseuille flow in a rectangular channel); physics.md §1.3.
 */
export function rectangularShapeFactor(aspectRatio: number, oddTerms = RECTANGULAR_SERIES_TERMS): number {
  if (!(aspectRatio >= 0 && aspectRatio <= 1)) throw new RangeError(`aspect ratio must be in [0, 1], got ${aspectRatio}`);
  if (aspectRatio === 0) return 1;
  let sum = 0;
  for (let k = 0; k < oddTerms; k++) {
    const n = 2 * k + 1;
    sum += Math.tanh((n * Math.PI) / (2 * aspectRatio)) / n ** 5;
  }
  return 1 - ((192 * aspectRatio) / Math.PI ** 5) * sum;
}

/**
 * Rectangular channel, exact series: R = 12 μ L / (w h³ F(h/w)) with h ≤ w (the two sides are
 * swapped when needed, so the order of width and height does not matter).
 * Source: Bruus (2008), ch. 2 and 4; physics.md §1.3.
 */
export function rectangularResistancePaSPerM3(viscosityPaS: number, widthM: number, heightM: number, lengthM: number): number {
  const w = Math.max(widthM, heightM);
  const h = Math.min(widthM, heightM);
  return (12 * viscosityPaS * lengthM) / (w * h ** 3 * rectangularShapeFactor(h / w));
}

/**
 * Shah & London (1978) polynomial for the Fanning Poiseuille number of a rectangular duct,
 * f_F·Re = 24 (1 − 1.3553 a + 1.9467 a² − 1.7012 a³ + 0.9564 a⁴ − 0.2537 a⁵), a = short/long side.
 * Source: R. K. Shah, A. L. London, Laminar Flow Forced Convection in Ducts (1978); physics.md §1.5.
 * A cross-check only (up to 0.063 % above the exact series); predictions use the exact series.
 */
export function shahLondonFanningPoiseuille(aspectRatio: number): number {
  const a = aspectRatio;
  return 24 * (1 - 1.3553 * a + 1.9467 * a ** 2 - 1.7012 * a ** 3 + 0.9564 * a ** 4 - 0.2537 * a ** 5);
}

/**
 * Resistance from a Fanning Poiseuille number: R = 2 (f_F Re) μ L / (A D_h²), D_h = 4A/P.
 * Source: derived in physics.md §1.5 [D] (circle: f_F Re = 16 gives Hagen–Poiseuille).
 */
export function resistanceFromFanningPoiseuille(fanningPoiseuille: number, viscosityPaS: number, areaM2: number, hydraulicDiameterM: number, lengthM: number): number {
  return (2 * fanningPoiseuille * viscosityPaS * lengthM) / (areaM2 * hydraulicDiameterM ** 2);
}

/** Rectangular channel via the Shah & London polynomial (cross-check of the exact series). */
export function rectangularResistanceShahLondonPaSPerM3(viscosityPaS: number, widthM: number, heightM: number, lengthM: number): number {
  const w = Math.max(widthM, heightM);
  const h = Math.min(widthM, heightM);
  const area = w * h;
  const dh = (2 * w * h) / (w + h);
  return resistanceFromFanningPoiseuille(shahLondonFanningPoiseuille(h / w), viscosityPaS, area, dh, lengthM);
}

/** Series combination: R = R₁ + R₂ + … (Kirchhoff analogy; Bruus 2008 ch. 4; physics.md §1.1). */
export function seriesResistance(resistances: readonly number[]): number {
  return resistances.reduce((s, r) => s + r, 0);
}

/**
 * Parallel combination: 1/R = 1/R₁ + 1/R₂ + … (physics.md §1.1). A branch of zero resistance
 * short-circuits the group (returns 0).
 */
export function parallelResistance(resistances: readonly number[]): number {
  if (resistances.length === 0) throw new RangeError('parallel group without branches');
  if (resistances.some((r) => r === 0)) return 0;
  return 1 / resistances.reduce((s, r) => s + 1 / r, 0);
}
