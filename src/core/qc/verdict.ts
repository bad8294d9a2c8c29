/**
 * Verdict logic: each limit of a spec against a measured value and its 95 % confidence
 * interval, then the chip verdict and disposition.
 *
 * Rule (stated in every report, see {@link VERDICT_RULE}): limits are inclusive (a value equal to a
 * limit is within spec, common practice, no source). A limit passes when the whole 95 % CI lies inside
 * [LSL, USL]; fails when the whole CI lies outside (entirely below LSL or entirely above USL);
 * otherwise it is inconclusive (the CI straddles a limit, or touches it from outside). A missing
 * measurement, a missing CI, or a result the analysis marked inconclusive is inconclusive.
 * Chip verdict: fail if any check fails, else inconclusive if any is, else pass.
 */
import { formatNumber } from './format';
import type { CheckResult, ChipEvaluation, ChipMeasurement, Disposition, QcLimit, QcSpec, Verdict } from './types';
import { QC_QUANTITY_LABEL, QC_SI_UNIT, QC_UNIT_SYMBOL } from './units';

export const VERDICT_RULE =
  'A limit passes when the whole 95 % confidence interval lies inside it (limits inclusive), fails when the whole ' +
  'interval lies outside it, and is inconclusive when the interval straddles or touches it from outside, or when the ' +
  'measurement, its interval or the fit needed for it is missing or unsupported by the data. The chip fails if any ' +
  'check fails, is inconclusive if none fails but any is inconclusive, and passes otherwise.';

/**
 * Classifies an interval [lo, hi] against inclusive limits [lower, upper] (null = unbounded).
 * Pure interval logic; the point value does not enter.
 */
export function classifyInterval(lo: number, hi: number, lower: number | null, upper: number | null): Verdict {
  if (!(Number.isFinite(lo) && Number.isFinite(hi)) || lo > hi) return 'inconclusive';
  if ((lower !== null && hi < lower) || (upper !== null && lo > upper)) return 'fail';
  if ((lower === null || lo >= lower) && (upper === null || hi <= upper)) return 'pass';
  return 'inconclusive';
}

/** The limit as text in the spec's own unit, e.g. `[2.16e13, 2.64e13] Pa·s/m³ (2.4e13 ± 10 %)`. */
export function describeLimit(limit: QcLimit): string {
  const u = QC_UNIT_SYMBOL[limit.unit] ?? limit.unit;
  const f = (x: number | null): string => (x === null ? '' : formatNumber(x / limit.unitToSi));
  const range =
    limit.lowerSi !== null && limit.upperSi !== null
      ? `[${f(limit.lowerSi)}, ${f(limit.upperSi)}] ${u}`
      : limit.upperSi !== null
        ? `≤ ${f(limit.upperSi)} ${u}`
        : `≥ ${f(limit.lowerSi)} ${u}`;
  return limit.nominalSi !== null ? `${range} (${f(limit.nominalSi)} ± ${formatNumber(limit.tolerancePercent)} %)` : range;
}

/** Evaluates one limit against the chip's measurement. */
export function evaluateLimit(limit: QcLimit, m: ChipMeasurement): CheckResult {
  const q = limit.quantity;
  const label = QC_QUANTITY_LABEL[q];
  const u = QC_UNIT_SYMBOL[limit.unit] ?? limit.unit;
  const mv = m.quantities[q];
  const base = { check: q, label, lower: limit.lowerSi, upper: limit.upperSi, unit: QC_SI_UNIT[q] };
  const limitText = describeLimit(limit);
  if (!mv || !Number.isFinite(mv.value)) {
    return { ...base, value: null, ci95: null, verdict: 'inconclusive', reason: `${label} was not measured; limit ${limitText}; no value → inconclusive.` };
  }
  const show = (x: number): string => formatNumber(x / limit.unitToSi);
  const valueText = `${label} = ${show(mv.value)} ${u}`;
  const marker = m.inconclusive.find((x) => x.quantity === q);
  if (marker) {
    return { ...base, value: mv.value, ci95: mv.ci95, verdict: 'inconclusive', reason: `${valueText}; the analysis marked it unsupported by the data (${marker.reason}) → inconclusive.` };
  }
  if (!mv.ci95) {
    return { ...base, value: mv.value, ci95: null, verdict: 'inconclusive', reason: `${valueText} without a confidence interval; limit ${limitText} → inconclusive.` };
  }
  const [lo, hi] = mv.ci95;
  const verdict = classifyInterval(lo, hi, limit.lowerSi, limit.upperSi);
  const why =
    verdict === 'pass' ? 'whole CI inside the limit' : verdict === 'fail' ? 'whole CI outside the limit' : 'CI straddles or touches the limit';
  return {
    ...base,
    value: mv.value,
    ci95: [lo, hi],
    verdict,
    reason: `${valueText}, 95 % CI [${show(lo)}, ${show(hi)}] ${u}; limit ${limitText}; ${why} → ${verdict}.`,
  };
}

/** Fit-quality checks of the spec (converged, r², rejected flags). */
export function evaluateFitQuality(spec: QcSpec, m: ChipMeasurement): CheckResult[] {
  const fq = spec.fitQuality;
  const bad = fq.onViolation;
  const out: CheckResult[] = [];
  const none = { ci95: null, lower: null, upper: null, unit: '' } as const;
  const wanted = fq.requireConverged || fq.minR2 !== null || fq.rejectFlags.length > 0;
  if (!wanted) return out;
  if (!m.fit) {
    return [{ check: 'fit', label: 'Fit quality', value: null, ...none, verdict: 'inconclusive', reason: 'No fit result is available to judge fit quality → inconclusive.' }];
  }
  if (fq.requireConverged) {
    const v: Verdict = m.fit.converged ? 'pass' : bad;
    out.push({ check: 'fit.converged', label: 'Fit converged', value: m.fit.converged ? 1 : 0, ...none, verdict: v, reason: m.fit.converged ? 'The fit converged → pass.' : `The fit did not converge → ${v}.` });
  }
  if (fq.minR2 !== null) {
    const r2 = m.fit.r2;
    if (r2 === null || !Number.isFinite(r2)) {
      out.push({ check: 'fit.r2', label: 'Fit r²', value: null, ...none, lower: fq.minR2, verdict: 'inconclusive', reason: `r² is not available; required ≥ ${fq.minR2} → inconclusive.` });
    } else {
      const v: Verdict = r2 >= fq.minR2 ? 'pass' : bad;
      out.push({ check: 'fit.r2', label: 'Fit r²', value: r2, ...none, lower: fq.minR2, verdict: v, reason: `r² = ${formatNumber(r2, 6)}; required ≥ ${fq.minR2} → ${v}.` });
    }
  }
  for (const flag of fq.rejectFlags) {
    const raised = m.fit.flags.includes(flag);
    const v: Verdict = raised ? bad : 'pass';
    out.push({ check: `fit.flag.${flag}`, label: `Fit flag ${flag}`, value: raised ? 1 : 0, ...none, verdict: v, reason: raised ? `The fit raised the rejected flag "${flag}" → ${v}.` : `The fit did not raise "${flag}" → pass.` });
  }
  return out;
}

/** Combines check verdicts: fail if any fails, else inconclusive if any is, else pass (no checks: inconclusive). */
export function combineVerdicts(verdicts: readonly Verdict[]): Verdict {
  if (verdicts.length === 0) return 'inconclusive';
  if (verdicts.includes('fail')) return 'fail';
  if (verdicts.includes('inconclusive')) return 'inconclusive';
  return 'pass';
}

/** Maps a verdict to a disposition under the spec's `inconclusive_counts_as`. */
export function dispositionOf(verdict: Verdict, policy: QcSpec['inconclusiveCountsAs']): Disposition {
  return verdict === 'inconclusive' ? policy : verdict;
}

/** Evaluates a chip against a spec: every limit, fit quality, chip-wide inconclusive markers. */
export function evaluateChip(spec: QcSpec, m: ChipMeasurement): ChipEvaluation {
  const results: CheckResult[] = spec.limits.map((l) => evaluateLimit(l, m));
  results.push(...evaluateFitQuality(spec, m));
  for (const mark of m.inconclusive) {
    if (mark.quantity === undefined) {
      results.push({ check: 'analysis', label: 'Analysis', value: null, ci95: null, lower: null, upper: null, unit: '', verdict: 'inconclusive', reason: `The analysis could not support a result: ${mark.reason} → inconclusive.` });
    }
  }
  const verdict = combineVerdicts(results.map((r) => r.verdict));
  return { chipId: m.chipId, verdict, disposition: dispositionOf(verdict, spec.inconclusiveCountsAs), results, rule: VERDICT_RULE };
}
