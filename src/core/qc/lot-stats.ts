/**
 * Lot statistics and process capability against spec limits.
 *
 * Capability ratios as defined in D. C. Montgomery, *Introduction to Statistical Quality Control*,
 * 6th ed., Wiley 2009, ch. 8 ("Process and Measurement System Capability Analysis"), §8.3 (from memory):
 *   Cp  = (USL − LSL) / (6σ)
 *   Cpu = (USL − μ) / (3σ),  Cpl = (μ − LSL) / (3σ),  Cpk = min(Cpu, Cpl)
 * with μ and σ estimated by the sample mean and the sample standard deviation (n − 1).
 * With one limit only the one-sided ratio is Cpk. Values are estimates; with small n they are uncertain.
 */

export interface SummaryStats {
  n: number;
  mean: number | null;
  /** Sample standard deviation (n − 1 denominator); null for n < 2. */
  sd: number | null;
  min: number | null;
  max: number | null;
}

export interface Capability {
  lsl: number | null;
  usl: number | null;
  cp: number | null;
  cpu: number | null;
  cpl: number | null;
  cpk: number | null;
}

/** Mean, SD (n − 1), min, max of the finite values (two-pass for accuracy). */
export function summarize(values: readonly number[]): SummaryStats {
  const xs = values.filter((x) => Number.isFinite(x));
  const n = xs.length;
  if (n === 0) return { n, mean: null, sd: null, min: null, max: null };
  const mean = xs.reduce((a, b) => a + b, 0) / n;
  const ss = xs.reduce((a, b) => a + (b - mean) * (b - mean), 0);
  return { n, mean, sd: n >= 2 ? Math.sqrt(ss / (n - 1)) : null, min: Math.min(...xs), max: Math.max(...xs) };
}

/** Capability ratios (Montgomery §8.3); null where a limit, μ or a positive σ is missing. */
export function capability(stats: SummaryStats, lsl: number | null, usl: number | null): Capability {
  const { mean, sd } = stats;
  const ok = mean !== null && sd !== null && sd > 0;
  const cpu = ok && usl !== null ? (usl - mean) / (3 * sd) : null;
  const cpl = ok && lsl !== null ? (mean - lsl) / (3 * sd) : null;
  const cp = ok && usl !== null && lsl !== null ? (usl - lsl) / (6 * sd) : null;
  const cpk = cpu !== null && cpl !== null ? Math.min(cpu, cpl) : (cpu ?? cpl);
  return { lsl, usl, cp, cpu, cpl, cpk };
}
