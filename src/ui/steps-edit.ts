/**
 * Manual step edits (add, move, delete) on the step list, kept ordered with each analysis window
 * running to the next onset or the end. Edited and added steps get origin 'user'; the worker
 * re-reads their drive levels from the recording.
 */
import type { Quantity } from '../core/recording/types';
import type { Step } from '../core/steps/types';

export type StepEdit =
  | { action: 'add'; atS: number }
  | { action: 'move'; fromS: number; toS: number }
  | { action: 'delete'; atS: number };

/** Sorts by onset, renumbers, sets each window's end to the next onset (or the recording's end). */
export function normalizeSteps(steps: readonly Step[], durationS: number): Step[] {
  const sorted = [...steps].sort((a, b) => a.onsetS - b.onsetS);
  return sorted.map((s, i) => ({ ...s, index: i, windowEndS: sorted[i + 1]?.onsetS ?? durationS }));
}

/** Smallest gap kept between two onsets when moving, s. */
function minGap(durationS: number): number {
  return Math.max(durationS * 1e-4, 1e-6);
}

/** Moves step `index` to `toS`, kept strictly between its neighbours and inside the recording. */
export function moveStep(steps: readonly Step[], index: number, toS: number, durationS: number): Step[] {
  const s = steps[index];
  if (!s) return [...steps];
  const gap = minGap(durationS);
  const lo = (steps[index - 1]?.onsetS ?? 0) + gap;
  const hi = (steps[index + 1]?.onsetS ?? durationS) - gap;
  const t = Math.min(hi, Math.max(lo, toS));
  const out = [...steps];
  out[index] = { ...s, onsetS: t, origin: 'user' };
  return normalizeSteps(out, durationS);
}

/** Adds a user step at `atS` (ignored when it would sit on an existing onset or outside the recording). */
export function addStep(steps: readonly Step[], atS: number, durationS: number, quantity: Quantity): Step[] {
  if (!(atS > 0 && atS < durationS)) return [...steps];
  if (steps.some((s) => Math.abs(s.onsetS - atS) < minGap(durationS))) return [...steps];
  const step: Step = {
    index: -1,
    onsetS: atS,
    drive: { channel: null, quantity, before: Number.NaN, after: Number.NaN },
    direction: 'up',
    windowEndS: durationS,
    origin: 'user',
  };
  return normalizeSteps([...steps, step], durationS);
}

export function deleteStep(steps: readonly Step[], index: number, durationS: number): Step[] {
  return normalizeSteps(steps.filter((_, i) => i !== index), durationS);
}
