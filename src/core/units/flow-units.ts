/**
 * Volume-flow units a pump or flow sensor may write, with their factor to m³/s and its source.
 * All follow from the litre (1 L = 1e-3 m³), the minute (60 s) and the hour (3600 s), BIPM SI Brochure
 * 9th ed. (2019), Table 8 (non-SI units accepted for use with the SI), and the SI prefixes of Table 7.
 */
import type { UnitDefinition } from './pressure-units';

const LITRE_M3 = 1e-3; // BIPM SI Brochure 9th ed. (2019), Table 8: 1 L = 1 dm³ = 1e-3 m³
const MINUTE_S = 60; // BIPM SI Brochure 9th ed. (2019), Table 8: 1 min = 60 s
const HOUR_S = 3600; // BIPM SI Brochure 9th ed. (2019), Table 8: 1 h = 3600 s
const MICRO = 1e-6; // BIPM SI Brochure 9th ed. (2019), Table 7
const NANO = 1e-9; // BIPM SI Brochure 9th ed. (2019), Table 7
const MILLI = 1e-3; // BIPM SI Brochure 9th ed. (2019), Table 7

const TABLES = 'BIPM SI Brochure 9th ed. (2019), Tables 7 and 8 (prefixes; litre, minute, hour)';

/** Flow units, factor to m³/s. */
export const FLOW_UNITS: readonly UnitDefinition[] = [
  { symbol: 'm³/s', factorToSi: 1, source: 'BIPM SI Brochure 9th ed. (2019), Table 2: cubic metre per second, coherent SI' },
  { symbol: 'µL/min', factorToSi: (MICRO * LITRE_M3) / MINUTE_S, source: TABLES },
  { symbol: 'µL/h', factorToSi: (MICRO * LITRE_M3) / HOUR_S, source: TABLES },
  { symbol: 'µL/s', factorToSi: MICRO * LITRE_M3, source: TABLES },
  { symbol: 'nL/min', factorToSi: (NANO * LITRE_M3) / MINUTE_S, source: TABLES },
  { symbol: 'nL/s', factorToSi: NANO * LITRE_M3, source: TABLES },
  { symbol: 'mL/min', factorToSi: (MILLI * LITRE_M3) / MINUTE_S, source: TABLES },
  { symbol: 'mL/h', factorToSi: (MILLI * LITRE_M3) / HOUR_S, source: TABLES },
  { symbol: 'L/min', factorToSi: LITRE_M3 / MINUTE_S, source: TABLES },
];

/** Heights of a liquid column, factor to metres (then p = ρ·g·h). BIPM SI Brochure 9th ed. Table 7. */
export const HEAD_UNITS: readonly UnitDefinition[] = [
  { symbol: 'mm', factorToSi: 1e-3, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix milli = 1e-3' },
  { symbol: 'cm', factorToSi: 1e-2, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix centi = 1e-2' },
  { symbol: 'm', factorToSi: 1, source: 'BIPM SI Brochure 9th ed. (2019), Table 1: metre, SI base unit' },
];

/** Time units for a numeric time column, factor to seconds. */
export const TIME_UNITS: readonly UnitDefinition[] = [
  { symbol: 's', factorToSi: 1, source: 'BIPM SI Brochure 9th ed. (2019), Table 1: second, SI base unit' },
  { symbol: 'ms', factorToSi: 1e-3, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix milli = 1e-3' },
  { symbol: 'min', factorToSi: MINUTE_S, source: 'BIPM SI Brochure 9th ed. (2019), Table 8: 1 min = 60 s' },
  { symbol: 'h', factorToSi: HOUR_S, source: 'BIPM SI Brochure 9th ed. (2019), Table 8: 1 h = 3600 s' },
];
