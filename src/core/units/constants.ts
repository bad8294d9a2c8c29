/**
 * Physical constants used by the unit conversions, each with its source.
 */

/**
 * Standard acceleration of gravity g_n, m/s² (exact by definition).
 * Source: 3rd CGPM (1901), declaration on the unit of mass and the definition of weight; value restated in
 * the BIPM SI Brochure, 9th ed. (2019), and in NIST SP 811 (2008 ed.), Appendix B.
 */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;

/**
 * Density of liquid water at 20 °C and 0.101325 MPa, kg/m³, used by default to turn a liquid-head height
 * (mm or cm of liquid) into a pressure with p = ρ·g·h.
 * Source: IAPWS-95 as tabulated in physics.md §2.1 (998.207 kg/m³ at 20 °C), rounded to 998.2.
 */
export const WATER_DENSITY_20C_KG_PER_M3 = 998.2;

/**
 * Conventional density of water used by the "conventional" water-column pressure units (mmH2O, cmH2O,
 * inH2O), kg/m³. Source: NIST SP 811 (2008), Appendix B.8, footnotes to "centimeter of water, conventional"
 * and "inch of water, conventional" (ρ = 1000 kg/m³, g = g_n).
 */
export const CONVENTIONAL_WATER_DENSITY_KG_PER_M3 = 1000;

/**
 * Conventional density of mercury used by the millimetre of mercury, kg/m³ (13.5951 g/cm³, mercury at 0 °C).
 * Source: NIST SP 811 (2008), Appendix B.8, "millimeter of mercury, conventional (mmHg)" = 1.333224 E+02 Pa,
 * which equals 13 595.1 kg/m³ · g_n · 1 mm.
 */
export const CONVENTIONAL_MERCURY_DENSITY_KG_PER_M3 = 13595.1;
