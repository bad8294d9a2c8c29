// Work files (src/ui/work/work-file.ts) and HTML escaping (src/ui/helpers/escape.ts).
// Behaviour is our own contract (common practice, no source); the escaped characters are the five
// the HTML spec treats as markup in text and attributes (OWASP XSS prevention cheat sheet, rule 1).
import { describe, expect, it } from 'vitest';
import { parseWork, serializeWork, WorkFileError, type WorkFile } from '../../src/ui/work/work-file';
import { escapeHtml } from '../../src/ui/helpers/escape';

const hash = 'a'.repeat(64);
const work: WorkFile = {
  format: 'lagbench-work', version: 1, savedAt: '2026-12-01T00:00:00Z',
  inputs: [{ path: '/d/run.csv', name: 'run.csv', sha256: hash, bytes: 10 }],
  importOptions: [{ decimal: ',' }], mergeOffsetS: 1.5, setup: 'flow-driven', chip: null,
  fit: { terms: 'auto', deadTime: false, drift: false, robust: 'none' },
  steps: [{ onsetS: 12.5, origin: 'user', direction: 'up', drive: { channel: null, quantity: 'flow_setpoint', before: Number.NaN, after: Number.NaN } }],
  stepEdits: [{ action: 'add', atS: 12.5 }],
};

describe('work files', () => {
  it('serializeWork then parseWork round-trips, NaN drive levels included', () => {
    const back = parseWork(serializeWork(work), 'w.json');
    expect(back.inputs).toEqual(work.inputs);
    expect(back.importOptions).toEqual([{ decimal: ',' }]);
    expect(back.mergeOffsetS).toBe(1.5);
    expect(back.steps?.[0]?.onsetS).toBe(12.5);
    expect(Number.isNaN(back.steps?.[0]?.drive.before)).toBe(true);
    expect(back.stepEdits).toEqual([{ action: 'add', atS: 12.5 }]);
  });

  it('parseWork refuses other formats, bad hashes, too many inputs and unknown setups with the file name', () => {
    expect(() => parseWork('{', 'w.json')).toThrow(/w\.json: not valid JSON/);
    expect(() => parseWork(JSON.stringify({ ...work, format: 'other' }), 'w.json')).toThrow(WorkFileError);
    expect(() => parseWork(JSON.stringify({ ...work, inputs: [{ ...work.inputs[0], sha256: 'xyz' }] }), 'w.json')).toThrow(/inputs/);
    expect(() => parseWork(JSON.stringify({ ...work, inputs: [work.inputs[0], work.inputs[0], work.inputs[0]] }), 'w.json')).toThrow(/one or two logs/);
    expect(() => parseWork(JSON.stringify({ ...work, setup: 'gravity' }), 'w.json')).toThrow(/setup/);
    expect(() => parseWork(JSON.stringify({ ...work, version: 2 }), 'w.json')).toThrow(/version 2/);
  });
});

describe('escapeHtml', () => {
  it('escapeHtml neutralises markup characters in user strings', () => {
    expect(escapeHtml(`<img src=x onerror="alert('1')">&`)).toBe('&lt;img src=x onerror=&quot;alert(&#39;1&#39;)&quot;&gt;&amp;');
    expect(escapeHtml('flow [µL/min]')).toBe('flow [µL/min]');
  });
});
