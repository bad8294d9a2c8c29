/**
 * Types of QC sign-off: what a chip measurement looks like to the verdict logic
 * ({@link ChipMeasurement}), the acceptance spec ({@link QcSpec}) and the evaluation
 * ({@link ChipEvaluation}). Kept small on purpose: the analysis pipeline is adapted
 * to {@link ChipMeasurement} (see `from-analysis.ts`), the verdict logic never sees it.
 */

/** Quantities a spec can put limits on. */
export type QcQuantity = 'resistance' | 'compliance' | 'excess_compliance' | 'trapped_air' | 'tau' | 't95';

export const QC_QUANTITIES: readonly QcQuantity[] = ['resistance', 'compliance', 'excess_compliance', 'trapped_air', 'tau', 't95'];

/** One measured quantity in SI (see `QC_SI_UNIT`). */
export interface MeasuredValue {
  value: number;
  /** Standard error (1σ), SI, when known. */
  standardError: number | null;
  /** 95 % confidence interval [lo, hi], SI; null when the analysis could not give one. */
  ci95: [number, number] | null;
}

/** Everything the verdict logic needs about one chip. */
export interface ChipMeasurement {
  chipId: string;
  /** Measured quantities in SI; absent when the analysis did not produce them. */
  quantities: Partial<Record<QcQuantity, MeasuredValue>>;
  /** Quality of the fit the quantities came from (the worst step when there are several); null if no fit. */
  fit: { converged: boolean; r2: number | null; flags: string[] } | null;
  /** The analysis declared these results unsupported by the data. No quantity: the whole chip. */
  inconclusive: { quantity?: QcQuantity; reason: string }[];
  /** Readable warnings carried from the analysis. */
  warnings: string[];
}

/** One limit of a spec, converted to SI. */
export interface QcLimit {
  quantity: QcQuantity;
  /** Lower limit (LSL), SI, inclusive; null = none. */
  lowerSi: number | null;
  /** Upper limit (USL), SI, inclusive; null = none. */
  upperSi: number | null;
  /** Nominal value, SI, when the limit was given as nominal ± %. */
  nominalSi: number | null;
  tolerancePercent: number | null;
  /** The unit the spec wrote the limit in (display), and its factor to SI. */
  unit: string;
  unitToSi: number;
}

export type InconclusivePolicy = 'fail' | 'retest' | 'inconclusive';

/** A validated acceptance spec (the JSON form is documented in docs/qc-spec.md). */
export interface QcSpec {
  formatVersion: 1;
  design: { name: string; revision: string | null; description: string | null };
  /** Which set-up and test program the measurement must come from. */
  test: {
    setup: string;
    program: string;
    notes: string | null;
    /** How the chip is driven in the test (analysis setup); null = inferred from the log. */
    drive: 'flow-driven' | 'pressure-driven' | null;
    /** Chip description file (path relative to the spec file) for the nominal prediction; null = none. */
    chipDescription: string | null;
  };
  limits: QcLimit[];
  fitQuality: {
    requireConverged: boolean;
    minR2: number | null;
    /** Fit flags that make the fit unacceptable. */
    rejectFlags: string[];
    /** Verdict of a fit-quality check that is violated. */
    onViolation: 'inconclusive' | 'fail';
  };
  /** How an inconclusive chip is dispositioned. */
  inconclusiveCountsAs: InconclusivePolicy;
  /** Default chip-ID source (`filename:<regex>` or `metadata:<key>`), null = file name stem. */
  chipIdFrom: string | null;
}

export type Verdict = 'pass' | 'fail' | 'inconclusive';
/** What happens to the chip: the verdict, with inconclusive mapped by the spec's policy. */
export type Disposition = 'pass' | 'fail' | 'retest' | 'inconclusive';

/** Result of one check (a limit or a fit-quality rule). */
export interface CheckResult {
  /** `resistance`, `trapped_air`, `fit.converged`, `fit.r2`, `fit.flag.residual-structure`, `analysis`. */
  check: string;
  label: string;
  /** Measured value, SI (null when missing or not numeric). */
  value: number | null;
  ci95: [number, number] | null;
  /** The limits, SI (null = none). */
  lower: number | null;
  upper: number | null;
  /** SI unit of value/ci/limits ('' for dimensionless). */
  unit: string;
  verdict: Verdict;
  /** One readable sentence: value, CI, limit and why. */
  reason: string;
}

export interface ChipEvaluation {
  chipId: string;
  verdict: Verdict;
  disposition: Disposition;
  results: CheckResult[];
  /** The decision rule in words (shown in every report). */
  rule: string;
}

/** A stored QC record as read back (io/qc-store.ts) and shown in history and lot reports. */
export interface QcRecord {
  id: number;
  chipId: string;
  lot: string | null;
  operator: string | null;
  /** UTC ISO 8601 time of the record. */
  recordedAt: string;
  specSha256: string;
  specDesign: string;
  softwareVersion: string;
  settings: Record<string, unknown>;
  inputs: { path: string; sha256: string }[];
  verdict: Verdict;
  disposition: Disposition;
  rule: string;
  results: CheckResult[];
  /** Measured quantities, SI (also those without a limit). */
  quantities: Partial<Record<QcQuantity, MeasuredValue>>;
}
