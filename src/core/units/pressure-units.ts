/**
 * Pressure units a logger may write, with their factor to pascal and the published source of each factor.
 * Values are gauge pressures; the conversion is a pure scale (no offset).
 */
import { CONVENTIONAL_MERCURY_DENSITY_KG_PER_M3, CONVENTIONAL_WATER_DENSITY_KG_PER_M3, STANDARD_GRAVITY_M_PER_S2 } from './constants';

/** One unit: canonical symbol, factor to SI (value_SI = value · factorToSi), and where the factor comes from. */
export interface UnitDefinition {
  symbol: string;
  factorToSi: number;
  source: string;
}

const INCH_M = 0.0254; // exact: international inch, NIST SP 811 (2008) Appendix B.8 "inch (in) 2.54 E-02 m"
const POUND_KG = 0.45359237; // exact: avoirdupois pound, NIST SP 811 (2008) Appendix B.8

/** Pressure units, factor to Pa. */
export const PRESSURE_UNITS: readonly UnitDefinition[] = [
  { symbol: 'Pa', factorToSi: 1, source: 'BIPM SI Brochure 9th ed. (2019), Table 4: pascal, SI coherent derived unit' },
  { symbol: 'hPa', factorToSi: 1e2, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix hecto = 1e2' },
  { symbol: 'kPa', factorToSi: 1e3, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix kilo = 1e3' },
  { symbol: 'MPa', factorToSi: 1e6, source: 'BIPM SI Brochure 9th ed. (2019), Table 7: prefix mega = 1e6' },
  { symbol: 'bar', factorToSi: 1e5, source: 'NIST SP 811 (2008), Appendix B.8: bar = 1.0 E+05 Pa (exact)' },
  { symbol: 'mbar', factorToSi: 1e2, source: 'NIST SP 811 (2008), Appendix B.8: millibar = 1.0 E+02 Pa (exact)' },
  {
    symbol: 'psi',
    // 1 lbf/in² = 0.45359237 kg · 9.80665 m/s² / (0.0254 m)² = 6894.757293168… Pa
    factorToSi: (POUND_KG * STANDARD_GRAVITY_M_PER_S2) / (INCH_M * INCH_M),
    source: 'NIST SP 811 (2008), Appendix B.8: pound-force per square inch (psi) = 6.894757 E+03 Pa; exact from lb, g_n, in',
  },
  {
    symbol: 'mmHg',
    factorToSi: CONVENTIONAL_MERCURY_DENSITY_KG_PER_M3 * STANDARD_GRAVITY_M_PER_S2 * 1e-3,
    source: 'NIST SP 811 (2008), Appendix B.8: millimeter of mercury, conventional (mmHg) = 1.333224 E+02 Pa',
  },
  {
    symbol: 'Torr',
    factorToSi: 101325 / 760,
    source: 'NIST SP 811 (2008), Appendix B.8: torr (Torr) = 1.333224 E+02 Pa; defined as 1/760 of the standard atmosphere 101 325 Pa',
  },
  {
    symbol: 'inH2O',
    factorToSi: CONVENTIONAL_WATER_DENSITY_KG_PER_M3 * STANDARD_GRAVITY_M_PER_S2 * INCH_M,
    source: 'NIST SP 811 (2008), Appendix B.8: inch of water, conventional (inH2O) = 2.490889 E+02 Pa',
  },
  {
    symbol: 'cmH2O',
    factorToSi: CONVENTIONAL_WATER_DENSITY_KG_PER_M3 * STANDARD_GRAVITY_M_PER_S2 * 1e-2,
    source: 'NIST SP 811 (2008), Appendix B.8: centimeter of water, conventional (cmH2O) = 9.80665 E+01 Pa',
  },
  {
    symbol: 'mmH2O',
    factorToSi: CONVENTIONAL_WATER_DENSITY_KG_PER_M3 * STANDARD_GRAVITY_M_PER_S2 * 1e-3,
    source: 'NIST SP 811 (2008), Appendix B.8: millimeter of water, conventional (mmH2O) = 9.80665 E+00 Pa',
  },
];
