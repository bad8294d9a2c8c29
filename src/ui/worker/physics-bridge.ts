/**
 * The physics the app shows, all computed by the core: the analysis's physics stage
 * (src/core/analyze/physics.ts: R and C per step, trapped air), the nominal prediction with its
 * breakdown (src/core/nominal) and the pressure fingerprint line (src/core/bubbles) for the plot.
 * This file only maps core results to the view models.
 */
import { combineEstimates } from '../../core/qc/combine';
import { InputError, type Warning } from '../../core/errors';
import type { AnalysisJson } from '../../core/analyze/types';
import { addPhysics, STANDARD_ATMOSPHERE_PA, type AnalysisWithPhysicsJson } from '../../core/analyze/physics';
import type { Recording } from '../../core/recording/types';
import type { Setup } from '../../core/steps/types';
import { parseChipDescription } from '../../core/chip';
import type { ChipDescription } from '../../core/chip';
import { predictNominal } from '../../core/nominal';
import { pressureFingerprint } from '../../core/bubbles';
import type { Capabilities, ComplianceSource, FingerprintView, NominalView, ShownEstimate, TrappedAirView } from './protocol';

export function capabilitiesOfPhysics(): Pick<Capabilities, 'circuits' | 'chip' | 'nominal' | 'trappedAir' | 'fingerprint'> {
  return { circuits: true, chip: true, nominal: true, trappedAir: true, fingerprint: true };
}

const SOURCE_LABEL: Record<string, string> = {
  liquid: 'liquid',
  'tubing-wall': 'tubing walls',
  'channel-wall': 'channel walls',
  syringe: 'syringe',
  gas: 'gas headspace',
  measured: 'measured extras',
};

export interface StepPhysicsView {
  resistance: ShownEstimate | null;
  compliance: ShownEstimate | null;
  complianceSe: number | null;
  pressureAbsPa: number | null;
  notes: string[];
}

export interface PhysicsResult {
  json: AnalysisWithPhysicsJson;
  steps: StepPhysicsView[];
  fittedComplianceM3PerPa: ShownEstimate | null;
  nominal: NominalView | null;
  nominalNote: string | null;
  fingerprint: FingerprintView | null;
  fingerprintNote: string | null;
  trappedAir: TrappedAirView | null;
  trappedAirNote: string | null;
  warnings: Warning[];
}

const finite = (x: number | null | undefined): x is number => typeof x === 'number' && Number.isFinite(x);

function estimate(value: number | null, ci: [number | null, number | null], inconclusive: unknown): ShownEstimate | null {
  if (!finite(value)) return null;
  return { value, ci95: [ci[0] ?? Number.NaN, ci[1] ?? Number.NaN], inconclusive: inconclusive === true };
}

function nominalView(chip: ChipDescription, setup: Setup): NominalView {
  const p = predictNominal(chip, setup);
  const bySource = new Map<string, ComplianceSource>();
  for (const item of p.compliance.breakdown) {
    if (!item.counted) continue;
    const label = SOURCE_LABEL[item.source] ?? item.source;
    const r = item.complianceM3PerPa;
    const prev = bySource.get(label);
    if (prev) {
      prev.valueM3PerPa += r.nominal;
      if (prev.rangeM3PerPa) prev.rangeM3PerPa = [prev.rangeM3PerPa[0] + r.low, prev.rangeM3PerPa[1] + r.high];
    } else bySource.set(label, { source: label, valueM3PerPa: r.nominal, rangeM3PerPa: [r.low, r.high] });
  }
  return {
    resistancePaSPerM3: p.resistance.totalPaSPerM3.nominal,
    complianceM3PerPa: p.compliance.totalM3PerPa.nominal,
    complianceRangeM3PerPa: [p.compliance.totalM3PerPa.low, p.compliance.totalM3PerPa.high],
    breakdown: [...bySource.values()],
    tauS: p.tauS.nominal,
    notes: [...p.notes, ...p.warnings.map((w) => w.message)],
  };
}

/** Runs the core's physics stage on an analysis and maps it for the views. */
export function runPhysics(analysis: AnalysisJson, recording: Recording, setup: Setup, chipText: string | null, chipName: string | null): PhysicsResult {
  let chip: ChipDescription | undefined;
  let nominal: NominalView | null = null;
  let nominalNote: string | null = null;
  if (chipText === null) nominalNote = 'No chip description loaded: load one to compare the fitted compliance with what the design should give.';
  else {
    try {
      chip = parseChipDescription(chipText, chipName ?? 'chip.json');
      nominal = nominalView(chip, setup);
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      nominalNote = `The chip description could not be read: ${err.message}`;
    }
  }
  const json = addPhysics(analysis, recording, chip ? { chip } : {});
  const ambientPa = chip?.ambientPressurePa ?? STANDARD_ATMOSPHERE_PA;
  const steps: StepPhysicsView[] = json.steps.map((s) => {
    const ph = s.physics as { resistance_inconclusive?: unknown; compliance_inconclusive?: unknown; compliance_se?: number | null; notes?: unknown };
    return {
      resistance: estimate(s.resistance_Pa_s_per_m3, s.resistance_ci95, ph.resistance_inconclusive),
      compliance: estimate(s.compliance_m3_per_Pa, s.compliance_ci95, ph.compliance_inconclusive),
      complianceSe: finite(ph.compliance_se) ? ph.compliance_se : null,
      pressureAbsPa: finite(s.pressure_abs_Pa) ? s.pressure_abs_Pa : null,
      notes: Array.isArray(ph.notes) ? ph.notes.filter((n): n is string => typeof n === 'string') : [],
    };
  });

  // Pooled C over conclusive steps for the fitted-vs-nominal bar: the same inverse-variance mean, widened by
  // the Birge ratio when the steps scatter (a gas compliance changes with pressure), that QC uses.
  const combined = combineEstimates(
    steps.flatMap((s) => (s.compliance && !s.compliance.inconclusive && s.complianceSe ? [{ value: s.compliance.value, standardError: s.complianceSe, ci95: s.compliance.ci95 }] : [])),
  );
  const pooled = combined && combined.ci95 ? { value: combined.value, ci95: combined.ci95 } : null;

  // The fingerprint line for the plot (the same core fit the physics stage makes).
  const points = steps.flatMap((s, i) => (s.compliance && s.pressureAbsPa !== null ? [{ i, c: s.compliance, se: s.complianceSe, p: s.pressureAbsPa }] : []));
  const fp = pressureFingerprint(points.map((x) => ({ complianceM3PerPa: x.c.value, ...(x.se ? { standardError: x.se } : {}), pressureAbsPa: x.p })), { ambientPressurePa: ambientPa });
  let fingerprint: FingerprintView | null = null;
  let fingerprintNote: string | null = null;
  if (fp.rigidComplianceM3PerPa && fp.volumeM3AtAtm !== null && fp.ci95) {
    fingerprint = {
      points: points.map((x) => ({ stepIndex: x.i, pressureAbsPa: x.p, complianceM3PerPa: x.c.value, ci95: x.c.ci95 })),
      cRigidM3PerPa: { value: fp.rigidComplianceM3PerPa.value, ci95: fp.rigidComplianceM3PerPa.ci95 },
      vAtmM3: { value: fp.volumeM3AtAtm, ci95: fp.ci95 },
      ambientPa,
    };
  } else fingerprintNote = fp.statement;

  const ta = json.trapped_air;
  let trappedAir: TrappedAirView | null = null;
  let trappedAirNote: string | null = null;
  if (ta && finite(ta.volume_m3_at_atm)) {
    const lo = ta.ci95[0];
    trappedAir = {
      volumeM3AtAtm: { value: ta.volume_m3_at_atm, ci95: [lo ?? Number.NaN, ta.ci95[1] ?? Number.NaN] },
      volumeM3AtWorking: null,
      method: ta.method === 'pressure-fingerprint' ? `pressure fingerprint over ${ta.steps_used ?? '?'} steps at ${ta.pressure_levels ?? '?'} pressure levels` : `excess over the nominal compliance (${ta.steps_used ?? '?'} steps)`,
      evidence: ta.evidence_of_gas ? 'gas' : finite(lo) ? 'none' : 'inconclusive',
      conclusion: ta.statement,
    };
  } else {
    trappedAirNote = ta?.statement ?? json.warnings.find((w) => w.code === 'trapped-air-not-assessed')?.message ?? 'Trapped air could not be assessed from these steps.';
  }
  return {
    json,
    steps,
    fittedComplianceM3PerPa: pooled,
    nominal,
    nominalNote,
    fingerprint,
    fingerprintNote,
    trappedAir,
    trappedAirNote,
    warnings: json.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.count !== undefined ? { count: w.count } : {}) })),
  };
}
