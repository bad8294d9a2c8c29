import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { glycerolWaterViscosityPaS } from '../../../src/core/fluids/glycerol-water';
import { resolveFluid } from '../../../src/core/fluids/presets';
import { waterViscosityPaS } from '../../../src/core/fluids/water';

const K = (c: number): number => c + 273.15;

describe('glycerolWaterViscosityPaS', () => {
  // Cheng (2008) formula, check values of physics.md §2.4 [N], mPa·s.
  const fractions = [0, 0.2, 0.4, 0.5, 0.6, 0.8, 0.9, 1.0];
  const at20 = [1.0049, 1.7414, 3.6848, 6.0023, 10.912, 60.859, 223.75, 1413.8];
  const at25 = [0.8927, 1.5245, 3.1372, 5.0037, 8.848, 45.35, 156.35, 905.68];
  it.each(fractions.map((cm, i) => [cm, at20[i], at25[i]]))('glycerolWaterViscosityPaS(%s) matches the Cheng table at 20 and 25 °C', (cm, mu20, mu25) => {
    expect(Math.abs(glycerolWaterViscosityPaS(cm as number, 20) * 1e3 / (mu20 as number) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(glycerolWaterViscosityPaS(cm as number, 25) * 1e3 / (mu25 as number) - 1)).toBeLessThan(1e-4);
  });
});

describe('resolveFluid', () => {
  it('resolveFluid(water) brackets the viscosity by the temperature tolerance', () => {
    const f = resolveFluid({ kind: 'preset', preset: 'water', temperatureK: K(20), temperatureToleranceK: 1 });
    // Colder water is more viscous (physics.md §2.2e: −2.45 %/K at 20 °C).
    expect(f.viscosityPaS.nominal).toBeCloseTo(waterViscosityPaS(K(20)), 12);
    expect(f.viscosityPaS.high).toBeCloseTo(waterViscosityPaS(K(19)), 12);
    expect(f.viscosityPaS.low).toBeCloseTo(waterViscosityPaS(K(21)), 12);
    expect(f.viscosityPaS.high / f.viscosityPaS.nominal - 1).toBeGreaterThan(0.02);
    expect(f.vapourPressurePa).toBeCloseTo(2339, -1); // physics.md §2.2f [N]: 2.339 kPa at 20 °C (IAPWS-IF97)
  });

  it('resolveFluid(ethanol at 25 °C) gives 1.074 mPa·s', () => {
    // physics.md §2.3: 1.074 mPa·s at 25 °C, CRC-derived list [S].
    const f = resolveFluid({ kind: 'preset', preset: 'ethanol', temperatureK: K(25), temperatureToleranceK: 0 });
    expect(f.viscosityPaS.nominal * 1e3).toBeCloseTo(1.074, 6);
    expect(f.compressibilityTag).toBe('M');
  });

  it('resolveFluid(glycerol-water 50 %) uses the Cheng formula', () => {
    const f = resolveFluid({ kind: 'preset', preset: 'glycerol-water', glycerolMassFraction: 0.5, temperatureK: K(20), temperatureToleranceK: 0 });
    // physics.md §2.4: 6.0023 mPa·s [N]; classic tables about 6.0 [M].
    expect(f.viscosityPaS.nominal * 1e3).toBeCloseTo(6.0023, 3);
  });

  it('resolveFluid(culture medium with serum) carries a wide [M] range and a shear-thinning note', () => {
    const f = resolveFluid({ kind: 'preset', preset: 'culture-medium-serum', temperatureK: K(37), temperatureToleranceK: 0 });
    // physics.md §2.3: serum medium numbers [M], shear-thinning per Sints et al. (2024) [S]; the > 1.2 width is
    // a sanity bound of our own (common practice, no source).
    expect(f.viscosityTag).toBe('M');
    expect(f.viscosityPaS.high / f.viscosityPaS.low).toBeGreaterThan(1.2);
    expect(f.notes.join(' ')).toMatch(/shear-thinning/);
  });

  it('resolveFluid(custom without compressibility) falls back to water with a note', () => {
    const f = resolveFluid({ kind: 'custom', name: 'oil', temperatureK: K(20), viscosityPaS: 0.02, viscosityRelativeUncertainty: 0.1, compressibilityRelativeUncertainty: 0.1 });
    // Derivation: 0.02 Pa·s ± 10 % → 0.018 / 0.022; water fallback κ_T(20 °C) = 4.5892e-10 /Pa, physics.md §2.2c [N].
    expect(f.viscosityPaS.low).toBeCloseTo(0.018, 12);
    expect(f.viscosityPaS.nominal).toBe(0.02);
    expect(f.viscosityPaS.high).toBeCloseTo(0.022, 12);
    expect(f.compressibilityPerPa.nominal).toBeCloseTo(4.5892e-10, 14);
    expect(f.notes.join(' ')).toMatch(/No compressibility given/);
  });

  it('resolveFluid(isopropanol at 50 °C) throws an InputError naming the valid range', () => {
    // The 15–30 °C range is the preset's own validity window (physics.md §2.3 gives values only at 20/25 °C [M]).
    expect(() => resolveFluid({ kind: 'preset', preset: 'isopropanol', temperatureK: K(50), temperatureToleranceK: 0 })).toThrow(InputError);
    expect(() => resolveFluid({ kind: 'preset', preset: 'isopropanol', temperatureK: K(50), temperatureToleranceK: 0 })).toThrow(/15–30 °C/);
  });
});
