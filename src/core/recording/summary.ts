/**
 * What `inspect` shows about a recording: rows, duration, sample rate, gaps, and per channel the range and
 * the number of missing samples.
 */
import { medianIntervalS } from './merge';
import type { Quantity, Recording } from './types';

/** An interval between samples longer than {@link GAP_FACTOR} × the median interval. */
export const GAP_FACTOR = 1.5;

export interface ChannelSummary {
  name: string;
  quantity: Quantity;
  originalHeader: string;
  originalUnit: string;
  /** Smallest and largest finite value, SI (null when all missing). */
  min: number | null;
  max: number | null;
  missing: number;
}

export interface RecordingSummary {
  rows: number;
  durationS: number;
  medianIntervalS: number;
  /** 1 / median interval, Hz. */
  sampleRateHz: number;
  /** Intervals longer than 1.5 × the median (common practice, no source: a missed sample shows as 2×). */
  gaps: { count: number; largestS: number; firstAtS: number | null };
  startIso: string | null;
  channels: ChannelSummary[];
}

export function summarizeRecording(r: Recording): RecordingSummary {
  const n = r.timeS.length;
  const median = medianIntervalS(r.timeS);
  let count = 0;
  let largest = 0;
  let firstAt: number | null = null;
  for (let i = 1; i < n; i++) {
    const d = (r.timeS[i] as number) - (r.timeS[i - 1] as number);
    if (d > GAP_FACTOR * median) {
      count++;
      if (firstAt === null) firstAt = r.timeS[i - 1] as number;
      if (d > largest) largest = d;
    }
  }
  return {
    rows: n,
    durationS: n > 0 ? (r.timeS[n - 1] as number) - (r.timeS[0] as number) : 0,
    medianIntervalS: median,
    sampleRateHz: 1 / median,
    gaps: { count, largestS: largest, firstAtS: firstAt },
    startIso: r.startEpochMs === null ? null : new Date(r.startEpochMs).toISOString(),
    channels: r.channels.map((c) => {
      let min = Number.POSITIVE_INFINITY;
      let max = Number.NEGATIVE_INFINITY;
      let missing = 0;
      for (const v of c.values) {
        if (Number.isNaN(v)) missing++;
        else {
          if (v < min) min = v;
          if (v > max) max = v;
        }
      }
      return {
        name: c.name,
        quantity: c.quantity,
        originalHeader: c.originalHeader,
        originalUnit: c.originalUnit,
        min: missing === n ? null : min,
        max: missing === n ? null : max,
        missing,
      };
    }),
  };
}
