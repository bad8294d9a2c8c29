import { describe, expect, it } from 'vitest';
import { capability, summarize } from '../../../src/core/qc/lot-stats';
import { D2_N2, individualsChart, lotMeans } from '../../../src/core/qc/control-chart';

describe('summarize', () => {
  it('summarize(NIST StRD univariate NumAcc1) gives the certified mean 10000002 and SD 1 (from memory)', () => {
    // NIST StRD univariate NumAcc1 (written from memory; the certified mean 10000002 and SD 1 since confirmed [S]
    // in public test suites of open-source statistics libraries); also by hand: deviations −1, +1, 0
    // from the mean 10000002 → sample variance (1 + 1 + 0)/2 = 1.
    const s = summarize([10000001, 10000003, 10000002]);
    expect(s.mean).toBe(10000002);
    expect(s.sd).toBeCloseTo(1, 12);
  });

  it('summarize ignores non-finite values; one value has no SD', () => {
    // Definition: mean of {1, 3} = 2; a sample SD needs n ≥ 2 (n − 1 in the denominator).
    expect(summarize([1, Number.NaN, 3])).toMatchObject({ n: 2, mean: 2, min: 1, max: 3 });
    expect(summarize([5]).sd).toBeNull();
    expect(summarize([]).mean).toBeNull();
  });
});

describe('capability', () => {
  it('capability([1..5], LSL 0, USL 10) matches the Montgomery §8.3 formulas worked by hand', () => {
    // Derivation: μ = 3, σ = √2.5 = 1.58114; Cp = 10/(6σ) = 1.05409; Cpu = 7/(3σ) = 1.47573;
    // Cpl = 3/(3σ) = 0.632456; Cpk = min = 0.632456.
    const c = capability(summarize([1, 2, 3, 4, 5]), 0, 10);
    expect(c.cp).toBeCloseTo(1.05409, 5);
    expect(c.cpu).toBeCloseTo(1.47573, 5);
    expect(c.cpl).toBeCloseTo(0.632456, 6);
    expect(c.cpk).toBeCloseTo(0.632456, 6);
  });

  it('capability with one limit gives the one-sided ratio as Cpk; σ = 0 gives null', () => {
    // Derivation above: with only the USL, Cpk = Cpu = (10 − 3)/(3·√2.5) = 1.47573; σ = 0 has no ratio.
    const c = capability(summarize([1, 2, 3, 4, 5]), null, 10);
    expect(c.cp).toBeNull();
    expect(c.cpk).toBeCloseTo(1.47573, 5);
    expect(capability(summarize([2, 2, 2]), 0, 10).cpk).toBeNull();
  });
});

describe('individualsChart', () => {
  it('D2_N2 equals the tabulated d₂ = 1.128 for n = 2 (ASTM E2587 / Montgomery appendix table, from memory)', () => {
    // Also by derivation: the mean range of two N(0, σ²) samples is E|X₁ − X₂| = 2σ/√π, so d₂ = 2/√π = 1.12838.
    expect(D2_N2).toBeCloseTo(1.128, 3);
  });

  it('individualsChart([10,12,11,13,12]) has centre 11.6 and limits 11.6 ± 3·MR̄/d₂ (worked by hand)', () => {
    // Moving ranges 2, 1, 2, 1 → MR̄ = 1.5; σ̂ = 1.5/1.12838 = 1.32934; UCL = 15.588, LCL = 7.612.
    const c = individualsChart([10, 12, 11, 13, 12].map((value, k) => ({ label: `c${k}`, group: 'L1', value })));
    expect(c.centre).toBeCloseTo(11.6, 12);
    expect(c.sigma).toBeCloseTo(1.32934, 5);
    expect(c.ucl).toBeCloseTo(15.588, 3);
    expect(c.lcl).toBeCloseTo(7.612, 3);
    expect(c.points.some((p) => p.outOfControl)).toBe(false);
  });

  it('individualsChart flags a point beyond 3σ', () => {
    // Worked by hand: moving ranges sum 5.4 over 8 → MR̄ = 0.675, σ̂ = 0.675/1.12838 = 0.598,
    // centre 10.456 → UCL 12.250, LCL 8.661: only the last point (14) lies outside.
    const values = [10, 10.2, 9.9, 10.1, 10, 9.8, 10.1, 10, 14];
    const c = individualsChart(values.map((value, k) => ({ label: `c${k}`, group: 'L', value })));
    expect(c.points.at(-1)?.outOfControl).toBe(true);
    expect(c.points.slice(0, -1).every((p) => !p.outOfControl)).toBe(true);
  });

  it('lotMeans averages per lot in first-seen order', () => {
    // Definition: lot B = mean(1, 3) = 2, lot A = 4.
    expect(lotMeans([{ group: 'B', value: 1 }, { group: 'A', value: 4 }, { group: 'B', value: 3 }])).toEqual([
      { label: 'B', group: 'B', value: 2 },
      { label: 'A', group: 'A', value: 4 },
    ]);
  });
});
