import { describe, expect, it } from 'vitest';
import { factorToSi, lookupUnit, knownUnitsSentence, STANDARD_GRAVITY_M_PER_S2 } from '../../../src/core/units/index';

/** Factor of a unit text to SI, failing the test if the unit is unknown. */
function factor(text: string, density?: number): number {
  const found = lookupUnit(text);
  if (!found) throw new Error(`unknown unit ${text}`);
  return factorToSi(found, density);
}

describe('pressure unit factors against NIST SP 811 (2008) Appendix B.8 and the BIPM SI Brochure 9th ed. (2019)', () => {
  // Exact SI prefixes: BIPM SI Brochure 9th ed., Table 7.
  it.each([
    ['Pa', 1],
    ['hPa', 100],
    ['kPa', 1000],
    ['MPa', 1e6],
  ])('lookupUnit(%s) → %d Pa (SI prefix, exact)', (unit, expected) => {
    expect(factor(unit)).toBe(expected);
  });

  // NIST SP 811 (2008) B.8: bar = 1.0 E+05 Pa, millibar = 1.0 E+02 Pa (exact).
  it('lookupUnit(bar, mbar) → 1e5 Pa and 100 Pa exactly (NIST SP 811 B.8)', () => {
    expect(factor('bar')).toBe(1e5);
    expect(factor('mbar')).toBe(100);
  });

  // NIST SP 811 (2008) B.8 lists rounded factors (7 significant digits); ours derive from the exact definitions.
  it.each([
    ['psi', 6.894757e3, 'NIST SP 811 B.8: pound-force per square inch = 6.894757 E+03 Pa'],
    ['mmHg', 1.333224e2, 'NIST SP 811 B.8: millimeter of mercury, conventional = 1.333224 E+02 Pa'],
    ['Torr', 1.333224e2, 'NIST SP 811 B.8: torr = 1.333224 E+02 Pa'],
    ['inH2O', 2.490889e2, 'NIST SP 811 B.8: inch of water, conventional = 2.490889 E+02 Pa'],
    ['cmH2O', 9.80665e1, 'NIST SP 811 B.8: centimeter of water, conventional = 9.80665 E+01 Pa'],
    ['mmH2O', 9.80665, 'NIST SP 811 B.8: millimeter of water, conventional = 9.80665 E+00 Pa'],
  ])('lookupUnit(%s) matches %d Pa to the 7 digits printed (%s)', (unit, expected) => {
    expect(factor(unit)).toBeCloseTo(expected as number, 7 - Math.ceil(Math.log10(expected as number)));
    expect(Math.abs(factor(unit) / (expected as number) - 1)).toBeLessThan(5e-7);
  });

  it('psi is exactly 0.45359237 kg · 9.80665 m/s² / (0.0254 m)² (physics.md §5: 6894.757293 Pa)', () => {
    expect(factor('psi')).toBeCloseTo(6894.757293, 6);
  });

  it('Torr is exactly 101325/760 Pa (standard atmosphere / 760, NIST SP 811 B.8 footnote)', () => {
    expect(factor('torr')).toBe(101325 / 760);
  });

  it('mbar converts 1 mbar to 100 Pa and 1 kPa = 10 mbar (physics.md §5, exact)', () => {
    expect(factor('kPa') / factor('mbar')).toBe(10);
  });
});

describe('flow unit factors (BIPM SI Brochure 9th ed. Table 8: 1 L = 1e-3 m³, 1 min = 60 s, 1 h = 3600 s)', () => {
  it.each([
    ['µL/min', 1e-9 / 60],
    ['µL/h', 1e-9 / 3600],
    ['µL/s', 1e-9],
    ['nL/min', 1e-12 / 60],
    ['nL/s', 1e-12],
    ['mL/min', 1e-6 / 60],
    ['mL/h', 1e-6 / 3600],
    ['L/min', 1e-3 / 60],
    ['m³/s', 1],
  ])('lookupUnit(%s) → %d m³/s', (unit, expected) => {
    expect(Math.abs(factor(unit) / expected - 1)).toBeLessThan(1e-15);
  });

  // physics.md §5 [N]: 1 uL/min = 1.666667e-11 m³/s; 1 mL/h = 2.777778e-10 m³/s; 1 nL/min = 1.666667e-14 m³/s
  it('matches the physics.md §5 check values to 7 digits', () => {
    expect(factor('uL/min')).toBeCloseTo(1.666667e-11, 17);
    expect(factor('mL/h')).toBeCloseTo(2.777778e-10, 16);
    expect(factor('nL/min')).toBeCloseTo(1.666667e-14, 20);
  });

  it('lookupUnit accepts the micro sign U+00B5, Greek mu U+03BC, u, and l or L', () => {
    const expected = factor('µL/min');
    for (const spelling of ['\u00B5L/min', '\u03BCL/min', 'uL/min', 'ul/min', 'µl/min', 'UL/MIN', 'ul_per_min', 'µL per min']) {
      expect(lookupUnit(spelling), spelling).not.toBeNull();
      expect(factor(spelling), spelling).toBe(expected);
    }
    expect(factor('m3/s')).toBe(1);
    expect(factor('m3_per_s')).toBe(1);
    expect(factor('ml/hr')).toBe(factor('mL/h'));
  });
});

describe('liquid-head heights: p = ρ·g·h', () => {
  it('factorToSi(mm of water) = 1e-3 m · 998.2 kg/m³ · 9.80665 m/s² (g_n: 3rd CGPM 1901; ρ: physics.md §2.1, 20 °C)', () => {
    expect(STANDARD_GRAVITY_M_PER_S2).toBe(9.80665);
    expect(factor('mm')).toBeCloseTo(1e-3 * 998.2 * 9.80665, 12);
    expect(factor('cm')).toBeCloseTo(1e-2 * 998.2 * 9.80665, 12);
  });

  it('factorToSi(cm, ρ = 1000) equals the conventional cmH2O of NIST SP 811 B.8 (98.0665 Pa)', () => {
    expect(factor('cm', 1000)).toBeCloseTo(98.0665, 10);
  });
});

describe('lookupUnit unknown and case-sensitive units', () => {
  it('lookupUnit(atm2) and lookupUnit(gal/min) return null', () => {
    // Not in our unit table (a choice of our own: SI and trade units only).
    expect(lookupUnit('atm2')).toBeNull();
    expect(lookupUnit('gal/min')).toBeNull();
  });

  it('lookupUnit(mPa) is not MPa: millipascal is not mistaken for megapascal', () => {
    // BIPM SI Brochure 9th ed. Table 7: m = 1e-3, M = 1e6 — prefixes are case-sensitive.
    expect(lookupUnit('MPa')?.unit.symbol).toBe('MPa');
    expect(lookupUnit('mPa')).toBeNull();
  });

  it('knownUnitsSentence lists every pressure and flow unit', () => {
    const s = knownUnitsSentence();
    for (const u of ['Pa', 'hPa', 'kPa', 'MPa', 'mbar', 'bar', 'psi', 'mmHg', 'Torr', 'inH2O', 'cmH2O', 'mmH2O', 'µL/min', 'µL/h', 'µL/s', 'nL/min', 'nL/s', 'mL/min', 'mL/h', 'L/min', 'm³/s']) {
      expect(s).toContain(u);
    }
  });
});
