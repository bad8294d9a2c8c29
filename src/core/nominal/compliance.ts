/**
 * Compliance C = dV/dp (m³/Pa) of the parts of a fluidic set-up (physics.md §3). Pure formulas;
 * ranges and bookkeeping live in predict.ts.
 */

/** Liquid compressibility: C = V κ_T (physics.md §3.2, [D]). */
export function liquidCompliance(volumeM3: number, compressibilityPerPa: number): number {
  return volumeM3 * compressibilityPerPa;
}

/** End conditions of a pressurised tube (physics.md §3.5). */
export type TubeEnds = 'open' | 'capped' | 'plane-strain';

/**
 * Radial growth of the bore per unit internal gauge pressure, Δa/p (m/Pa), Lamé thick-walled cylinder.
 * Source: Timoshenko & Goodier (1970) §33; Roark's Formulas, thick-walled cylinder; physics.md §3.5 table.
 */
export function lameBoreGrowthPerPa(innerRadiusM: number, outerRadiusM: number, modulusPa: number, poisson: number, ends: TubeEnds): number {
  const a = innerRadiusM;
  const b = outerRadiusM;
  const nu = poisson;
  switch (ends) {
    case 'open':
      return (a / modulusPa) * ((b * b + a * a) / (b * b - a * a) + nu);
    case 'capped':
      return ((a / modulusPa) * ((1 - 2 * nu) * a * a + (1 + nu) * b * b)) / (b * b - a * a);
    case 'plane-strain':
      return ((a * (1 + nu)) / modulusPa) * (((1 - 2 * nu) * a * a + b * b) / (b * b - a * a));
  }
}

/**
 * Wall compliance of a tube of length L (m³/Pa), Lamé thick-walled cylinder (physics.md §3.5):
 * open ends (σ_z = 0, the default for tubing pushed onto fittings): (2π a² L / E)[(b² + a²)/(b² − a²) + ν];
 * plane strain: 2π a L Δa/p; capped: 2π a L Δa/p + π a² L (1 − 2ν) a² / (E (b² − a²)) (axial stretch).
 */
export function lameTubeCompliance(
  innerDiameterM: number,
  outerDiameterM: number,
  lengthM: number,
  modulusPa: number,
  poisson: number,
  ends: TubeEnds = 'open',
): number {
  const a = innerDiameterM / 2;
  const b = outerDiameterM / 2;
  const radial = 2 * Math.PI * a * lengthM * lameBoreGrowthPerPa(a, b, modulusPa, poisson, ends);
  if (ends !== 'capped') return radial;
  return radial + (Math.PI * a * a * lengthM * (1 - 2 * poisson) * a * a) / (modulusPa * (b * b - a * a));
}

/**
 * A round bore in an unbounded elastic body (b → ∞ limit of the open-ends Lamé formula):
 * C = (2π a² L / E)(1 + ν). Used for round channels moulded or drilled into a chip block.
 */
export function boreInBlockCompliance(innerDiameterM: number, lengthM: number, modulusPa: number, poisson: number): number {
  const a = innerDiameterM / 2;
  return ((2 * Math.PI * a * a * lengthM) / modulusPa) * (1 + poisson);
}

/**
 * Shallow soft channel (bulging roof): h(p) = h₀ + α p w / E, so C = α w² L / E.
 * Source: T. Gervais et al., Lab Chip 6, 500–507 (2006); physics.md §3.6. α is a geometry-dependent
 * fit constant (order 0.1–1, about 0.3 from memory [M]) — callers must carry it as uncertain.
 */
export function shallowChannelWallCompliance(widthM: number, lengthM: number, modulusPa: number, alpha: number): number {
  return (alpha * widthM * widthM * lengthM) / modulusPa;
}

/** Edge support of a thin lid over a channel. */
export type PlateEdges = 'clamped' | 'simply-supported';

/**
 * Thin lid (plate of thickness t spanning a channel of width w, plane strain): added cross-section per
 * unit length and pressure c' = (1 − ν²) w⁵ / (60 E t³) for clamped edges, 6× that when simply supported;
 * C = c' L. Source: beam/plate theory, physics.md §3.6 [D]. Overestimates for t ≳ w (thick walls).
 */
export function lidPlateCompliance(widthM: number, lengthM: number, lidThicknessM: number, modulusPa: number, poisson: number, edges: PlateEdges): number {
  const clamped = ((1 - poisson * poisson) * widthM ** 5) / (60 * modulusPa * lidThicknessM ** 3);
  return clamped * (edges === 'clamped' ? 1 : 6) * lengthM;
}

/** Heat-capacity ratio of dry air, used for the adiabatic bound [M, physics.md §3.3]. */
export const AIR_HEAT_CAPACITY_RATIO = 1.4;

/**
 * Gas pocket of volume V at absolute pressure p (physics.md §3.3):
 * isothermal C = V/p (steps lasting seconds), adiabatic C = V/(γ p) (fast steps, the lower bound),
 * and with saturated water vapour that does not compress C = V/(p − p_v) (the upper bound).
 */
export function gasCompliance(volumeM3: number, absolutePressurePa: number, mode: 'isothermal' | 'adiabatic' = 'isothermal', gamma = AIR_HEAT_CAPACITY_RATIO): number {
  return mode === 'isothermal' ? volumeM3 / absolutePressurePa : volumeM3 / (gamma * absolutePressurePa);
}

/**
 * Spherical bubble with surface tension, isothermal: C = V / (p + 4σ/(3r)) (physics.md §3.3, [D]);
 * adiabatic: V / (γ p + (6γ − 2) σ/(3r)).
 */
export function sphericalBubbleCompliance(volumeM3: number, absolutePressurePa: number, surfaceTensionNPerM: number, gamma = 1): number {
  const r = Math.cbrt((3 * volumeM3) / (4 * Math.PI));
  return volumeM3 / (gamma * absolutePressurePa + ((6 * gamma - 2) * surfaceTensionNPerM) / (3 * r));
}
