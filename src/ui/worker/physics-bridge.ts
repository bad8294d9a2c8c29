/**
 * The physics the app shows, all computed by the core: R and C per step (src/core/circuits), the
 * nominal prediction from a chip description (src/core/chip, src/core/nominal), and — when
 * src/core/bubbles lands — the trapped-air estimate and the pressure fingerprint. Missing pieces
 * are reported as "not available yet" with the reason, never approximated here.
 */
import type { Warning } from '../../core/errors';
import { InputError } from '../../core/errors';
import type { TransientFit } from '../../core/fit/types';
import type { Quantity } from '../../core/recording/types';
import type { Setup, Step } from '../../core/steps/types';
import { estimateFlowDriven, estimatePressureDriven } from '../../core/circuits';
import type { PhysicalEstimate } from '../../core/circuits';
import { parseChipDescription } from '../../core/chip';
import { predictNominal } from '../../core/nominal';
import type { Capabilities, ComplianceSource, FingerprintView, NominalView, ShownEstimate, StepFitView, TrappedAirView } from './protocol';

/** Standard atmosphere, Pa (ISO 2533; used only when no chip description gives the ambient pressure). */
export const STANDARD_ATMOSPHERE_PA = 101_325;

export function capabilitiesOfPhysics(): Pick<Capabilities, 'circuits' | 'chip' | 'nominal' | 'trappedAir' | 'fingerprint'> {
  return { circuits: true, chip: true, nominal: true, trappedAir: false, fingerprint: false };
}

const shown = (e: PhysicalEstimate | null | undefined): ShownEstimate | null => (e ? { value: e.value, ci95: e.ci95, inconclusive: e.inconclusive } : null);

export interface StepPhysics {
  resistance: ShownEstimate | null;
  compliance: ShownEstimate | null;
  pressureAbsPa: number | null;
  notes: string[];
  warnings: Warning[];
}

/** R and C of one step from its fit (core/circuits), for the setup the user chose. */
export function stepPhysics(setup: Setup, step: Step, fit: TransientFit, responseQuantity: Quantity, ambientPa = STANDARD_ATMOSPHERE_PA): StepPhysics | null {
  const before = step.drive.before;
  const after = step.drive.after;
  if (!Number.isFinite(before) || !Number.isFinite(after)) return null;
  try {
    if (setup === 'flow-driven' && responseQuantity === 'pressure') {
      const est = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: before, flowAfterM3PerS: after });
      const start = fit.yInf.value + fit.terms.reduce((s, t) => s + t.amplitude.value, 0);
      return {
        resistance: shown(est.resistancePaSPerM3),
        compliance: shown(est.complianceM3PerPa),
        // The node's mean gauge pressure over the step (start and end plateaus), made absolute.
        pressureAbsPa: (start + fit.yInf.value) / 2 + ambientPa,
        notes: est.notes,
        warnings: est.warnings,
      };
    }
    if (setup === 'pressure-driven' && responseQuantity === 'flow') {
      const est = estimatePressureDriven({ flowFit: fit, sensor: 'outlet', pressureBeforePa: before, pressureAfterPa: after });
      return {
        resistance: shown(est.resistancePaSPerM3),
        compliance: shown(est.complianceM3PerPa),
        pressureAbsPa: null,
        notes: ['Flow sensor taken as downstream of the chip (outlet).', ...est.notes],
        warnings: est.warnings,
      };
    }
  } catch (err) {
    if (err instanceof InputError) return { resistance: null, compliance: null, pressureAbsPa: null, notes: [], warnings: [{ code: err.code, message: err.message }] };
    throw err;
  }
  return null;
}

/** Inverse-variance weighted mean of the per-step compliances (95 % CI from the pooled SE, normal). */
function pooledCompliance(fits: StepFitView[]): ShownEstimate | null {
  let w = 0;
  let wx = 0;
  for (const f of fits) {
    const c = f.complianceM3PerPa;
    if (!c || c.inconclusive || !Number.isFinite(c.value)) continue;
    const se = (c.ci95[1] - c.ci95[0]) / (2 * 1.959964);
    if (!(se > 0)) continue;
    w += 1 / (se * se);
    wx += c.value / (se * se);
  }
  if (w === 0) return null;
  const mean = wx / w;
  const se = Math.sqrt(1 / w);
  // 1.959964 = 97.5 % quantile of the standard normal (Abramowitz & Stegun 1964, table 26.5).
  return { value: mean, ci95: [mean - 1.959964 * se, mean + 1.959964 * se] };
}

const SOURCE_LABEL: Record<string, string> = {
  liquid: 'liquid',
  'tubing-wall': 'tubing walls',
  'channel-wall': 'channel walls',
  syringe: 'syringe',
  gas: 'gas headspace',
  measured: 'measured extras',
};

export interface Diagnosis {
  fittedComplianceM3PerPa: ShownEstimate | null;
  nominal: NominalView | null;
  nominalNote: string | null;
  fingerprint: FingerprintView | null;
  fingerprintNote: string | null;
  trappedAir: TrappedAirView | null;
  trappedAirNote: string | null;
}

export function computeDiagnosis(setup: Setup, fits: StepFitView[], chipText: string | null, chipName: string | null): Diagnosis {
  const fitted = pooledCompliance(fits);
  let nominal: NominalView | null = null;
  let nominalNote: string | null = null;
  if (chipText === null) {
    nominalNote = 'No chip description loaded: load one to compare the fitted compliance with what the design should give.';
  } else {
    try {
      const chip = parseChipDescription(chipText, chipName ?? 'chip.json');
      const p = predictNominal(chip, setup);
      const bySource = new Map<string, ComplianceSource>();
      for (const item of p.compliance.breakdown) {
        if (!item.counted) continue;
        const label = SOURCE_LABEL[item.source] ?? item.source;
        const prev = bySource.get(label);
        const r = item.complianceM3PerPa;
        if (prev) {
          prev.valueM3PerPa += r.nominal;
          if (prev.rangeM3PerPa) prev.rangeM3PerPa = [prev.rangeM3PerPa[0] + r.low, prev.rangeM3PerPa[1] + r.high];
        } else bySource.set(label, { source: label, valueM3PerPa: r.nominal, rangeM3PerPa: [r.low, r.high] });
      }
      nominal = {
        resistancePaSPerM3: p.resistance.totalPaSPerM3.nominal,
        complianceM3PerPa: p.compliance.totalM3PerPa.nominal,
        complianceRangeM3PerPa: [p.compliance.totalM3PerPa.low, p.compliance.totalM3PerPa.high],
        breakdown: [...bySource.values()],
        tauS: p.tauS.nominal,
        notes: [...p.notes, ...p.warnings.map((w) => w.message)],
      };
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      nominalNote = `The chip description could not be read: ${err.message}`;
    }
  }
  return {
    fittedComplianceM3PerPa: fitted,
    nominal,
    nominalNote,
    fingerprint: null,
    fingerprintNote: 'The pressure fingerprint (C against 1/p_abs²) is not available yet: the trapped-air module (src/core/bubbles) has not landed in this build.',
    trappedAir: null,
    trappedAirNote: 'The trapped-air estimate is not available yet: the trapped-air module (src/core/bubbles) has not landed in this build.',
  };
}
