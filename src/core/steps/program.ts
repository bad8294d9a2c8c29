/** Steps from a user-given programme (times and new drive levels), for logs that hold only the response. */
import type { Quantity } from '../recording/types';
import type { ProgramEntry } from './step-list';
import type { Ramp, Step } from './types';

/** The changes of a programme (steps and ramps) in time order, before `endS`. */
function changesOf(entries: readonly ProgramEntry[], endS: number): { onsetS: number; before: number; after: number; rampS: number }[] {
  const changes: { onsetS: number; before: number; after: number; rampS: number }[] = [];
  let level = entries[0]?.value ?? Number.NaN;
  for (let i = 1; i < entries.length; i++) {
    const e = entries[i] as ProgramEntry;
    if (e.value === level) continue;
    if (e.timeS >= endS) break;
    changes.push({ onsetS: e.timeS, before: level, after: e.value, rampS: e.rampS ?? 0 });
    level = e.value;
  }
  return changes;
}

/**
 * Turns a programme into steps: the first entry is the level from the start of the log; each later
 * entry with a different value is a step at its time (a ramp when it has rampS > 0: not a step, see
 * {@link rampsFromProgram}). Each window ends at the next change (step or ramp) or at `endS` (the end
 * of the recording; +∞ when unknown). Entries at or after `endS` are left out.
 */
export function stepsFromProgram(entries: readonly ProgramEntry[], quantity: Quantity, endS = Number.POSITIVE_INFINITY): Step[] {
  const changes = changesOf(entries, endS);
  const steps: Step[] = [];
  changes.forEach((c, i) => {
    if (c.rampS > 0) return;
    steps.push({
      index: steps.length,
      onsetS: c.onsetS,
      drive: { channel: null, quantity, before: c.before, after: c.after },
      direction: c.after > c.before ? 'up' : 'down',
      windowEndS: changes[i + 1]?.onsetS ?? endS,
      origin: 'user',
    });
  });
  return steps;
}

/** The ramps of a programme (rows with rampS > 0), before `endS`. */
export function rampsFromProgram(entries: readonly ProgramEntry[], endS = Number.POSITIVE_INFINITY): Ramp[] {
  return changesOf(entries, endS)
    .filter((c) => c.rampS > 0)
    .map((c) => ({ startS: c.onsetS, endS: c.onsetS + c.rampS, before: c.before, after: c.after }));
}
