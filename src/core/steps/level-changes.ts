/**
 * Finds level changes in one sampled signal and sorts them into steps and ramps.
 *
 * Method (our own; each stage is a textbook building block):
 * 1. fill gaps, remove isolated spikes with a running median (width 5 by default);
 * 2. noise σ from the MAD of first differences (robust to steps, spikes and drift);
 * 3. a two-window detector D(i) = mean(f[i, i+L)) − mean(f[i−L, i)) with L = the dwell in samples
 *    (prefix sums, O(n)); candidate regions are where |D| ≥ minStep/2 (released below minStep/4),
 *    one candidate per region at the peak of |D|. A clean step of size Δ gives a peak of exactly Δ,
 *    slow drift of slope s only s·L;
 * 4. provisional levels from the dwell before and after each candidate; candidates smaller than
 *    minStep are dropped;
 * 5. the transition is timed on a lightly smoothed copy at 10 %, 50 % and 90 % of the change:
 *    - abrupt (10→90 % within the smoothing width + 2 samples): a step; onset = first sample at or
 *      beyond 50 % of the change, i.e. the first sample at the new level for a setpoint;
 *    - gradual with (t90 − t50)/(t50 − t10) ≥ 1.5: a settling curve, i.e. a step seen through the
 *      system (first order, physics.md §4.1: t_x = −τ·ln(1 − x), so the ratio is ln 5 / ln 1.8 = 2.74;
 *      two equal lags, 1 − (1 + t/τ)·e^{−t/τ}: 1.93; three equal lags: 1.68 — derivations); onset =
 *      last sample still within noise of the old level, plus one;
 *    - otherwise (a straight line gives 1.0): a ramp, reported and never fitted; it starts where its
 *      10→90 % line, extended back, leaves the plateau held before it (levels of a change are taken
 *      only from samples before the detector first saw it, regionStart − L, never from mid-ramp);
 * 6. both levels must hold for the dwell: a step closer than the dwell to the previous or next change
 *    (or to the start or end) is dropped; the reported levels are the medians of the dwell right before
 *    the onset (its last quarter for a gradual step, whose predecessor may still be creeping) and of the
 *    last dwell before the next change (the settled level).
 */
import type { Warning } from '../errors';
import type { Ramp, StepShape } from './types';
import { fillGaps, prefixSums, runningMedian } from './prefilter';
import { medianOfSlice, medianSpacing, noiseSigmaFromDifferences } from './robust';

export interface LevelChangeOptions {
  minStepSize?: number;
  minDwellS?: number;
  spikeWidthSamples?: number;
  /** Dwell used when none is given, s (the detector window). */
  defaultDwellS: number;
}

/** One step found in a signal, before it is dressed as a {@link Step}. */
export interface LevelStep {
  onsetIndex: number;
  onsetS: number;
  before: number;
  after: number;
  shape: StepShape;
}

export interface LevelChanges {
  steps: LevelStep[];
  ramps: Ramp[];
  noiseSigma: number;
  minStepSize: number;
  minDwellS: number;
  warnings: Warning[];
}

/** Shape ratio (t90 − t50)/(t50 − t10) at or above which a gradual change counts as a settling step. */
export const SETTLING_SHAPE_RATIO = 1.5;

interface Candidate {
  peak: number;
  /** First index where |D| reached minStep/2: samples before regionStart − L precede this change. */
  regionStart: number;
  regionEnd: number;
  sign: 1 | -1;
}

/** Detects steps and ramps in `values` sampled at `timeS` (SI). Pure; never throws on data. */
export function findLevelChanges(timeS: Float64Array, values: ArrayLike<number>, options: LevelChangeOptions): LevelChanges {
  const warnings: Warning[] = [];
  const n = timeS.length;
  const empty = (sigma: number, minStep: number, dwell: number): LevelChanges => ({
    steps: [],
    ramps: [],
    noiseSigma: sigma,
    minStepSize: minStep,
    minDwellS: dwell,
    warnings,
  });
  const x = fillGaps(values);
  if (n < 8 || x === null) {
    warnings.push({ code: 'too-few-samples', message: 'The channel has too few finite samples to look for steps.' });
    return empty(0, options.minStepSize ?? 0, options.minDwellS ?? options.defaultDwellS);
  }
  const dt = medianSpacing(timeS);
  const sigma = noiseSigmaFromDifferences(x);
  // A noise-free channel (a commanded setpoint: σ = 0) needs no spike filter; a single-sample glitch
  // there becomes two changes that fail the dwell rule below.
  const f = sigma === 0 ? x : runningMedian(x, options.spikeWidthSamples ?? 5);
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(f[i] as number));
  // 8 σ: chance of a noise excursion that large is negligible even over millions of samples (common practice, no source).
  const minStep = options.minStepSize ?? Math.max(8 * sigma, 1e-9 * scale, Number.MIN_VALUE);
  const dwellS = options.minDwellS ?? Math.max(10 * dt, options.defaultDwellS);
  const L = Math.max(3, Math.round(dwellS / dt));
  if (n < 2 * L + 1) {
    warnings.push({
      code: 'record-shorter-than-dwell',
      message: `The record (${n} samples) is shorter than two dwells (${2 * L} samples); no steps searched. Give a shorter --min-dwell.`,
    });
    return empty(sigma, minStep, dwellS);
  }
  const offset = f[0] as number;
  const S = prefixSums(f, offset);
  const meanOf = (a: number, b: number): number => ((S[b] as number) - (S[a] as number)) / (b - a) + offset;

  const candidates = findCandidates(S, n, L, minStep);
  /** Every change found (kept or not): a later step's levels must not reach across any of them. */
  const events: { startIndex: number; endIndex: number; step: LevelStep | null }[] = [];
  const ramps: Ramp[] = [];
  for (let c = 0; c < candidates.length; c++) {
    const cand = candidates[c] as Candidate;
    const prev = candidates[c - 1];
    const next = candidates[c + 1];
    // Provisional levels from the dwell before and after the candidate, kept clear of the neighbours.
    const guardBefore = prev ? Math.min(L, Math.floor((cand.peak - prev.peak) / 4)) : L;
    const guardAfter = next ? Math.min(L, Math.floor((next.peak - cand.peak) / 4)) : L;
    // D(i) is 0 until its after-window reaches the change, so samples before regionStart − L are
    // untouched by it (a ramp's peak sits mid-ramp: one guard back from the peak is still on the ramp).
    const prevBound = prev ? prev.peak + guardBefore : 0;
    const beforeHi = Math.max(Math.min(cand.peak - guardBefore, cand.regionStart - L), prevBound + 3);
    const beforeLo = Math.max(0, beforeHi - L, prevBound);
    const afterHi = next ? Math.max(Math.min(next.peak - guardAfter, next.regionStart - L), cand.peak + guardAfter + 3) : n;
    const afterLo = Math.max(cand.peak + guardAfter, afterHi - L);
    if (beforeHi - beforeLo < 3 || afterHi - afterLo < 3) continue;
    // The old level right before the change: the last quarter of the dwell (a preceding settling
    // tail still creeping towards its plateau would bias a median of the whole dwell).
    const quarter = Math.max(3, Math.ceil(L / 4));
    let before = medianOfSlice(f, Math.max(beforeLo, beforeHi - quarter), beforeHi);
    const after = medianOfSlice(f, afterLo, afterHi);
    if (!(Math.abs(after - before) >= minStep) || Math.sign(after - before) !== cand.sign) continue;
    const sgn = cand.sign;
    const searchFrom = beforeHi;
    const searchTo = afterHi;
    /** Times the change relative to an old level: 10/50/90 % crossings and the last sample at the old level. */
    const timeChange = (oldLevel: number) => {
      const absDelta = Math.abs(after - oldLevel);
      // Smoothing width so that the 10 % level lies ≥ 3 smoothed-noise σ above the old level.
      const k = Math.min(L, Math.max(1, Math.ceil(((30 * sigma) / absDelta) ** 2))) | 1;
      const h = (k - 1) / 2;
      const smooth = (j: number): number => meanOf(Math.max(0, j - h), Math.min(n, j + h + 1));
      const progress = (j: number): number => (sgn * (smooth(j) - oldLevel)) / absDelta;
      const crossing = (from: number, level: number): number => {
        for (let j = from; j < searchTo; j++) if (progress(j) >= level) return j;
        return -1;
      };
      const i10 = crossing(searchFrom, 0.1);
      const i50 = Math.max(i10, crossing(i10, 0.5));
      const i90found = i10 < 0 ? -1 : crossing(i50, 0.9);
      const i90 = i90found < 0 ? afterLo : i90found;
      const band = Math.max((3 * sigma) / Math.sqrt(k), 0.02 * absDelta);
      let j = i10;
      while (j > searchFrom && sgn * (smooth(j) - oldLevel) > band) j--;
      return { i10, i50, i90, k, band, absDelta, progress, lastAtOld: Math.min(j + 1, i10) };
    };
    let timing = timeChange(before);
    if (timing.i10 < 0) continue;
    /** Timing against the plateau before the change (regionStart-bounded), kept for a ramp. */
    const plateauTiming = timing;
    const plateauLevel = before;
    // A gradual change: re-take the old level just before the estimated onset (twice), since the first
    // estimate may sit on the tail of an earlier transition.
    for (let pass = 0; pass < 2 && timing.i90 - timing.i10 > timing.k + 2; pass++) {
      const refined = medianOfSlice(f, Math.max(beforeLo, timing.lastAtOld - quarter), timing.lastAtOld);
      if (!Number.isFinite(refined) || !(Math.abs(after - refined) >= minStep)) break;
      const t2 = timeChange(refined);
      if (t2.i10 < 0) break;
      before = refined;
      timing = t2;
    }
    const { i10, i50, i90, k, band, absDelta, progress } = timing;
    const lastAtOldLevel = (): number => timing.lastAtOld;
    if (i90 - i10 <= k + 2) {
      let onsetIndex = i50;
      for (let j = Math.max(searchFrom, i10 - k - 1); j <= Math.min(n - 1, i90 + k + 1); j++) {
        if ((sgn * ((f[j] as number) - before)) / absDelta >= 0.5) {
          onsetIndex = j;
          break;
        }
      }
      events.push({ startIndex: onsetIndex, endIndex: onsetIndex, step: { onsetIndex, onsetS: timeS[onsetIndex] as number, before, after, shape: 'abrupt' } });
    } else if ((i90 - i50) / Math.max(1, i50 - i10) >= SETTLING_SHAPE_RATIO) {
      const onsetIndex = lastAtOldLevel();
      events.push({ startIndex: onsetIndex, endIndex: onsetIndex, step: { onsetIndex, onsetS: timeS[onsetIndex] as number, before, after, shape: 'gradual' } });
    } else {
      let end = i90;
      while (end < searchTo - 1 && progress(end) < 1 - band / absDelta) end++;
      // A ramp leaves its plateau at a constant rate: extrapolate the 10→90 % line back to 0 % of the
      // change relative to the plateau held before it (walking back to within a noise band instead
      // would start it late, and the step before it would then take part of the ramp as its level).
      const p = plateauTiming;
      const startIndex = Math.max(searchFrom, Math.min(p.i10, Math.round(p.i10 - (p.i90 - p.i10) / 8)));
      ramps.push({ startS: timeS[startIndex] as number, endS: timeS[end] as number, before: plateauLevel, after });
      events.push({ startIndex, endIndex: end, step: null });
    }
  }
  events.sort((a, b) => a.startIndex - b.startIndex);
  // Both levels must hold for the dwell: from the previous change (or the start) and to the next (or the end).
  const steps: LevelStep[] = [];
  let shortDwell = 0;
  let tooEarly = 0;
  const dwellSamples = Math.round(dwellS / dt) - 1;
  for (let e = 0; e < events.length; e++) {
    const ev = events[e] as (typeof events)[number];
    if (!ev.step) continue;
    const prevEnd = e > 0 ? (events[e - 1] as (typeof events)[number]).endIndex : 0;
    const nextStart = e + 1 < events.length ? (events[e + 1] as (typeof events)[number]).startIndex : n;
    if (ev.startIndex - prevEnd < dwellSamples) {
      if (e === 0) tooEarly++;
      else shortDwell++;
      continue;
    }
    if (nextStart - ev.startIndex < dwellSamples) {
      shortDwell++;
      continue;
    }
    // Final levels: medians of the dwell right before the onset and of the last dwell before the next change.
    const beforeFrom = ev.step.shape === 'abrupt' ? ev.startIndex - L : ev.startIndex - Math.max(3, Math.ceil(L / 4));
    const before = medianOfSlice(f, Math.max(prevEnd, beforeFrom), ev.startIndex);
    const after = medianOfSlice(f, Math.max(ev.startIndex, nextStart - L), nextStart);
    if (!(Math.abs(after - before) >= minStep)) continue;
    steps.push({ ...ev.step, before, after });
  }
  if (tooEarly > 0) {
    warnings.push({
      code: 'step-too-close-to-start',
      message: `${tooEarly} level change(s) within one dwell of the start were not analysed (no settled level before them).`,
      count: tooEarly,
    });
  }
  if (shortDwell > 0) {
    warnings.push({
      code: 'level-did-not-hold',
      message: `${shortDwell} level change(s) did not hold for the dwell of ${formatS(dwellS)} and were not counted as steps.`,
      count: shortDwell,
    });
  }
  if (ramps.length > 0) {
    warnings.push({
      code: 'ramp-not-analysed',
      message: `${ramps.length} ramp(s) found (a gradual, near-linear change, e.g. a ramp programme); ramps are not fitted as steps.`,
      count: ramps.length,
    });
  }
  return { steps, ramps, noiseSigma: sigma, minStepSize: minStep, minDwellS: dwellS, warnings };
}

/** Peaks of |D| over regions where it exceeds minStep/2 (hysteresis: the region ends below minStep/4 or on a sign change). */
function findCandidates(S: Float64Array, n: number, L: number, minStep: number): Candidate[] {
  const enter = minStep / 2;
  const leave = minStep / 4;
  const out: Candidate[] = [];
  let inRegion = false;
  let sign: 1 | -1 = 1;
  let best = 0;
  let peak = 0;
  let regionStart = 0;
  for (let i = L; i <= n - L; i++) {
    const d = ((S[i + L] as number) - 2 * (S[i] as number) + (S[i - L] as number)) / L;
    if (inRegion) {
      if (sign * d < leave) {
        out.push({ peak, regionStart, regionEnd: i, sign });
        inRegion = false;
      } else if (sign * d > best) {
        best = sign * d;
        peak = i;
      }
    }
    if (!inRegion && Math.abs(d) >= enter) {
      inRegion = true;
      sign = d > 0 ? 1 : -1;
      best = Math.abs(d);
      peak = i;
      regionStart = i;
    }
  }
  if (inRegion) out.push({ peak, regionStart, regionEnd: n - L, sign });
  return out;
}

function formatS(s: number): string {
  return `${Number(s.toPrecision(3))} s`;
}
