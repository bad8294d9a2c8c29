import type { ValueRange } from '../nominal/range';

/** Names of the built-in working fluids. */
export const FLUID_PRESETS = [
  'water',
  'ethanol',
  'isopropanol',
  'glycerol-water',
  'pbs',
  'culture-medium',
  'culture-medium-serum',
] as const;
export type FluidPresetName = (typeof FLUID_PRESETS)[number];

/** What the user asked for (already in SI); resolved into {@link FluidProperties} by `resolveFluid`. */
export type FluidSpec =
  | {
      kind: 'preset';
      preset: FluidPresetName;
      temperatureK: number;
      /** ± temperature uncertainty, K; widens the viscosity range. */
      temperatureToleranceK: number;
      /** Glycerol mass fraction 0–1; only for `glycerol-water`. */
      glycerolMassFraction?: number;
    }
  | {
      kind: 'custom';
      name: string;
      temperatureK: number;
      viscosityPaS: number;
      /** Relative half-width of the viscosity range (0.05 = ±5 %). */
      viscosityRelativeUncertainty: number;
      /** When absent, water's κ_T at the temperature is used and a note says so. */
      compressibilityPerPa?: number;
      compressibilityRelativeUncertainty: number;
      densityKgPerM3?: number;
    };

/**
 * Source tag of a value, as in physics.md: S confirmed source, N computed and cross-checked,
 * D derived, M from memory (unverified), P common practice, U user-supplied.
 */
export type SourceTag = 'S' | 'N' | 'D' | 'M' | 'P' | 'U';

/** Resolved properties of the working fluid at its temperature, SI. */
export interface FluidProperties {
  name: string;
  temperatureK: number;
  viscosityPaS: ValueRange;
  viscosityTag: SourceTag;
  compressibilityPerPa: ValueRange;
  compressibilityTag: SourceTag;
  densityKgPerM3: number;
  /** Against air; water's value for aqueous fluids, null when unknown. */
  surfaceTensionNPerM: number | null;
  /** Saturation vapour pressure, Pa; water's value for aqueous fluids, null when unknown. */
  vapourPressurePa: number | null;
  /** Where each number comes from, readable. */
  sources: string[];
  /** Caveats (non-Newtonian behaviour, values from memory, assumed compressibility…). */
  notes: string[];
}
