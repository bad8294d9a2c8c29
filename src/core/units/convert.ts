/**
 * Conversion of a column's values to SI: a pure scale for pressure, flow and time; p = ρ·g·h for a
 * liquid-head height (hydrostatic pressure of a liquid column, physics.md; g_n from the 3rd CGPM 1901).
 */
import { STANDARD_GRAVITY_M_PER_S2, WATER_DENSITY_20C_KG_PER_M3 } from './constants';
import type { FoundUnit } from './lookup';

/**
 * Factor that turns a value in `found` into SI: Pa for pressure and head, m³/s for flow, s for time.
 * For a head, factor = h_unit_in_m · ρ · g_n (ρ in kg/m³; default water at 20 °C, 998.2 kg/m³).
 */
export function factorToSi(found: FoundUnit, liquidDensityKgPerM3: number = WATER_DENSITY_20C_KG_PER_M3): number {
  if (found.kind === 'head') return found.unit.factorToSi * liquidDensityKgPerM3 * STANDARD_GRAVITY_M_PER_S2;
  return found.unit.factorToSi;
}
