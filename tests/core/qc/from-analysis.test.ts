import { describe, expect, it } from 'vitest';
import type { AnalysisJson, StepJson } from '../../../src/core/analyze/types';
import { combineEstimates } from '../../../src/core/qc/combine';
import { measurementFromAnalysis, nominalComplianceParts, readPhysicsQuantity } from '../../../src/core/qc/from-analysis';
import { modelCurve } from '../../../src/core/qc/step-curves';

function step(index: number, tau: number, se: number, extra: Partial<StepJson> = {}): StepJson {
  return {
    index, start_s: 10 * index, end_s: 10 * index + 10, origin: 'drive', shape: null, direction: 'up',
    drive: { quantity: 'flow_setpoint', channel: 'flow_setpoint_m3_per_s', unit: 'm3_per_s', before: 0, after: 1e-10 },
    response: { quantity: 'pressure', channel: 'pressure_Pa', unit: 'Pa' }, n_samples: 100,
    terms: [{ tau_s: tau, tau_se_s: se, tau_ci95_s: [tau - 1.96 * se, tau + 1.96 * se], amplitude: -1000, amplitude_se: 1, amplitude_ci95: [-1002, -998] }],
    y_inf: 1000, y_inf_se: 1, y_inf_ci95: [998, 1002], dead_time_s: null, dead_time_se_s: null, dead_time_ci95_s: null,
    drift_per_s: null, drift_ci95_per_s: null, settled: true, window_in_taus: 5, t63_s: tau, t95_s: tau * Math.log(20), t99_s: tau * Math.log(100),
    fit: { model: { terms: 1, dead_time: false, drift: false, robust: 'none' }, rmse: 1, r2: 0.999, converged: true, stop_reason: 'ok', iterations: 5, n: 100, dof: 97, noise_sigma: 1, residual_lag1: 0, runs_z: 0, flags: [], order_selection: null, parameter_names: [], correlation: [], samples_per_point: 1 },
    inconclusive: false, warnings: [], ...extra,
  };
}
const analysis = (steps: StepJson[]): AnalysisJson => ({
  software: { name: 'lagbench', version: '0' }, files: ['x.csv'], setup: 'flow-driven', setup_reason: 'given',
  detection: { origin: 'drive', channel: null, quantity: 'flow_setpoint', unit: 'm3_per_s', min_step_size: null, min_dwell_s: null },
  noise_sigma: { response: 1, response_unit: 'Pa', detection: 1, detection_unit: 'm3_per_s' }, steps, ramps: [], shared_fits: [], warnings: [],
});

describe('combineEstimates', () => {
  it('combineEstimates(consistent steps) is the inverse-variance mean with SE 1/√Σw (derivation)', () => {
    // w = 1/0.1² = 100 and 1/0.2² = 25: mean = (100·3 + 25·3.1)/125 = 3.02, SE = 1/√125 = 0.0894427.
    const c = combineEstimates([{ value: 3, standardError: 0.1, ci95: null }, { value: 3.1, standardError: 0.2, ci95: null }])!;
    expect(c.value).toBeCloseTo(3.02, 12);
    expect(c.standardError).toBeCloseTo(0.0894427, 6);
    expect(c.ci95![1] - c.value).toBeCloseTo(1.959964 * 0.0894427, 5); // z₀.₉₇₅ = 1.959964 (normal table)
  });

  it('combineEstimates(scattered steps) inflates the SE by the Birge ratio and uses t with n − 1 dof', () => {
    // Birge ratio S = √(χ²/(n − 1)) (R. T. Birge, Phys. Rev. 40, 207 (1932), from memory).
    // Two values 3 ± 0.01 and 4 ± 0.01: χ² = 2·(0.5/0.01)² = 5000, S = √5000 = 70.71; SE = 0.01/√2·S = 0.5.
    const c = combineEstimates([{ value: 3, standardError: 0.01, ci95: null }, { value: 4, standardError: 0.01, ci95: null }])!;
    expect(c.value).toBeCloseTo(3.5, 12);
    expect(c.standardError).toBeCloseTo(0.5, 9);
    // t₀.₉₇₅ with 1 dof = 12.706 (Student-t table).
    expect(c.ci95![1] - 3.5).toBeCloseTo(12.706 * 0.5, 2);
  });
});

describe('measurementFromAnalysis', () => {
  it('measurementFromAnalysis combines τ over usable steps, leaves inconclusive steps out, takes the worst t₉₅', () => {
    const m = measurementFromAnalysis(analysis([step(0, 3, 0.1), step(1, 3.1, 0.2), step(2, 9, 0.1, { inconclusive: true })]), 'C1');
    expect(m.quantities.tau?.value).toBeCloseTo(3.02, 12);
    // t₉₅ = τ·ln 20 for one exponential (derivation: 1 − e^(−t/τ) = 0.95).
    expect(m.quantities.t95?.value).toBeCloseTo(3.1 * Math.log(20), 12);
    expect(m.quantities.t95?.ci95?.[0]).toBeCloseTo((3.1 - 1.96 * 0.2) * Math.log(20), 9);
    expect(m.inconclusive).toEqual([]);
    expect(m.warnings.some((w) => /Step 3 .* inconclusive/.test(w))).toBe(true);
    expect(m.fit).toEqual({ converged: true, r2: 0.999, flags: [] });
  });

  it('measurementFromAnalysis(no steps / all inconclusive) marks the whole chip inconclusive', () => {
    // Behaviour of our own (docs/qc-spec.md): nothing to combine → inconclusive, never a silent pass.
    expect(measurementFromAnalysis(analysis([]), 'C').inconclusive[0]?.reason).toMatch(/no setpoint steps/);
    expect(measurementFromAnalysis(analysis([step(0, 3, 0.1, { inconclusive: true })]), 'C').inconclusive[0]?.reason).toMatch(/none of the 1 step/);
  });

  it('measurementFromAnalysis reads R, C, excess compliance and trapped air from the physics stage', () => {
    const fields = {
      resistance_Pa_s_per_m3: 3e13, resistance_ci95: [2.9e13, 3.1e13], compliance_m3_per_Pa: 1e-13, compliance_ci95: [0.98e-13, 1.02e-13],
      physics: { resistance_inconclusive: false, compliance_se: 1e-15, compliance_inconclusive: false, excess_compliance_m3_per_Pa: 2e-14, excess_compliance_ci95: [1e-14, 3e-14] },
    };
    const a = { ...analysis([step(0, 3, 0.1, fields as Partial<StepJson>)]), trapped_air: { volume_m3_at_atm: 2e-9, ci95: [1.5e-9, 2.5e-9], method: 'excess-compliance', statement: 'gas found' } };
    const m = measurementFromAnalysis(a, 'C');
    // Expected values are the inputs above, passed through unchanged.
    expect(m.quantities.resistance).toMatchObject({ value: 3e13, ci95: [2.9e13, 3.1e13] });
    // SE from the CI half-width / z₀.₉₇₅ (1.959964, normal table) when the SE is not given.
    expect(m.quantities.resistance?.standardError).toBeCloseTo(0.1e13 / 1.959964, -6);
    expect(m.quantities.compliance?.standardError).toBe(1e-15);
    expect(m.quantities.excess_compliance?.ci95).toEqual([1e-14, 3e-14]);
    expect(m.quantities.trapped_air).toMatchObject({ value: 2e-9, ci95: [1.5e-9, 2.5e-9] });
  });

  it('measurementFromAnalysis(R marked inconclusive by the physics) leaves R out and marks it inconclusive', () => {
    const fields = { resistance_Pa_s_per_m3: 3e13, resistance_ci95: [1e13, 5e13], physics: { resistance_inconclusive: true } };
    const m = measurementFromAnalysis(analysis([step(0, 3, 0.1, fields as Partial<StepJson>)]), 'C');
    expect(m.quantities.resistance).toBeUndefined();
    expect(m.inconclusive).toEqual([{ quantity: 'resistance', reason: expect.stringMatching(/inconclusive/) }]);
    expect(readPhysicsQuantity([undefined], 'resistance', 'Pa_s_per_m3')).toEqual({ value: null, inconclusive: false });
  });

  it('modelCurve evaluates y∞ + a·exp(−t/τ) from the step parameters', () => {
    // Derivation: step() has y∞ = 1000, a = −1000; τ = 2 s → y(0) = 0, y(2 s) = 1000·(1 − e⁻¹).
    const y = modelCurve(step(0, 2, 0.1), [0, 2])!;
    expect(y[0]).toBeCloseTo(0, 9);
    expect(y[1]).toBeCloseTo(1000 - 1000 * Math.exp(-1), 9);
  });
});

describe('nominalComplianceParts', () => {
  it('nominalComplianceParts reads the nominal ranges of the physics stage, counted parts only', () => {
    const a = {
      ...analysis([]),
      nominal: {
        compliance_m3_per_Pa: { low: 0.5e-13, nominal: 1e-13, high: 2e-13 },
        breakdown: [
          { element: 'tubing', source: 'walls', compliance_m3_per_Pa: { low: 1, nominal: 6e-14, high: 1 }, counted: true },
          { element: 'chip', source: 'walls', compliance_m3_per_Pa: { low: 1, nominal: 4e-14, high: 1 }, counted: true },
          { element: 'syringe', source: 'plunger', compliance_m3_per_Pa: { low: 1, nominal: 9e-14, high: 1 }, counted: false },
        ],
      },
    };
    // Expected values are the counted inputs above (the syringe part is not counted).
    expect(nominalComplianceParts(a)).toEqual({ parts: [{ label: 'tubing: walls', complianceM3PerPa: 6e-14 }, { label: 'chip: walls', complianceM3PerPa: 4e-14 }], totalM3PerPa: 1e-13 });
    expect(nominalComplianceParts(analysis([]))).toBeNull();
  });
});
