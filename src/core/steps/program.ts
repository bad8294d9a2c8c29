/** Steps from a user-given programme (times and new drive levels), for logs that hold only the response. */
import type { Quantity } from '../recording/types';
import type { ProgramEntry } from './step-list';
import type { Step } from './types';

/**
 * Turns a programme into steps: the first entry is the level from the start of the log; each later
 * entry with a different value is a step at its time. Each window ends at the next change or at
 * `endS` (the end of the recording; +∞ when unknown). Entries at or after `endS` are left out.
 */
export function stepsFromProgram(entries: readonly ProgramEntry[], quantity: Quantity, endS = Number.POSITIVE_INFINITY): Step[] {
  const changes: { onsetS: number; before: number; after: number }[] = [];
  let level = entries[0]?.value ?? Number.NaN;
  for (let i = 1; i < entries.length; i++) {
    const e = entries[i] as ProgramEntry;
    if (e.value === level) continue;
    if (e.timeS >= endS) break;
    changes.push({ onsetS: e.timeS, before: level, after: e.value });
    level = e.value;
  }
  return changes.map((c, index) => ({
    index,
    onsetS: c.onsetS,
    drive: { channel: null, quantity, before: c.before, after: c.after },
    direction: c.after > c.before ? 'up' : 'down',
    windowEndS: changes[index + 1]?.onsetS ?? endS,
    origin: 'user',
  }));
}
