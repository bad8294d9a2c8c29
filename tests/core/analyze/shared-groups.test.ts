/** sameLevelGroups: which steps may share τ (same direction, same levels within the tolerance). */
import { describe, expect, it } from 'vitest';
import { sameLevelGroups } from '../../../src/core/analyze/shared';
import type { Step } from '../../../src/core/steps/types';

const s = (index: number, before: number, after: number): Step => ({
  index,
  onsetS: index * 60,
  windowEndS: index * 60 + 60,
  origin: 'drive',
  direction: after > before ? 'up' : 'down',
  drive: { channel: 'q', quantity: 'flow_setpoint', before, after },
});

describe('sameLevelGroups', () => {
  it('sameLevelGroups(steps) groups repeats of the same step and leaves singles out', () => {
    const steps = [s(0, 0, 10), s(1, 10, 0), s(2, 0, 10.1), s(3, 10, 0), s(4, 0, 20), s(5, 0, 10)];
    const groups = sameLevelGroups(steps, (x) => 0.02 * Math.abs(x.drive.after - x.drive.before));
    expect(groups.map((g) => g.map((x) => x.index))).toEqual([
      [0, 2, 5],
      [1, 3],
    ]);
  });

  it('sameLevelGroups(unknown level) leaves a step with a NaN level out', () => {
    expect(sameLevelGroups([s(0, Number.NaN, 1), s(1, Number.NaN, 1)], () => 1)).toEqual([]);
  });
});
