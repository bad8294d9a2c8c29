// Manual step edits in the renderer (src/ui/steps-edit.ts). Expected behaviour is our own contract
// (common practice, no source).
import { describe, expect, it } from 'vitest';
import type { Step } from '../../src/core/steps/types';
import { addStep, deleteStep, moveStep, normalizeSteps } from '../../src/ui/steps-edit';

const step = (onsetS: number): Step => ({
  index: 0, onsetS, windowEndS: 0, direction: 'up', origin: 'drive',
  drive: { channel: 'flow_setpoint_m3_per_s', quantity: 'flow_setpoint', before: 0, after: 1 },
});

describe('steps-edit', () => {
  it('normalizeSteps sorts, renumbers and runs each window to the next onset', () => {
    const s = normalizeSteps([step(50), step(10), step(30)], 100);
    expect(s.map((x) => [x.index, x.onsetS, x.windowEndS])).toEqual([[0, 10, 30], [1, 30, 50], [2, 50, 100]]);
  });

  it('moveStep keeps a step strictly between its neighbours and marks it as a user step', () => {
    const s = normalizeSteps([step(10), step(30), step(50)], 100);
    const moved = moveStep(s, 1, 80, 100);
    expect(moved[1]?.onsetS).toBeLessThan(50);
    expect(moved[1]?.onsetS).toBeGreaterThan(49.9);
    expect(moved[1]?.origin).toBe('user');
    expect(moved[0]?.windowEndS).toBe(moved[1]?.onsetS);
    expect(moveStep(s, 0, -5, 100)[0]?.onsetS).toBeGreaterThan(0);
  });

  it('addStep inserts a user step in order with unknown drive levels, and ignores times outside or on a step', () => {
    const s = normalizeSteps([step(10), step(50)], 100);
    const added = addStep(s, 30, 100, 'flow_setpoint');
    expect(added.map((x) => x.onsetS)).toEqual([10, 30, 50]);
    expect(added[1]?.origin).toBe('user');
    expect(Number.isNaN(added[1]?.drive.before)).toBe(true);
    expect(addStep(s, 150, 100, 'flow_setpoint')).toHaveLength(2);
    expect(addStep(s, 0, 100, 'flow_setpoint')).toHaveLength(2);
    expect(addStep(s, 10, 100, 'flow_setpoint')).toHaveLength(2);
  });

  it('deleteStep removes one step and extends the previous window', () => {
    const s = deleteStep(normalizeSteps([step(10), step(30), step(50)], 100), 1, 100);
    expect(s.map((x) => [x.index, x.onsetS, x.windowEndS])).toEqual([[0, 10, 50], [1, 50, 100]]);
  });
});
