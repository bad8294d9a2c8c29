import { describe, expect, it } from 'vitest';
import { parseQuantity, type Dimension } from '../../../src/core/chip/quantity';
import { DISPLAY_UNITS, formatQuantity, fromSi, TRADE_UNITS } from '../../../src/core/units/display';

const rel = (a: number, b: number): number => Math.abs(a / b - 1);
function si(text: string, dim: Dimension): number {
  const q = parseQuantity(text, dim);
  if ('error' in q) throw new Error(q.error);
  return q.value;
}

describe('parseQuantity', () => {
  // physics.md §5 unit conversions (exact or [N]).
  it.each([
    ['1 mbar', 'pressure', 100],
    ['1 kPa', 'pressure', 1000],
    ['1 bar', 'pressure', 1e5],
    ['1 psi', 'pressure', 6894.757293],
    ['1 atm', 'pressure', 101325],
    ['1 mmHg', 'pressure', 133.322], // §5 gives 6 digits [M]; NIST SP 811 (2008) B.8: 1.333224 E+02 Pa confirms them
    ['1 cmH2O', 'pressure', 98.0665],
    ['1 mbar/(uL/min)', 'resistance', 6.0e12],
    ['1 psi/(uL/min)', 'resistance', 4.136854e14],
    ['1 uL/mbar', 'compliance', 1e-11],
    ['1 nL/kPa', 'compliance', 1e-15],
    ['1 uL/psi', 'compliance', 1.450377e-13],
    ['1 mbar/(uL/s)', 'resistance', 100 / 1e-9],
    ['1 mbar/(mL/h)', 'resistance', 100 / 2.777778e-10],
    ['1 mbar/(nL/min)', 'resistance', 100 / 1.666667e-14],
  ] as const)('parseQuantity(%s) matches physics.md §5', (text, dim, value) => {
    // physics.md prints 6–7 significant digits: agreement to 5e-6 relative.
    expect(rel(si(text, dim), value)).toBeLessThan(5e-6);
  });

  it('parseQuantity reads lengths, volumes, temperatures and viscosities in common spellings', () => {
    expect(si('250 um', 'length')).toBeCloseTo(250e-6, 15);
    expect(si('250 µm', 'length')).toBeCloseTo(250e-6, 15);
    expect(si('1.6 mm', 'length')).toBeCloseTo(1.6e-3, 15);
    expect(si('10 cm', 'length')).toBeCloseTo(0.1, 15);
    expect(si('1/16 in', 'length')).toBeCloseTo(1.5875e-3, 15); // 1 in = 25.4 mm exactly
    expect(si('5 uL', 'volume')).toBeCloseTo(5e-9, 20);
    expect(si('2 MPa', 'pressure')).toBe(2e6);
    expect(si('3 bar', 'pressure')).toBe(3e5);
    // T/K = t/°C + 273.15 exactly (BIPM SI Brochure 9th ed. §2.3.1); 1 cP = 1 mPa·s (NIST SP 811 B.8, exact).
    expect(si('22 C', 'temperature')).toBeCloseTo(295.15, 12);
    expect(si('22 °C', 'temperature')).toBeCloseTo(295.15, 12);
    expect(si('300 K', 'temperature')).toBe(300);
    expect(si('1.2 mPa·s', 'viscosity')).toBeCloseTo(1.2e-3, 15);
    expect(si('1.2 cP', 'viscosity')).toBeCloseTo(1.2e-3, 15);
    expect(si('0.46 1/GPa', 'compressibility')).toBeCloseTo(4.6e-10, 20);
    expect(si('1.4e13 Pa s/m3', 'resistance')).toBe(1.4e13);
    expect(si('12e-6', 'length')).toBe(12e-6); // bare numbers are SI
  });

  it('parseQuantity refuses a unit of the wrong kind and milli/mega confusion', () => {
    // Refusals and wording are our own; 'mpa' is refused because m (milli) and M (mega) differ (BIPM Table 7).
    expect(parseQuantity('5 mm', 'pressure')).toEqual({ error: 'unknown pressure unit "mm"' });
    expect(parseQuantity('2 mpa', 'pressure')).toHaveProperty('error');
    expect(parseQuantity('abc', 'length')).toHaveProperty('error');
  });
});

describe('display units', () => {
  it('fromSi converts to the trade units of physics.md §5', () => {
    // 1 mbar/(µL/min) = 6e12 Pa·s/m³; 1 µL/mbar = 1e-11 m³/Pa; 1 nL/mbar = 1 µL/bar = 1e-14 m³/Pa [N].
    expect(fromSi(6e12, TRADE_UNITS.resistance)).toBeCloseTo(1, 12);
    expect(fromSi(1.666667e-11, TRADE_UNITS.flow)).toBeCloseTo(1, 6);
    expect(fromSi(1e-11, DISPLAY_UNITS.compliance['uL/mbar']!)).toBeCloseTo(1, 12);
    expect(fromSi(1e-14, DISPLAY_UNITS.compliance['nL/mbar']!)).toBeCloseTo(1, 12);
    expect(fromSi(1e-14, DISPLAY_UNITS.compliance['uL/bar']!)).toBeCloseTo(1, 12);
    expect(fromSi(1e-15, DISPLAY_UNITS.compliance['nL/kPa']!)).toBeCloseTo(1, 12);
    expect(fromSi(6894.757293, DISPLAY_UNITS.pressure.psi!)).toBeCloseTo(1, 9);
  });

  it('R [mbar/(µL/min)] × C [µL/mbar] is τ in minutes', () => {
    // physics.md §5 [D]: R = 1.4e13 Pa·s/m³, C = 1.4e-13 m³/Pa → τ = 1.96 s.
    const r = fromSi(1.4e13, TRADE_UNITS.resistance);
    const c = fromSi(1.4e-13, DISPLAY_UNITS.compliance['uL/mbar']!);
    expect(r * c * 60).toBeCloseTo(1.4e13 * 1.4e-13, 10);
  });

  it('formatQuantity prints three significant digits with the unit symbol', () => {
    // physics.md §1.6 [N]: 1.4016e13 Pa·s/m³ = 2.336 mbar/(µL/min); §3.3 [N]: 9.869e-14 m³/Pa = 9.87 nL/mbar.
    expect(formatQuantity(1.4016e13, TRADE_UNITS.resistance)).toBe('2.34 mbar/(µL/min)');
    expect(formatQuantity(9.869e-14, TRADE_UNITS.compliance)).toBe('9.87 nL/mbar');
  });
});
