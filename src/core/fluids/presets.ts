/**
 * Built-in working fluids and how their properties follow temperature. Values and their status
 * tags from physics.md §2.1–2.4; [M] (from memory) values get wide uncertainty ranges so that a
 * prediction never looks sharper than its inputs.
 */
import { InputError } from '../errors';
import { ordered, relative, type ValueRange } from '../nominal/range';
import { glycerolWaterViscosityPaS } from './glycerol-water';
import type { FluidProperties, FluidSpec } from './types';
import {
  waterCompressibilityPerPa,
  waterDensityKgPerM3,
  waterSurfaceTensionNPerM,
  waterVapourPressurePa,
  waterViscosityPaS,
  ZERO_CELSIUS_K,
} from './water';

/** Validity of the water formulations used (Kell compressibility: 0–100 °C). */
const WATER_MIN_K = ZERO_CELSIUS_K;
const WATER_MAX_K = ZERO_CELSIUS_K + 100;

/** Water viscosity over T ± tolerance (μ falls with T, so the colder end is the high bound). */
function waterViscosityRange(temperatureK: number, toleranceK: number): ValueRange {
  return ordered(
    waterViscosityPaS(Math.min(WATER_MAX_K, temperatureK + toleranceK)),
    waterViscosityPaS(temperatureK),
    waterViscosityPaS(Math.max(WATER_MIN_K, temperatureK - toleranceK)),
  );
}

function widen(r: ValueRange, factorLow: number, factorNominal: number, factorHigh: number): ValueRange {
  return { low: r.low * factorLow, nominal: r.nominal * factorNominal, high: r.high * factorHigh };
}

function requireRange(spec: FluidSpec, minK: number, maxK: number, what: string): void {
  if (spec.temperatureK < minK || spec.temperatureK > maxK) {
    throw new InputError(
      'fluid-temperature-out-of-range',
      `The temperature ${(spec.temperatureK - ZERO_CELSIUS_K).toFixed(1)} °C is outside the range ` +
        `${(minK - ZERO_CELSIUS_K).toFixed(0)}–${(maxK - ZERO_CELSIUS_K).toFixed(0)} °C of the ${what} data`,
      'Give a temperature inside that range, or describe the fluid as "custom" with measured properties',
    );
  }
}

/** Aqueous fluids: water's surface tension and vapour pressure as the best available estimate. */
function aqueousExtras(temperatureK: number): Pick<FluidProperties, 'surfaceTensionNPerM' | 'vapourPressurePa'> {
  return {
    surfaceTensionNPerM: waterSurfaceTensionNPerM(temperatureK),
    vapourPressurePa: waterVapourPressurePa(temperatureK),
  };
}

const WATER_SOURCES = [
  'viscosity: IAPWS R12-08 (Huber et al. 2009) with Kell (1975) density [S]',
  'compressibility: Kell (1975) [S]',
  'surface tension: IAPWS R1-76(2014) [S]; vapour pressure: IAPWS-IF97 region 4',
];

/** Pure-liquid presets with values at 20 °C and 25 °C; ln μ is interpolated linearly in T. */
interface OrganicPreset {
  name: string;
  viscosity20PaS: number;
  viscosity25PaS: number;
  viscosityHalfWidth: number;
  viscosityTag: 'S' | 'M';
  compressibilityPerPa: number;
  compressibilityHalfWidth: number;
  densityKgPerM3: number;
  sources: string[];
}

const ORGANIC: Record<'ethanol' | 'isopropanol', OrganicPreset> = {
  ethanol: {
    name: 'ethanol',
    viscosity20PaS: 1.195e-3,
    viscosity25PaS: 1.074e-3,
    viscosityHalfWidth: 0.03,
    viscosityTag: 'S',
    compressibilityPerPa: 1.1e-9,
    compressibilityHalfWidth: 0.15,
    densityKgPerM3: 789,
    sources: [
      'viscosity 1.074 mPa·s at 25 °C from a CRC-derived public list [S]; 1.19–1.20 at 20 °C [M]; ±3 %',
      'compressibility about 1.1e-9 /Pa at 20 °C [M]; ±15 %',
    ],
  },
  isopropanol: {
    name: 'isopropanol (2-propanol)',
    viscosity20PaS: 2.4e-3,
    viscosity25PaS: 2.04e-3,
    viscosityHalfWidth: 0.1,
    viscosityTag: 'M',
    compressibilityPerPa: 1.0e-9,
    compressibilityHalfWidth: 0.3,
    densityKgPerM3: 785,
    sources: [
      'viscosity about 2.4 mPa·s at 20 °C and 2.04 at 25 °C [M]; ±10 %',
      'compressibility about 1.0e-9 /Pa, from memory [M]; ±30 %',
    ],
  },
};

function organic(spec: FluidSpec & { kind: 'preset' }, p: OrganicPreset): FluidProperties {
  requireRange(spec, ZERO_CELSIUS_K + 15, ZERO_CELSIUS_K + 30, p.name);
  const slope = Math.log(p.viscosity25PaS / p.viscosity20PaS) / 5;
  const mu = (tK: number): number => p.viscosity20PaS * Math.exp(slope * (tK - ZERO_CELSIUS_K - 20));
  const base = ordered(mu(spec.temperatureK + spec.temperatureToleranceK), mu(spec.temperatureK), mu(spec.temperatureK - spec.temperatureToleranceK));
  const notes = ['Outside 20–25 °C the viscosity is extrapolated from the 20 °C and 25 °C values.'];
  if (p.viscosityTag === 'M') notes.push('Viscosity values are from memory [M]; the range is wide on purpose. Measure the lot if it matters.');
  return {
    name: p.name,
    temperatureK: spec.temperatureK,
    viscosityPaS: widen(base, 1 - p.viscosityHalfWidth, 1, 1 + p.viscosityHalfWidth),
    viscosityTag: p.viscosityTag,
    compressibilityPerPa: relative(p.compressibilityPerPa, p.compressibilityHalfWidth),
    compressibilityTag: 'M',
    densityKgPerM3: p.densityKgPerM3,
    surfaceTensionNPerM: null,
    vapourPressurePa: null,
    sources: p.sources,
    notes,
  };
}

/** Aqueous presets: water at the same temperature times a viscosity factor [low, nominal, high]. */
const AQUEOUS: Record<'pbs' | 'culture-medium' | 'culture-medium-serum', { name: string; factor: [number, number, number]; density: number; source: string; note?: string }> = {
  pbs: {
    name: 'PBS (1x)',
    factor: [1.01, 1.015, 1.02],
    density: 1005,
    source: 'viscosity 1.01–1.02 × water at the same temperature [M]',
  },
  'culture-medium': {
    name: 'culture medium, serum-free',
    factor: [1.0, 1.03, 1.08],
    density: 1007,
    source: 'viscosity a few % above water at the same temperature [M; measured data in Poon 2022]',
  },
  'culture-medium-serum': {
    name: 'culture medium with 5–20 % serum',
    factor: [1.02, 1.1, 1.35],
    density: 1010,
    source: 'viscosity rises with serum content; numbers [M], trend from Poon (2022) [S]',
    note: 'Serum-supplemented medium can be mildly shear-thinning (Sints et al. 2024): R then depends on flow rate.',
  },
};

/** Glycerol properties used for the mixture's compressibility and density, from memory [M]. */
const GLYCEROL_COMPRESSIBILITY_PER_PA = 2.1e-10;
const GLYCEROL_DENSITY_KG_PER_M3 = 1261;

/**
 * Resolves a fluid description into properties with ranges at its temperature.
 * Throws InputError (unlocated; the chip parser adds the location) for temperatures outside the data.
 */
export function resolveFluid(spec: FluidSpec): FluidProperties {
  const tK = spec.temperatureK;
  if (spec.kind === 'custom') {
    requireRange(spec, WATER_MIN_K, WATER_MAX_K, 'water (used for the vapour pressure and a default compressibility)');
    const notes: string[] = [];
    let kappa = spec.compressibilityPerPa;
    let kappaTag: FluidProperties['compressibilityTag'] = 'U';
    if (kappa === undefined) {
      kappa = waterCompressibilityPerPa(tK);
      kappaTag = 'M';
      notes.push("No compressibility given: water's κ_T at this temperature is used with a ±50 % range.");
    }
    return {
      name: spec.name,
      temperatureK: tK,
      viscosityPaS: relative(spec.viscosityPaS, spec.viscosityRelativeUncertainty),
      viscosityTag: 'U',
      compressibilityPerPa: relative(kappa, spec.compressibilityPerPa === undefined ? 0.5 : spec.compressibilityRelativeUncertainty),
      compressibilityTag: kappaTag,
      densityKgPerM3: spec.densityKgPerM3 ?? waterDensityKgPerM3(tK),
      surfaceTensionNPerM: null,
      vapourPressurePa: null,
      sources: ['user-supplied viscosity' + (spec.compressibilityPerPa === undefined ? '' : ' and compressibility')],
      notes,
    };
  }
  const tol = spec.temperatureToleranceK;
  switch (spec.preset) {
    case 'water': {
      requireRange(spec, WATER_MIN_K, WATER_MAX_K, 'water');
      const kappa = waterCompressibilityPerPa(tK);
      return {
        name: 'water',
        temperatureK: tK,
        viscosityPaS: waterViscosityRange(tK, tol),
        viscosityTag: 'S',
        compressibilityPerPa: { low: kappa, nominal: kappa, high: kappa },
        compressibilityTag: 'S',
        densityKgPerM3: waterDensityKgPerM3(tK),
        ...aqueousExtras(tK),
        sources: WATER_SOURCES,
        notes: [],
      };
    }
    case 'ethanol':
    case 'isopropanol':
      return organic(spec, ORGANIC[spec.preset]);
    case 'pbs':
    case 'culture-medium':
    case 'culture-medium-serum': {
      requireRange(spec, WATER_MIN_K, WATER_MAX_K, 'water');
      const p = AQUEOUS[spec.preset];
      const kappa = waterCompressibilityPerPa(tK);
      return {
        name: p.name,
        temperatureK: tK,
        viscosityPaS: widen(waterViscosityRange(tK, tol), p.factor[0], p.factor[1], p.factor[2]),
        viscosityTag: 'M',
        compressibilityPerPa: relative(kappa, 0.05),
        compressibilityTag: 'M',
        densityKgPerM3: p.density,
        ...aqueousExtras(tK),
        sources: [p.source, "compressibility: water's (Kell 1975) ±5 % [M]", ...WATER_SOURCES.slice(0, 1)],
        notes: p.note ? [p.note] : [],
      };
    }
    case 'glycerol-water': {
      requireRange(spec, WATER_MIN_K, WATER_MAX_K, 'glycerol–water (Cheng 2008)');
      const cm = spec.glycerolMassFraction ?? 0;
      const tC = tK - ZERO_CELSIUS_K;
      const mu = (c: number): number => glycerolWaterViscosityPaS(cm, c);
      const halfWidth = cm <= 0.6 ? 0.03 : 0.1;
      const base = ordered(mu(Math.min(100, tC + tol)), mu(tC), mu(Math.max(0, tC - tol)));
      const kappaWater = waterCompressibilityPerPa(tK);
      const kappa = (1 - cm) * kappaWater + cm * GLYCEROL_COMPRESSIBILITY_PER_PA;
      const rhoW = waterDensityKgPerM3(tK);
      const density = 1 / ((1 - cm) / rhoW + cm / GLYCEROL_DENSITY_KG_PER_M3);
      return {
        name: `glycerol–water, ${(cm * 100).toFixed(0)} wt % glycerol`,
        temperatureK: tK,
        viscosityPaS: widen(base, 1 - halfWidth, 1, 1 + halfWidth),
        viscosityTag: 'S',
        compressibilityPerPa: relative(kappa, 0.2),
        compressibilityTag: 'M',
        densityKgPerM3: density,
        ...aqueousExtras(tK),
        sources: [
          `viscosity: Cheng (2008) formula [S]; range ±${halfWidth * 100} % [P] (glycerol takes up water)`,
          'compressibility and density: mass-weighted mix of water (Kell 1975) and glycerol (2.1e-10 /Pa, 1261 kg/m³, from memory [M]); ±20 %',
        ],
        notes: cm > 0.6 ? ['Concentrated glycerol absorbs water from air; its viscosity drifts. Measure the lot.'] : [],
      };
    }
  }
}
