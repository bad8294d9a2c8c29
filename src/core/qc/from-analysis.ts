/**
 * Adapter: the analysis result (`analyzeRecording`, plus `addPhysics` when run) → {@link ChipMeasurement}.
 *
 * Per step it takes the slowest τ and t₉₅, and from the physics stage R, C (`resistance_Pa_s_per_m3`,
 * `resistance_ci95`, `physics.resistance_se`, `physics.resistance_inconclusive`, same for compliance) and
 * the excess compliance (`physics.excess_compliance_m3_per_Pa`, `_ci95`); steps the analysis marked
 * inconclusive are left out, and so is an R or C the physics marked inconclusive. The chip value of each
 * quantity combines the usable steps (combine.ts). Trapped air is the chip-level `trapped_air` of the
 * physics stage (volume at 1 atm). t₉₅ is the largest step's t₉₅ (the worst case) with a CI scaled from
 * that step's slowest-τ CI (exact for one exponential without dead time, where t₉₅ = τ·ln 20; an
 * approximation otherwise).
 */
import type { AnalysisJson, StepJson } from '../analyze/types';
import { combineEstimates, fromCi } from './combine';
import type { ChipMeasurement, MeasuredValue, QcQuantity } from './types';

type Obj = Record<string, unknown>;
const isNum = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
const isObj = (x: unknown): x is Obj => typeof x === 'object' && x !== null && !Array.isArray(x);
const ciOf = (x: unknown): [number, number] | null => (Array.isArray(x) && isNum(x[0]) && isNum(x[1]) ? [x[0], x[1]] : null);

/**
 * Reads `<name>_<unit>` with its SE (`<name>_se`, `<name>_se_<unit>`) and CI (`<name>_ci95`,
 * `<name>_ci95_<unit>`, `<name>_<unit>_ci95`) from the first object that has the value; null when
 * absent or marked `<name>_inconclusive: true` (then `inconclusive` is set on the result).
 */
export function readPhysicsQuantity(objects: readonly (Obj | undefined)[], name: string, unit: string): { value: MeasuredValue | null; inconclusive: boolean } {
  const all = objects.filter(isObj);
  const pick = (keys: string[]): unknown => {
    for (const o of all) for (const k of keys) if (o[k] !== undefined && o[k] !== null) return o[k];
    return undefined;
  };
  const value = pick([`${name}_${unit}`]);
  if (pick([`${name}_inconclusive`]) === true) return { value: null, inconclusive: true };
  if (!isNum(value)) return { value: null, inconclusive: false };
  const se = pick([`${name}_se`, `${name}_se_${unit}`]);
  const ci = ciOf(pick([`${name}_ci95`, `${name}_ci95_${unit}`, `${name}_${unit}_ci95`]));
  return { value: fromCi(value, ci, isNum(se) ? se : null), inconclusive: false };
}

const STEP_QUANTITIES: [QcQuantity, string, string][] = [
  ['resistance', 'resistance', 'Pa_s_per_m3'],
  ['compliance', 'compliance', 'm3_per_Pa'],
  ['excess_compliance', 'excess_compliance', 'm3_per_Pa'],
];

function slowestTau(step: StepJson): MeasuredValue | null {
  const t = step.terms[step.terms.length - 1];
  if (!t || !isNum(t.tau_s)) return null;
  return fromCi(t.tau_s, ciOf(t.tau_ci95_s), isNum(t.tau_se_s) ? t.tau_se_s : null);
}

/** Builds the chip measurement from one log's analysis (with or without the physics stage). */
export function measurementFromAnalysis(analysis: AnalysisJson, chipId: string): ChipMeasurement {
  const inconclusive: ChipMeasurement['inconclusive'] = [];
  const warnings = analysis.warnings.map((w) => w.message);
  const fitted = analysis.steps.filter((s) => s.fit !== null);
  const usable = fitted.filter((s) => !s.inconclusive);
  if (analysis.steps.length === 0) inconclusive.push({ reason: 'no setpoint steps were found in the log' });
  else if (usable.length === 0) inconclusive.push({ reason: `none of the ${analysis.steps.length} step(s) gave a result the data support` });
  for (const s of analysis.steps) {
    if (s.inconclusive) warnings.push(`Step ${s.index + 1} at ${s.start_s.toFixed(1)} s is inconclusive and was left out.`);
    for (const w of s.warnings) warnings.push(`Step ${s.index + 1}: ${w.message}`);
  }
  const quantities: ChipMeasurement['quantities'] = {};
  const tau = combineEstimates(usable.map(slowestTau).filter((x): x is MeasuredValue => x !== null));
  if (tau) quantities.tau = tau;
  let worst: { t95: number; tau: MeasuredValue } | null = null;
  for (const s of usable) {
    const tt = slowestTau(s);
    if (isNum(s.t95_s) && tt && (!worst || s.t95_s > worst.t95)) worst = { t95: s.t95_s, tau: tt };
  }
  if (worst) {
    const k = worst.t95 / worst.tau.value;
    const ci = worst.tau.ci95;
    quantities.t95 = { value: worst.t95, standardError: worst.tau.standardError === null ? null : worst.tau.standardError * k, ci95: ci ? [ci[0] * k, ci[1] * k] : null };
  }
  for (const [q, name, unit] of STEP_QUANTITIES) {
    const per = usable.map((s) => readPhysicsQuantity([s as unknown as Obj, (s as unknown as Obj).physics as Obj | undefined], name, unit));
    const c = combineEstimates(per.map((p) => p.value).filter((x): x is MeasuredValue => x !== null));
    if (c) quantities[q] = c;
    else if (per.some((p) => p.inconclusive)) inconclusive.push({ quantity: q, reason: `the physics stage marked ${name.replace('_', ' ')} inconclusive in every usable step` });
  }
  const air = (analysis as unknown as Obj).trapped_air;
  if (isObj(air) && isNum(air.volume_m3_at_atm)) {
    quantities.trapped_air = fromCi(air.volume_m3_at_atm, ciOf(air.ci95), null);
    if (typeof air.statement === 'string') warnings.push(`Trapped air (${String(air.method)}): ${air.statement}`);
  }
  // Fit quality is judged on the steps the values came from (all fitted steps when none is usable).
  const judged = usable.length > 0 ? usable : fitted;
  const fit =
    judged.length === 0
      ? null
      : {
          converged: judged.every((s) => s.fit?.converged === true),
          r2: judged.reduce<number | null>((m, s) => (isNum(s.fit?.r2) ? (m === null ? (s.fit?.r2 as number) : Math.min(m, s.fit?.r2 as number)) : m), null),
          flags: [...new Set(judged.flatMap((s) => (s.fit?.flags ?? []).map((f) => f.code)))],
        };
  return { chipId, quantities, fit, inconclusive, warnings };
}

/** A number, or the `nominal` of a `{ low, nominal, high }` range (nominal/json.ts RangeJson). */
function nominalOf(x: unknown): number | null {
  if (isNum(x)) return x;
  return isObj(x) && isNum(x.nominal) ? x.nominal : null;
}

/** The nominal compliance parts (m³/Pa) of the physics stage's `nominal.breakdown`, counted ones only. */
export function nominalComplianceParts(analysis: AnalysisJson): { parts: { label: string; complianceM3PerPa: number }[]; totalM3PerPa: number } | null {
  const nominal = (analysis as unknown as Obj).nominal;
  const total = isObj(nominal) ? nominalOf(nominal.compliance_m3_per_Pa) : null;
  if (!isObj(nominal) || total === null || !Array.isArray(nominal.breakdown)) return null;
  const parts = nominal.breakdown
    .filter((b): b is Obj => isObj(b) && b.counted !== false && nominalOf(b.compliance_m3_per_Pa) !== null)
    .map((b) => ({ label: [b.element, b.source].filter((x) => typeof x === 'string' && x !== '').join(': ') || 'part', complianceM3PerPa: nominalOf(b.compliance_m3_per_Pa) as number }));
  return { parts, totalM3PerPa: total };
}
