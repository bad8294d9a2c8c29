import { describe, expect, it } from 'vitest';
import {
  circularResistancePaSPerM3,
  parallelResistance,
  rectangularResistancePaSPerM3,
  rectangularResistanceShahLondonPaSPerM3,
  rectangularShapeFactor,
  resistanceFromFanningPoiseuille,
  seriesResistance,
  shahLondonFanningPoiseuille,
} from '../../../src/core/nominal/resistance';
import { waterViscosityPaS } from '../../../src/core/fluids/water';

const MU20 = 1.0016e-3; // water at 20 °C, physics.md §2.1 [N]
const rel = (a: number, b: number): number => Math.abs(a / b - 1);
const MBAR_PER_UL_MIN = 6e12; // physics.md §5 [N]

describe('circularResistancePaSPerM3', () => {
  // physics.md §1.2 check values, water at 20 °C [N].
  it.each([
    [100e-6, 0.1, 4.0809e13, 6.8],
    [250e-6, 1, 1.0447e13, 1.74],
    [500e-6, 1, 6.529e11, 0.109],
  ])('circularResistancePaSPerM3(ID %s m, L %s m) gives the §1.2 value', (d, l, r, rMbar) => {
    expect(rel(circularResistancePaSPerM3(MU20, d, l), r)).toBeLessThan(1e-4);
    expect(circularResistancePaSPerM3(MU20, d, l) / MBAR_PER_UL_MIN).toBeCloseTo(rMbar, rMbar < 1 ? 3 : 2);
  });

  it('circularResistancePaSPerM3 with the computed 20 °C viscosity agrees with the table too', () => {
    expect(rel(circularResistancePaSPerM3(waterViscosityPaS(293.15), 250e-6, 1), 1.0447e13)).toBeLessThan(1e-4);
  });
});

describe('rectangularShapeFactor', () => {
  // physics.md §1.3 F(α) table [N] (series with 2000 terms), 6 decimals.
  it.each([
    [1, 0.421731],
    [0.5, 0.686045],
    [0.25, 0.842439],
    [0.125, 0.921219],
    [0.05, 0.968488],
    [0, 1],
  ])('rectangularShapeFactor(%s) matches the §1.3 table', (a, f) => {
    expect(Math.abs(rectangularShapeFactor(a) - f)).toBeLessThan(6e-7);
  });

  it('rectangularShapeFactor tends to the parallel-plate value 1 − 0.63025 α as α → 0', () => {
    // physics.md §1.4 [D]: F ≈ 1 − (192/π⁵)(31/32)ζ(5) α = 1 − 0.63025 α for small α.
    expect(rectangularShapeFactor(1e-4)).toBeCloseTo(1 - 0.63025e-4, 9);
    expect(rectangularShapeFactor(1e-9)).toBeCloseTo(1, 8);
  });

  it('rectangularShapeFactor converges as stated: 2e-5 after 5 odd terms, below 1e-7 after 20 at α = 1', () => {
    // physics.md §1.3 [N]: relative error 2e-5 (5 terms), 1e-6 (10), 7e-8 (20).
    const exact = rectangularShapeFactor(1, 2000);
    expect(rel(rectangularShapeFactor(1, 5), exact)).toBeGreaterThan(1e-5);
    expect(rel(rectangularShapeFactor(1, 5), exact)).toBeLessThan(3e-5);
    expect(rel(rectangularShapeFactor(1, 20), exact)).toBeLessThan(1e-7);
  });
});

describe('rectangularResistancePaSPerM3', () => {
  it('rectangularResistancePaSPerM3 of a square channel is 28.454 μL/h⁴', () => {
    // physics.md §1.3 [N] (Bruus 2008 lists 28.4 [M]).
    const h = 50e-6;
    expect(rectangularResistancePaSPerM3(1, h, h, 1) * h ** 4).toBeCloseTo(28.454, 3);
  });

  // physics.md §1.6 check values, water at 20 °C [N]: w, h, L, R exact, mbar/(µL/min), R with (1 − 0.63 h/w).
  it.each([
    [100e-6, 50e-6, 1.4016e13, 2.336, 1.4037e13],
    [50e-6, 50e-6, 4.5599e13, 7.6, 5.1975e13],
    [200e-6, 20e-6, 8.0173e13, 13.36, 8.0171e13],
    [1000e-6, 100e-6, 1.2828e11, 0.02138, 1.2827e11],
    [10e-6, 10e-6, 2.85e16, 4750, 3.2484e16],
  ])('rectangularResistancePaSPerM3(%s × %s m, 10 mm) gives the §1.6 value', (w, h, r, rMbar, rApprox) => {
    const exact = rectangularResistancePaSPerM3(MU20, w, h, 0.01);
    expect(rel(exact, r)).toBeLessThan(1e-4);
    expect(rel(exact / MBAR_PER_UL_MIN, rMbar)).toBeLessThan(5e-4);
    // The compact approximation of §1.4, computed here, reproduces the table's last column.
    expect(rel((12 * MU20 * 0.01) / (w * h ** 3 * (1 - 0.63 * (h / w))), rApprox)).toBeLessThan(1e-4);
  });

  it('rectangularResistancePaSPerM3 does not care which side is called the width', () => {
    // physics.md §1.3 [D]: the series is written for h ≤ w, "swap if needed" — the same rectangle either way.
    expect(rectangularResistancePaSPerM3(MU20, 50e-6, 200e-6, 0.01)).toBe(rectangularResistancePaSPerM3(MU20, 200e-6, 50e-6, 0.01));
  });
});

describe('Shah & London Poiseuille numbers', () => {
  // physics.md §1.5: f_D Re = 96 / ((1 + α)² F(α)) [D, N]; table values 56.908, 62.192, 72.931, 82.339, 96.
  it.each([
    [1, 56.908],
    [0.5, 62.192],
    [0.25, 72.931],
    [0.125, 82.339],
    [0, 96],
  ])('the exact series gives the Darcy Poiseuille number of the §1.5 table at α = %s', (a, fdRe) => {
    expect(96 / ((1 + a) ** 2 * rectangularShapeFactor(a))).toBeCloseTo(fdRe, 2);
  });

  it('shahLondonFanningPoiseuille(1) is 14.227 within 0.1 % (56.91/4 for the square duct)', () => {
    // Shah & London (1978) via physics.md §1.5: 56.91 [S] Darcy = 14.227 Fanning.
    expect(rel(shahLondonFanningPoiseuille(1), 14.227)).toBeLessThan(1e-3);
    expect(shahLondonFanningPoiseuille(0)).toBe(24); // parallel plates, exact: f_D Re = 96 → Fanning 96/4 (physics.md §1.5 table [D])
  });

  it('shahLondonFanningPoiseuille lies above the exact series by at most 0.1 % on (0, 1]', () => {
    // physics.md §1.5 [N]: max deviation 0.063 % near α ≈ 0.92, above the exact value everywhere.
    let worst = 0;
    for (let k = 1; k <= 1000; k++) {
      const a = k / 1000;
      const exactF = 24 / ((1 + a) ** 2 * rectangularShapeFactor(a));
      const dev = shahLondonFanningPoiseuille(a) / exactF - 1;
      expect(dev).toBeGreaterThan(-1e-6);
      worst = Math.max(worst, dev);
    }
    expect(worst).toBeGreaterThan(0.0005);
    expect(worst).toBeLessThan(0.001);
  });

  it('rectangularResistanceShahLondonPaSPerM3 agrees with the exact series within 0.1 %', () => {
    // physics.md §1.5 [N]: Shah & London fit vs exact series, max deviation 0.063 %.
    for (const [w, h] of [[100e-6, 50e-6], [50e-6, 50e-6], [200e-6, 20e-6]] as const) {
      expect(rel(rectangularResistanceShahLondonPaSPerM3(MU20, w, h, 0.01), rectangularResistancePaSPerM3(MU20, w, h, 0.01))).toBeLessThan(1e-3);
    }
  });

  it('resistanceFromFanningPoiseuille(16) of a circle equals Hagen–Poiseuille', () => {
    // physics.md §1.5 [D]: circle f_F Re = 16; A = π a², D_h = 2a.
    const a = 125e-6;
    expect(rel(resistanceFromFanningPoiseuille(16, MU20, Math.PI * a * a, 2 * a, 1), circularResistancePaSPerM3(MU20, 2 * a, 1))).toBeLessThan(1e-12);
  });
});

describe('series and parallel combination', () => {
  // physics.md §1.1 (Kirchhoff analogy) [S].
  it('seriesResistance adds and parallelResistance adds conductances', () => {
    // Arithmetic of §1.1: series 1 + 2 + 3 = 6; parallel 1/(1/2 + 1/2) = 1, 1/(1 + 1/2 + 1/2) = 0.5 (×1e13).
    expect(seriesResistance([1e13, 2e13, 3e13])).toBe(6e13);
    expect(parallelResistance([2e13, 2e13])).toBeCloseTo(1e13, -1);
    expect(parallelResistance([1e13, 2e13, 2e13])).toBeCloseTo(5e12, -1);
  });

  it('parallelResistance with a zero-resistance branch short-circuits the group', () => {
    expect(parallelResistance([0, 1e13])).toBe(0); // §1.1 [D]: an infinite conductance in parallel gives R = 0
  });

  it('R of water changes by about 2.4 % for 1 K near 20 °C', () => {
    // physics.md §1.1 / §2.2e [N].
    const r = (t: number): number => circularResistancePaSPerM3(waterViscosityPaS(t), 250e-6, 1);
    expect(r(292.65) / r(293.65) - 1).toBeGreaterThan(0.023);
    expect(r(292.65) / r(293.65) - 1).toBeLessThan(0.026);
  });
});
