/**
 * Viscosity of glycerol–water mixtures.
 * Source: N.-S. Cheng, "Formula for the viscosity of a glycerol–water mixture", Ind. Eng. Chem. Res.
 * 47, 3285–3288 (2008); physics.md §2.4. Valid 0–100 °C, glycerol mass fraction 0–1.
 */

/**
 * Dynamic viscosity, Pa·s, for glycerol mass fraction `massFraction` (0–1) at `temperatureC` (°C).
 * The water end uses Cheng's own fit (1.0049 mPa·s at 20 °C, 0.3 % above IAPWS 2008).
 */
export function glycerolWaterViscosityPaS(massFraction: number, temperatureC: number): number {
  const t = temperatureC;
  const cm = massFraction;
  const muWater = 1.79 * Math.exp(((-1230 - t) * t) / (36100 + 360 * t));
  const muGlycerol = 12100 * Math.exp(((-1233 + t) * t) / (9900 + 70 * t));
  const a = 0.705 - 0.0017 * t;
  const b = (4.9 + 0.036 * t) * a ** 2.5;
  const alpha = 1 - cm + (a * b * cm * (1 - cm)) / (a * cm + b * (1 - cm));
  return muWater ** alpha * muGlycerol ** (1 - alpha) * 1e-3;
}
