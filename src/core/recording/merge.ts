/**
 * Merging two (or more) logs of one run — say a pressure logger and a flow logger with their own rates and
 * clocks — onto one time base.
 *
 * Decision: the common time base is that of the log with the highest sample rate (shortest median interval);
 * the other logs' channels are linearly interpolated onto it. Outside another log's span nothing is
 * extrapolated: those samples are NaN. Alignment uses the absolute start times when every log has one
 * (startEpochMs), or the offsets the user gives (seconds of each log's first sample on the first log's time).
 * A gap in a log (interval above 5× its median) is not bridged: samples inside it are NaN.
 */
import { InputError, type Warning } from '../errors';
import { uniqueNames } from './channel-names';
import type { Channel, Recording } from './types';

export interface MergeOptions {
  /**
   * Start of each log after the first, in seconds on the first log's time axis (its first sample = 0).
   * offsetsS[k] is for recordings[k + 1]. When given, absolute start times are not used.
   */
  offsetsS?: number[];
}

/** Median interval between samples, s (NaN for fewer than two samples). */
export function medianIntervalS(timeS: Float64Array): number {
  if (timeS.length < 2) return Number.NaN;
  const d = new Float64Array(timeS.length - 1);
  for (let i = 1; i < timeS.length; i++) d[i - 1] = (timeS[i] as number) - (timeS[i - 1] as number);
  d.sort();
  const m = d.length >> 1;
  return d.length % 2 === 1 ? (d[m] as number) : ((d[m - 1] as number) + (d[m] as number)) / 2;
}

/**
 * Linear interpolation of (x, y) at the points `at` (all ascending). NaN outside [x0, xn] and inside gaps
 * longer than `maxGap`.
 */
export function interpolateOnto(x: Float64Array, y: Float64Array, at: Float64Array, maxGap = Number.POSITIVE_INFINITY): Float64Array {
  const out = new Float64Array(at.length);
  const n = x.length;
  let j = 0;
  for (let i = 0; i < at.length; i++) {
    const t = at[i] as number;
    if (n === 0 || t < (x[0] as number) || t > (x[n - 1] as number)) {
      out[i] = Number.NaN;
      continue;
    }
    while (j < n - 2 && (x[j + 1] as number) < t) j++;
    const x0 = x[j] as number;
    const x1 = (n === 1 ? x0 : x[j + 1]) as number;
    if (t === x0) out[i] = y[j] as number;
    else if (t === x1) out[i] = y[j + 1] as number;
    else if (x1 - x0 > maxGap) out[i] = Number.NaN;
    else {
      const w = (t - x0) / (x1 - x0);
      out[i] = (y[j] as number) * (1 - w) + (y[j + 1] as number) * w;
    }
  }
  return out;
}

/** Merges recordings of one run onto the time base of the fastest one. */
export function mergeRecordings(recordings: readonly Recording[], options: MergeOptions = {}): Recording {
  const first = recordings[0];
  if (!first) throw new InputError('nothing-to-merge', 'No recordings were given to merge', 'Give at least one log');
  if (recordings.length === 1) return first;
  const offsets = options.offsetsS;
  if (offsets !== undefined && offsets.length !== recordings.length - 1) {
    throw new InputError('bad-option', `${offsets.length} offset(s) given for ${recordings.length - 1} log(s) after the first`, 'Give one offset per log after the first');
  }
  // start of each recording on the first recording's axis, s
  const startS = recordings.map((r, k) => {
    if (k === 0) return 0;
    if (offsets) return offsets[k - 1] as number;
    if (r.startEpochMs === null || first.startEpochMs === null) {
      const missing = recordings.filter((x) => x.startEpochMs === null).map((x) => x.sources.join('+'));
      throw new InputError(
        'cannot-align',
        `The logs cannot be aligned: ${missing.join(', ')} carr${missing.length === 1 ? 'ies' : 'y'} no absolute start time`,
        'Give the offset of the second log\'s first sample on the first log\'s time (--offset seconds), or use logs with absolute timestamps',
        { file: missing[0] },
      );
    }
    return (r.startEpochMs - first.startEpochMs) / 1000;
  });
  const intervals = recordings.map((r) => medianIntervalS(r.timeS));
  let base = 0;
  intervals.forEach((d, k) => {
    if (d < (intervals[base] as number) || Number.isNaN(intervals[base] as number)) base = k;
  });
  const baseRec = recordings[base] as Recording;
  const baseStart = startS[base] as number;
  const warnings: Warning[] = [];
  const channels: Channel[] = [];
  const sources: string[] = [];
  const metadata: Record<string, string> = {};
  recordings.forEach((r, k) => {
    const shift = (startS[k] as number) - baseStart; // this log's t = 0 on the base axis
    const sourceOffset = sources.length;
    sources.push(...r.sources);
    for (const [key, value] of Object.entries(r.metadata)) if (!(key in metadata)) metadata[key] = value;
    for (const w of r.warnings) warnings.push({ ...w, message: `${r.sources.join('+')}: ${w.message}` });
    let x = r.timeS;
    if (k !== base) {
      x = new Float64Array(r.timeS.length);
      for (let i = 0; i < x.length; i++) x[i] = (r.timeS[i] as number) + shift;
    }
    const gap = 5 * (intervals[k] as number);
    let outside = 0;
    for (const c of r.channels) {
      const values = k === base ? c.values : interpolateOnto(x, c.values, baseRec.timeS, Number.isNaN(gap) ? Number.POSITIVE_INFINITY : gap);
      if (k !== base && outside === 0) for (let i = 0; i < values.length; i++) if (Number.isNaN(values[i] as number) && !Number.isNaN(c.values[0] as number)) outside++;
      const native = k === base ? c.native : { timeS: x, values: c.values };
      channels.push({ ...c, values, sourceIndex: c.sourceIndex + sourceOffset, ...(native ? { native } : {}) });
    }
    if (k !== base) {
      if (x.length === 0 || (x[x.length - 1] as number) < (baseRec.timeS[0] as number) || (x[0] as number) > (baseRec.timeS[baseRec.timeS.length - 1] as number)) {
        throw new InputError('logs-do-not-overlap', `${r.sources.join('+')} does not overlap in time with ${baseRec.sources.join('+')}`, 'Check the clocks of both loggers, or give the offset between them (--offset seconds)');
      }
      if (outside > 0) warnings.push({ code: 'merge-outside-span', message: `${r.sources.join('+')}: ${outside} sample(s) of the common time base lie outside this log's span or in its gaps; left as NaN (no extrapolation)`, count: outside });
      warnings.push({ code: 'merged-by-interpolation', message: `${r.sources.join('+')} was interpolated linearly onto the time base of ${baseRec.sources.join('+')} (shift ${shift} s)` });
    }
  });
  const names = uniqueNames(channels.map((c) => c.name.replace(/_\d+$/, '')));
  channels.forEach((c, k) => (c.name = names[k] as string));
  return {
    timeS: baseRec.timeS,
    startEpochMs: first.startEpochMs === null ? null : first.startEpochMs + baseStart * 1000,
    channels,
    metadata,
    sources,
    warnings,
  };
}
