import { describe, expect, it } from 'vitest';
import { parseQcSpec } from '../../../src/core/qc/spec';
import type { ChipMeasurement, QcQuantity } from '../../../src/core/qc/types';
import { classifyInterval, combineVerdicts, evaluateChip, evaluateLimit, VERDICT_RULE } from '../../../src/core/qc/verdict';

// The decision rule under test is our own (docs/qc-spec.md): limits inclusive (common practice, no source);
// pass = whole CI inside, fail = whole CI outside, otherwise inconclusive. The same three zones appear in
// JCGM 106:2012 and ISO 14253-1 (conformity decisions with measurement uncertainty) — from memory.
// Numbers below are test inputs chosen around the spec limits, not reference values.

describe('classifyInterval', () => {
  const L = 10;
  const U = 20;
  it.each([
    ['well inside', 12, 18, 'pass'],
    ['touching the lower limit from inside', 10, 15, 'pass'],
    ['touching the upper limit from inside', 15, 20, 'pass'],
    ['exactly the limits', 10, 20, 'pass'],
    ['straddling the lower limit', 9.999, 15, 'inconclusive'],
    ['straddling the upper limit', 15, 20.001, 'inconclusive'],
    ['wider than both limits', 5, 25, 'inconclusive'],
    ['touching the lower limit from outside', 8, 10, 'inconclusive'],
    ['touching the upper limit from outside', 20, 22, 'inconclusive'],
    ['just below the lower limit', 8, 9.999, 'fail'],
    ['just above the upper limit', 20.001, 22, 'fail'],
  ])('classifyInterval(%s) → %s', (_name, lo, hi, want) => {
    expect(classifyInterval(lo as number, hi as number, L, U)).toBe(want);
  });

  it('classifyInterval with one-sided limits ignores the missing side', () => {
    expect(classifyInterval(-1e9, 4, null, 5)).toBe('pass');
    expect(classifyInterval(5, 6, null, 5)).toBe('inconclusive');
    expect(classifyInterval(5.0001, 6, null, 5)).toBe('fail');
    expect(classifyInterval(3, 1e30, 3, null)).toBe('pass');
    expect(classifyInterval(1, 2.9, 3, null)).toBe('fail');
  });

  it('classifyInterval(non-finite or reversed CI) → inconclusive', () => {
    expect(classifyInterval(Number.NaN, 1, 0, 2)).toBe('inconclusive');
    expect(classifyInterval(1, Infinity, 0, 2)).toBe('inconclusive');
    expect(classifyInterval(1.5, 1, 0, 2)).toBe('inconclusive');
  });
});

const SPEC = parseQcSpec(`{
  "lagbench_qc_spec": 1,
  "design": { "name": "M2" },
  "test": { "setup": "bench", "program": "steps" },
  "limits": {
    "resistance": { "unit": "Pa_s_per_m3", "nominal": 2.0e13, "tolerance_percent": 10 },
    "compliance": { "unit": "m3_per_Pa", "max": 5e-14 },
    "excess_compliance": { "unit": "nL_per_kPa", "max": 20 },
    "trapped_air": { "unit": "nL", "max": 50 },
    "tau": { "unit": "s", "min": 0.1, "max": 5 },
    "t95": { "unit": "s", "max": 15 }
  },
  "fit_quality": { "require_converged": true, "min_r2": 0.99, "reject_flags": ["residual-structure"] },
  "inconclusive_counts_as": "retest"
}`);

/** Values comfortably inside every limit above (SI; nL = 1e-12 m³, nL/kPa = 1e-15 m³/Pa). */
function goodChip(): ChipMeasurement {
  // 1.96 = z₀.₉₇₅ of the standard normal (NIST/SEMATECH e-Handbook §1.3.6.7.1), so SE = half-width/1.96.
  const mv = (value: number, half: number) => ({ value, standardError: half / 1.96, ci95: [value - half, value + half] as [number, number] });
  return {
    chipId: 'M2-001',
    quantities: {
      resistance: mv(2.0e13, 0.05e13),
      compliance: mv(3e-14, 0.2e-14),
      excess_compliance: mv(5e-15, 2e-15),
      trapped_air: mv(10e-12, 5e-12),
      tau: mv(0.6, 0.05),
      t95: mv(1.8, 0.15),
    },
    fit: { converged: true, r2: 0.998, flags: [] },
    inconclusive: [],
    warnings: [],
  };
}

/** A limit's [lower, upper] in SI. */
const lim = (q: QcQuantity) => SPEC.limits.find((l) => l.quantity === q)!;

describe('evaluateLimit at and around each limit', () => {
  const cases: [QcQuantity, 'lower' | 'upper'][] = [
    ['resistance', 'lower'], ['resistance', 'upper'], ['compliance', 'upper'], ['excess_compliance', 'upper'],
    ['trapped_air', 'upper'], ['tau', 'lower'], ['tau', 'upper'], ['t95', 'upper'],
  ];
  for (const [q, side] of cases) {
    it(`evaluateLimit(${q}, CI at the ${side} limit): inside-touching passes, straddling is inconclusive, outside fails`, () => {
      const limit = lim(q);
      const edge = (side === 'lower' ? limit.lowerSi : limit.upperSi)!;
      const w = Math.abs(edge) * 0.01;
      const sign = side === 'lower' ? 1 : -1; // direction pointing into the limit band
      const at = (lo: number, hi: number) => {
        const m = goodChip();
        m.quantities[q] = { value: (lo + hi) / 2, standardError: (hi - lo) / 3.92, ci95: [lo, hi] }; // 3.92 = 2 × z₀.₉₇₅
        return evaluateLimit(limit, m);
      };
      const inside = sign > 0 ? at(edge, edge + w) : at(edge - w, edge);
      const straddle = at(edge - w / 2, edge + w / 2);
      const outside = sign > 0 ? at(edge - w, edge - w / 1e3) : at(edge + w / 1e3, edge + w);
      const touchingOutside = sign > 0 ? at(edge - w, edge) : at(edge, edge + w);
      expect(inside.verdict).toBe('pass');
      expect(straddle.verdict).toBe('inconclusive');
      expect(outside.verdict).toBe('fail');
      expect(touchingOutside.verdict).toBe('inconclusive');
      expect(outside.reason).toMatch(/95 % CI \[/);
      expect(outside.reason).toMatch(/→ fail\.$/);
    });
  }

  it('evaluateLimit(missing measurement or missing CI) → inconclusive with the reason', () => {
    const m = goodChip();
    delete m.quantities.trapped_air;
    expect(evaluateLimit(lim('trapped_air'), m)).toMatchObject({ verdict: 'inconclusive', value: null });
    const m2 = goodChip();
    m2.quantities.t95 = { value: 1, standardError: null, ci95: null };
    const r = evaluateLimit(lim('t95'), m2);
    expect(r.verdict).toBe('inconclusive');
    expect(r.reason).toMatch(/without a confidence interval/);
  });

  it('evaluateLimit(quantity the analysis marked inconclusive) → inconclusive even with a narrow CI inside', () => {
    const m = goodChip();
    m.inconclusive.push({ quantity: 'tau', reason: 'window shorter than 2 τ' });
    expect(evaluateLimit(lim('tau'), m).verdict).toBe('inconclusive');
  });

  it('evaluateLimit reports value, CI and limit in the spec unit (nL here)', () => {
    const m = goodChip();
    m.quantities.trapped_air = { value: 80e-12, standardError: 5e-12, ci95: [70e-12, 90e-12] };
    const r = evaluateLimit(lim('trapped_air'), m);
    // 80e-12 m³ = 80 nL (1 nL = 1e-12 m³, BIPM SI Brochure 9th ed. Table 8); wording is docs/qc-spec.md's.
    expect(r.verdict).toBe('fail');
    expect(r.reason).toBe('Trapped-air volume = 80 nL, 95 % CI [70, 90] nL; limit ≤ 50 nL; whole CI outside the limit → fail.');
  });
});

describe('evaluateChip', () => {
  it('evaluateChip(good chip) passes every check', () => {
    const e = evaluateChip(SPEC, goodChip());
    expect(e.verdict).toBe('pass');
    expect(e.disposition).toBe('pass');
    expect(e.results.every((r) => r.verdict === 'pass')).toBe(true);
    expect(e.results.map((r) => r.check)).toEqual(['resistance', 'compliance', 'excess_compliance', 'trapped_air', 'tau', 't95', 'fit.converged', 'fit.r2', 'fit.flag.residual-structure']);
    expect(e.rule).toBe(VERDICT_RULE);
  });

  it('evaluateChip: fail beats inconclusive; inconclusive maps to the spec disposition (retest)', () => {
    const m = goodChip();
    m.quantities.t95 = { value: 30, standardError: 1, ci95: [28, 32] };
    m.fit = { converged: false, r2: 0.9, flags: ['residual-structure'] };
    expect(evaluateChip(SPEC, m).verdict).toBe('fail');
    const m2 = goodChip();
    m2.fit = { converged: false, r2: 0.999, flags: [] };
    const e2 = evaluateChip(SPEC, m2);
    expect(e2.verdict).toBe('inconclusive');
    expect(e2.disposition).toBe('retest');
  });

  it('evaluateChip: r² exactly at min_r2 passes, just below is a violation; a rejected flag too', () => {
    const m = goodChip();
    m.fit = { converged: true, r2: 0.99, flags: [] };
    expect(evaluateChip(SPEC, m).verdict).toBe('pass');
    m.fit = { converged: true, r2: 0.98999, flags: [] };
    expect(evaluateChip(SPEC, m).verdict).toBe('inconclusive');
    m.fit = { converged: true, r2: 0.999, flags: ['residual-structure'] };
    expect(evaluateChip(SPEC, m).results.find((r) => r.check === 'fit.flag.residual-structure')?.verdict).toBe('inconclusive');
  });

  it('evaluateChip(on_violation "fail") fails a non-converged fit; no fit at all is inconclusive', () => {
    const strict = { ...SPEC, fitQuality: { ...SPEC.fitQuality, onViolation: 'fail' as const } };
    const m = goodChip();
    m.fit = { converged: false, r2: 0.999, flags: [] };
    expect(evaluateChip(strict, m).verdict).toBe('fail');
    m.fit = null;
    expect(evaluateChip(strict, m).verdict).toBe('inconclusive');
  });

  it('evaluateChip(chip-wide inconclusive marker) adds an analysis check', () => {
    const m = goodChip();
    m.inconclusive.push({ reason: 'no steps found' });
    const e = evaluateChip(SPEC, m);
    expect(e.verdict).toBe('inconclusive');
    expect(e.results.at(-1)?.check).toBe('analysis');
  });

  it('combineVerdicts follows fail > inconclusive > pass; none → inconclusive', () => {
    expect(combineVerdicts(['pass', 'inconclusive', 'fail'])).toBe('fail');
    expect(combineVerdicts(['pass', 'inconclusive'])).toBe('inconclusive');
    expect(combineVerdicts(['pass', 'pass'])).toBe('pass');
    expect(combineVerdicts([])).toBe('inconclusive');
  });
});
