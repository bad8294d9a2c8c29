/**
 * The README's `analyze --json` field table against a real result, so the documentation cannot drift
 * from the code (GUIDE §2: "docs that drift from the code — generate or test examples").
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyzeRecording } from '../../src/core/analyze/analyze';
import { defaultFitter } from '../../src/core/analyze/default-fitter';
import { addPhysics } from '../../src/core/analyze/physics';
import { syntheticLog, UL_PER_MIN } from '../core/steps/synthetic-logs';

function documentedFields(): { top: Set<string>; step: Set<string> } {
  const readme = readFileSync('README.md', 'utf8');
  const start = readme.indexOf('### `analyze --json` fields');
  expect(start).toBeGreaterThan(0);
  const table = readme.slice(start).split('\n').filter((l) => l.startsWith('| `'));
  const top = new Set<string>();
  const step = new Set<string>();
  for (const row of table) {
    const cell = row.split('|')[1] ?? '';
    for (const m of cell.matchAll(/`([^`]+)`/g)) {
      const name = (m[1] as string).replace(/\[\]$/, '');
      if (name.startsWith('steps[].')) step.add(name.slice('steps[].'.length));
      else if (/^[a-z0-9_]+$/.test(name)) (row.split('|')[1]!.includes('steps[].') ? step : top).add(name);
    }
  }
  if (step.size > 0) top.add('steps');
  return { top, step };
}

describe('README analyze JSON table', () => {
  it('documents every top-level and per-step field of analyze --json (pipeline + physics stage), and no other', () => {
    // A two-step flow-driven log (closed-form first-order response, physics.md §4.2), invented values.
    const rec = syntheticLog({
      sampleRateHz: 20,
      durationS: 90,
      program: [
        { timeS: 0, value: 0 },
        { timeS: 30.01, value: 10 * UL_PER_MIN },
        { timeS: 60.01, value: 0 },
      ],
      driveQuantity: 'flow_setpoint',
      responseQuantity: 'pressure',
      gain: 6e13,
      tauS: 2,
      responseNoise: 20,
      seed: 51,
    });
    // What `analyze --json` prints: the pipeline's result with the physics stage added.
    const a = addPhysics(analyzeRecording(rec, { fit: { terms: 1 } }, defaultFitter), rec, {});
    const { top, step } = documentedFields();
    expect([...top].sort()).toEqual(Object.keys(a).sort());
    expect([...step].sort()).toEqual(Object.keys(a.steps[0]!).sort());
  });
});
