/**
 * Adapter: the analysis result (`analyzeRecording` → AnalysisJson, one per log) → {@link ChipMeasurement}.
 *
 * Per step it takes the slowest τ, t₉₅, and — when the physics stage filled `physics` — R, C, excess
 * compliance and trapped-air volume; steps the analysis marked inconclusive are left out. The chip
 * value of each quantity combines the usable steps (combine.ts). t₉₅ is the largest step's t₉₅ (the
 * worst case) with a CI scaled from that step's slowest-τ CI (exact for one exponential without dead
 * time, where t₉₅ = τ·ln 20; an approximation otherwise).
 */
import type { AnalysisJson, StepJson } from '../analyze/types';
import { combineEstimates, fromCi } from './combine';
import type { ChipMeasurement, MeasuredValue, QcQuantity } from './types';

type Obj = Record<string, unknown>;
const isNum = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
const ciOf = (x: unknown): [number, number] | null => (Array.isArray(x) && isNum(x[0]) && isNum(x[1]) ? [x[0], x[1]] : null);

/**
 * Reads `<name>_<unit>`, its SE (`<name>_se_<unit>` or `<name>_<unit>_se`) and CI (`<name>_ci95_<unit>`
 * or `<name>_<unit>_ci95`) from a physics object, searching one level of nesting too.
 */
export function readPhysicsQuantity(physics: Obj | undefined, name: string, unit: string): MeasuredValue | null {
  if (!physics) return null;
  const candidates: Obj[] = [physics, ...Object.values(physics).filter((v): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v))];
  for (const o of candidates) {
    const value = o[`${name}_${unit}`];
    if (!isNum(value)) continue;
    const se = o[`${name}_se_${unit}`] ?? o[`${name}_${unit}_se`];
    const ci = ciOf(o[`${name}_ci95_${unit}`] ?? o[`${name}_${unit}_ci95`]);
    return fromCi(value, ci, isNum(se) ? se : null);
  }
  return null;
}

const PHYSICS_KEYS: [QcQuantity, string[], string][] = [
  ['resistance', ['resistance'], 'Pa_s_per_m3'],
  ['compliance', ['compliance'], 'm3_per_Pa'],
  ['excess_compliance', ['excess_compliance'], 'm3_per_Pa'],
  ['trapped_air', ['trapped_air_volume', 'trapped_air', 'air_volume', 'gas_volume'], 'm3'],
];

function slowestTau(step: StepJson): MeasuredValue | null {
  const t = step.terms[step.terms.length - 1];
  if (!t || !isNum(t.tau_s)) return null;
  return fromCi(t.tau_s, ciOf(t.tau_ci95_s), isNum(t.tau_se_s) ? t.tau_se_s : null);
}

/** Builds the chip measurement from one log's analysis. */
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
  for (const [q, names, unit] of PHYSICS_KEYS) {
    const per = usable
      .map((s) => names.map((n) => readPhysicsQuantity(s.physics as Obj | undefined, n, unit)).find((x) => x !== null) ?? null)
      .filter((x): x is MeasuredValue => x !== null);
    const c = combineEstimates(per);
    if (c) quantities[q] = c;
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
