/**
 * Trend of compliance (or air volume) over repeated measurements: trapped air dissolves into
 * water and permeates PDMS over minutes to hours (physics.md §3.9), so a shrinking bubble shows
 * as C falling with time. Weighted least-squares line value = a + b·t (weighted-line.ts), slope
 * with a 95 % CI from the t-quantile with n − 2 degrees of freedom, and a plain statement.
 */
import type { Warning } from '../errors';
import { studentTQuantile } from '../stats';
import { fitWeightedLine } from './weighted-line';

export interface TrendPoint {
  /** Time of the measurement, s (any origin, e.g. step onset on the recording). */
  timeS: number;
  /** The quantity (C in m³/Pa or V in m³). */
  value: number;
  standardError?: number;
}

export interface Trend {
  /** Slope, units of value per second, with its 95 % CI; null when fewer than 3 points. */
  slopePerS: { value: number; standardError: number; ci95: [number, number] } | null;
  /** Slope relative to the mean value, per hour (e.g. −0.1 = falling 10 %/h). */
  relativeSlopePerHour: number | null;
  direction: 'falling' | 'rising' | 'no significant trend' | 'inconclusive';
  statement: string;
  points: number;
  warnings: Warning[];
}

/** Linear trend of `what` (a noun phrase for the statement, e.g. "compliance") over time. */
export function linearTrend(points: TrendPoint[], what = 'compliance'): Trend {
  const usable = points.filter((p) => Number.isFinite(p.timeS) && Number.isFinite(p.value));
  const distinctTimes = new Set(usable.map((p) => p.timeS)).size;
  if (usable.length < 3 || distinctTimes < 2) {
    return {
      slopePerS: null,
      relativeSlopePerHour: null,
      direction: 'inconclusive',
      statement: `Trend of ${what} over time: inconclusive (needs at least 3 measurements at different times).`,
      points: usable.length,
      warnings: [{ code: 'trend-inconclusive', message: `Too few measurements (${usable.length}) for a trend of ${what}.` }],
    };
  }
  const t0 = usable[0]?.timeS ?? 0;
  const scale = Math.max(...usable.map((p) => Math.abs(p.value))) || 1;
  const line = fitWeightedLine(
    usable.map((p) => ({
      x: p.timeS - t0,
      y: p.value / scale,
      standardError: p.standardError !== undefined ? p.standardError / scale : undefined,
    })),
  );
  const q = studentTQuantile(0.975, line.dof);
  const slope = line.slope * scale;
  const se = Math.sqrt(line.covariance[1][1]) * scale;
  const ci: [number, number] = [slope - q * se, slope + q * se];
  const mean = usable.reduce((a, p) => a + p.value, 0) / usable.length;
  const rel = mean !== 0 ? (slope * 3600) / mean : null;
  const pct = (v: number): string => `${(v * 100).toFixed(1)} %/h`;
  const relCi = mean !== 0 ? ci.map((v) => (v * 3600) / mean) : null;
  let direction: Trend['direction'];
  let statement: string;
  const range = relCi ? ` (95 % CI ${pct(Math.min(...relCi))} to ${pct(Math.max(...relCi))})` : '';
  if (ci[1] < 0) {
    direction = 'falling';
    statement = `The ${what} falls over time by ${rel !== null ? pct(-rel) : 'a significant amount'}${range}: consistent with trapped air dissolving into the liquid or the PDMS.`;
  } else if (ci[0] > 0) {
    direction = 'rising';
    statement = `The ${what} rises over time by ${rel !== null ? pct(rel) : 'a significant amount'}${range}: gas may be forming or collecting (degassing, warming, leaks at fittings).`;
  } else {
    direction = 'no significant trend';
    statement = `No significant trend of the ${what} over time${range}.`;
  }
  return {
    slopePerS: { value: slope, standardError: se, ci95: ci },
    relativeSlopePerHour: rel,
    direction,
    statement,
    points: usable.length,
    warnings: [],
  };
}
