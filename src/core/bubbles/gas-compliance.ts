/**
 * Compliance of a trapped gas bubble, and its inverse: the gas volume that explains a given
 * compliance (physics.md §3.3, §3.4). Pressures are ABSOLUTE (Pa); volumes m³; C in m³/Pa.
 *
 * Ideal gas, fixed amount of air, optional saturated water vapour p_v and surface tension σ
 * of a spherical bubble of radius r = (3V/(4π))^(1/3) (§3.3 [D]):
 *   isothermal:  C = V / (p − p_v + 4σ/(3r))
 *   adiabatic:   C = V / (γ·p + (6γ − 2)·σ/(3r))       (γ = 1.4 for dry air, vapour ignored)
 * Steps lasting seconds are isothermal (§3.3: thermal relaxation ≪ 1 s for r ≤ 1 mm); the
 * adiabatic form gives the upper bound on V for a given C.
 */

/** Heat-capacity ratio of dry air (physics.md §3.3 [M]). */
export const GAMMA_AIR = 1.4;

export interface GasConditions {
  /** Absolute liquid pressure at the bubble, Pa. */
  pressureAbsPa: number;
  /** Saturation vapour pressure of the liquid, Pa (0 = dry air; water: 2339 Pa at 20 °C, §2.2f). */
  vapourPressurePa?: number;
  /** Surface tension, N/m, for the Laplace term; 0 or absent = large bubble (no term). */
  surfaceTensionNPerM?: number;
}

const radiusOf = (volumeM3: number): number => Math.cbrt((3 * Math.max(volumeM3, 0)) / (4 * Math.PI));

/** Laplace stiffening term 4σ/(3r), Pa (0 without σ or for r → ∞). */
function laplaceTerm(volumeM3: number, sigma: number, factor: number): number {
  if (!(sigma > 0) || !(volumeM3 > 0)) return 0;
  return (factor * sigma) / (3 * radiusOf(volumeM3));
}

/** Isothermal compliance of a bubble of volume V (m³) at the given conditions (§3.3). */
export function isothermalGasCompliance(volumeM3: number, c: GasConditions): number {
  const sigma = c.surfaceTensionNPerM ?? 0;
  return volumeM3 / (c.pressureAbsPa - (c.vapourPressurePa ?? 0) + laplaceTerm(volumeM3, sigma, 4));
}

/** Adiabatic compliance of a bubble of volume V (m³) (§3.3), γ = 1.4 by default. */
export function adiabaticGasCompliance(volumeM3: number, c: GasConditions, gamma = GAMMA_AIR): number {
  const sigma = c.surfaceTensionNPerM ?? 0;
  return volumeM3 / (gamma * c.pressureAbsPa + laplaceTerm(volumeM3, sigma, 6 * gamma - 2));
}

/**
 * Solves V = C·(stiffness(V)) by fixed-point iteration. The map's slope is at most 1/3 in
 * magnitude (the Laplace term falls as V^(−1/3)), so it contracts; 100 iterations reach
 * machine precision for any physical bubble.
 */
function solveVolume(complianceM3PerPa: number, stiffness: (v: number) => number): number {
  let v = complianceM3PerPa * stiffness(0);
  if (!(v > 0)) return v; // a non-positive C (e.g. a CI bound) maps linearly, no Laplace term
  for (let i = 0; i < 100; i++) {
    const next = complianceM3PerPa * stiffness(v);
    if (Math.abs(next - v) <= 1e-15 * Math.abs(next)) return next;
    v = next;
  }
  return v;
}

/** Gas volume (m³, at the working pressure) whose isothermal compliance is C (§3.4). */
export function isothermalVolumeFromCompliance(complianceM3PerPa: number, c: GasConditions): number {
  const sigma = c.surfaceTensionNPerM ?? 0;
  return solveVolume(complianceM3PerPa, (v) => c.pressureAbsPa - (c.vapourPressurePa ?? 0) + laplaceTerm(v, sigma, 4));
}

/** Gas volume (m³, at the working pressure) whose adiabatic compliance is C: V = γ·C·p (+ Laplace). */
export function adiabaticVolumeFromCompliance(complianceM3PerPa: number, c: GasConditions, gamma = GAMMA_AIR): number {
  const sigma = c.surfaceTensionNPerM ?? 0;
  return solveVolume(complianceM3PerPa, (v) => gamma * c.pressureAbsPa + laplaceTerm(v, sigma, 6 * gamma - 2));
}

/**
 * Volume the same amount of air occupies at another absolute pressure (Boyle's law on the air
 * partial pressure, with the Laplace pressure 2σ/r inside the bubble, §3.3 [D]):
 * (p₁ + 2σ/r₁ − p_v)·V₁ = (p₂ + 2σ/r₂ − p_v)·V₂, solved for V₂ by fixed-point iteration.
 */
export function volumeAtPressure(volumeM3: number, from: GasConditions, toPressureAbsPa: number): number {
  const sigma = from.surfaceTensionNPerM ?? 0;
  const pv = from.vapourPressurePa ?? 0;
  const lap = (v: number): number => (sigma > 0 && v > 0 ? (2 * sigma) / radiusOf(v) : 0);
  const moles = (from.pressureAbsPa + lap(volumeM3) - pv) * volumeM3;
  let v = moles / (toPressureAbsPa - pv);
  if (!(v > 0)) return v;
  for (let i = 0; i < 100; i++) {
    const next = moles / (toPressureAbsPa + lap(v) - pv);
    if (Math.abs(next - v) <= 1e-15 * Math.abs(next)) return next;
    v = next;
  }
  return v;
}
