/**
 * Units a QC spec may write its limits in, and their factors to SI.
 * Factors are exact from the unit definitions (1 mbar = 100 Pa, 1 µL = 1e-9 m³,
 * 1 min = 60 s); cross-checked against /work/shared/reference/physics.md §5 [N]
 * (1 µL/mbar = 1e-11 m³/Pa, 1 nL/kPa = 1e-15 m³/Pa).
 */
import type { QcQuantity } from './types';

/** Unit name as written in a spec → factor that turns a value in that unit into SI. */
export const QC_UNITS: Readonly<Record<QcQuantity, Readonly<Record<string, number>>>> = {
  // Pa·s/m³; 1 mbar/(µL/min) = 100 Pa / (1e-9 m³ / 60 s) = 6e12 Pa·s/m³.
  resistance: { Pa_s_per_m3: 1, mbar_per_uL_per_min: 6e12 },
  compliance: { m3_per_Pa: 1, uL_per_mbar: 1e-11, nL_per_kPa: 1e-15 },
  excess_compliance: { m3_per_Pa: 1, uL_per_mbar: 1e-11, nL_per_kPa: 1e-15 },
  trapped_air: { m3: 1, uL: 1e-9, nL: 1e-12 },
  tau: { s: 1, ms: 1e-3, min: 60 },
  t95: { s: 1, ms: 1e-3, min: 60 },
};

/** The SI unit each quantity is stored in (records, JSON, CSV). */
export const QC_SI_UNIT: Readonly<Record<QcQuantity, string>> = {
  resistance: 'Pa_s_per_m3',
  compliance: 'm3_per_Pa',
  excess_compliance: 'm3_per_Pa',
  trapped_air: 'm3',
  tau: 's',
  t95: 's',
};

/** Readable names of the quantities (reports, tables). */
export const QC_QUANTITY_LABEL: Readonly<Record<QcQuantity, string>> = {
  resistance: 'Hydraulic resistance R',
  compliance: 'Compliance C',
  excess_compliance: 'Excess compliance C − C_nominal',
  trapped_air: 'Trapped-air volume',
  tau: 'Time constant τ',
  t95: 'Settling time t₉₅',
};

/** Readable unit symbols for display. */
export const QC_UNIT_SYMBOL: Readonly<Record<string, string>> = {
  Pa_s_per_m3: 'Pa·s/m³',
  mbar_per_uL_per_min: 'mbar/(µL/min)',
  m3_per_Pa: 'm³/Pa',
  uL_per_mbar: 'µL/mbar',
  nL_per_kPa: 'nL/kPa',
  m3: 'm³',
  uL: 'µL',
  nL: 'nL',
  s: 's',
  ms: 'ms',
  min: 'min',
};
