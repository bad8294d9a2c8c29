/**
 * Properties of liquid water at about 1 atm as functions of temperature, each from a published
 * formulation (physics.md §2.2). Temperatures in kelvin unless the name says otherwise.
 */

/** 0 °C in kelvin. */
export const ZERO_CELSIUS_K = 273.15;

/** Critical temperature of water, K (IAPWS). */
const T_CRITICAL_K = 647.096;

/**
 * Density of air-free water at 1 atm, kg/m³.
 * Source: G. S. Kell, J. Chem. Eng. Data 20, 97–105 (1975), valid 0–150 °C (physics.md §2.2b);
 * agrees with IAPWS-95 within 4 ppm at 0–60 °C.
 */
export function waterDensityKgPerM3(temperatureK: number): number {
  const t = temperatureK - ZERO_CELSIUS_K;
  const num =
    999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5;
  return num / (1 + 16.87985e-3 * t);
}

/**
 * Isothermal compressibility κ_T of water at 1 atm, 1/Pa.
 * Source: Kell (1975), valid 0–100 °C (physics.md §2.2c); the polynomial gives 1e-6/bar = 1e-11/Pa units.
 */
export function waterCompressibilityPerPa(temperatureK: number): number {
  const t = temperatureK - ZERO_CELSIUS_K;
  const num =
    50.88496 + 0.6163813 * t + 1.459187e-3 * t ** 2 + 20.08438e-6 * t ** 3 - 58.47727e-9 * t ** 4 + 410.411e-12 * t ** 5;
  return (num / (1 + 19.67348e-3 * t)) * 1e-11;
}

const H0 = [1.67752, 2.20462, 0.6366564, -0.241605];

/** H_ij of IAPWS R12-08 (Huber et al. 2009), i = power of (1/T̄ − 1), j = power of (ρ̄ − 1). */
const H_IJ: ReadonlyArray<readonly [number, number, number]> = [
  [0, 0, 0.520094], [0, 1, 0.222531], [0, 2, -0.281378], [0, 3, 0.161913], [0, 4, -0.0325372],
  [1, 0, 0.0850895], [1, 1, 0.999115], [1, 2, -0.906851], [1, 3, 0.257399],
  [2, 0, -1.08374], [2, 1, 1.88797], [2, 2, -0.772479],
  [3, 0, -0.289555], [3, 1, 1.26613], [3, 2, -0.489837], [3, 4, 0.0698452], [3, 6, -0.00435673],
  [4, 2, -0.25704], [4, 5, 0.00872102],
  [5, 1, 0.120573], [5, 6, -0.000593264],
];

/**
 * Viscosity of water from temperature and density, Pa·s, without the critical enhancement (μ₂ = 1,
 * correct away from the critical point).
 * Source: IAPWS R12-08; M. L. Huber et al., J. Phys. Chem. Ref. Data 38, 101 (2009) (physics.md §2.2a).
 */
export function iapws2008ViscosityPaS(temperatureK: number, densityKgPerM3: number): number {
  const tBar = temperatureK / T_CRITICAL_K;
  const rBar = densityKgPerM3 / 322.0;
  let denominator = 0;
  for (let k = 0; k < H0.length; k++) denominator += (H0[k] as number) / tBar ** k;
  const mu0 = (100 * Math.sqrt(tBar)) / denominator;
  const x = 1 / tBar - 1;
  const y = rBar - 1;
  let sum = 0;
  for (const [i, j, h] of H_IJ) sum += h * x ** i * y ** j;
  const mu1 = Math.exp(rBar * sum);
  return 1e-6 * mu0 * mu1;
}

/**
 * Viscosity of liquid water at 1 atm, Pa·s: IAPWS 2008 with the Kell (1975) density
 * (error below 1e-5 relative, physics.md §2.2a).
 */
export function waterViscosityPaS(temperatureK: number): number {
  return iapws2008ViscosityPaS(temperatureK, waterDensityKgPerM3(temperatureK));
}

/**
 * Surface tension of water against air/vapour, N/m.
 * Source: IAPWS R1-76(2014): σ = 235.8 mN/m · τ^1.256 · (1 − 0.625 τ), τ = 1 − T/Tc (physics.md §2.2d).
 */
export function waterSurfaceTensionNPerM(temperatureK: number): number {
  const tau = 1 - temperatureK / T_CRITICAL_K;
  return 235.8e-3 * tau ** 1.256 * (1 - 0.625 * tau);
}

/** Coefficients n1…n10 of the IAPWS-IF97 region 4 (saturation) equation. */
const IF97_N = [
  0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.1202082470247e5, -0.32325550322333e7,
  0.1491510861353e2, -0.48232657361591e4, 0.40511340542057e6, -0.23855557567849, 0.65017534844798e3,
] as const;

/**
 * Saturation vapour pressure of water, Pa, 273.15–647.096 K.
 * Source: IAPWS-IF97 (Wagner et al., "The IAPWS Industrial Formulation 1997 for the Thermodynamic
 * Properties of Water and Steam"), region 4 saturation-pressure equation (eqs. 29–30); coefficients
 * from the release, transcribed from memory — checked against physics.md §2.2f (2.339 kPa at 20 °C).
 */
export function waterVapourPressurePa(temperatureK: number): number {
  const [n1, n2, n3, n4, n5, n6, n7, n8, n9, n10] = IF97_N;
  const theta = temperatureK + n9 / (temperatureK - n10);
  const a = theta ** 2 + n1 * theta + n2;
  const b = n3 * theta ** 2 + n4 * theta + n5;
  const c = n6 * theta ** 2 + n7 * theta + n8;
  const pMPa = ((2 * c) / (-b + Math.sqrt(b * b - 4 * a * c))) ** 4;
  return pMPa * 1e6;
}
