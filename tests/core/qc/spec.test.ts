import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { InputError } from '../../../src/core/errors';
import { parseJsonLocated } from '../../../src/core/qc/json-locate';
import { parseQcSpec } from '../../../src/core/qc/spec';
import { inputErrorOf } from '../../helpers/error-of';

const minimal = (limits: string, extra = ''): string => `{
  "lagbench_qc_spec": 1,
  "design": { "name": "M2" },
  "test": { "setup": "bench 1", "program": "steps" },
  "limits": ${limits}${extra}
}`;

const errorOf = inputErrorOf;

describe('parseJsonLocated', () => {
  it('parseJsonLocated(trailing comma) throws at the line:column of the closing brace', () => {
    const e = errorOf(() => parseJsonLocated('{\n  "a": 1,\n}', 'x.json'));
    expect(e.code).toBe('json-syntax');
    expect(e.location).toEqual({ file: 'x.json', line: 3, column: 1 }); // counted in the text: '}' opens line 3 (RFC 8259 has no trailing comma)
  });

  it('parseJsonLocated(duplicate key) is rejected at the second key', () => {
    const e = errorOf(() => parseJsonLocated('{"a": 1,\n "a": 2}'));
    expect(e.location).toMatchObject({ line: 2, column: 2 }); // counted in the text: the second "a" starts at line 2, column 2
    expect(e.problem).toMatch(/twice/);
  });

  it('parseJsonLocated locates nested values and agrees with JSON.parse on the value', () => {
    const text = '{\n "x": [1, {"y": -2.5e-3}],\n "s": "a\\u00e9\\n"\n}';
    const doc = parseJsonLocated(text);
    // Reference: the platform JSON parser (ECMA-262 JSON.parse).
    expect(doc.value).toEqual(JSON.parse(text));
    // Expected column counted from the text itself (1-based).
    expect(doc.locate(['x', 1, 'y'])).toEqual({ line: 2, column: text.split('\n')[1]!.indexOf('-2.5') + 1 });
    expect(doc.locate(['s'])).toEqual({ line: 3, column: 7 }); // counted in the text: ' "s": ' is 6 characters
  });

  it('parseJsonLocated rejects what JSON.parse rejects (leading zeros, single quotes, NaN)', () => {
    for (const bad of ['{"a": 01}', "{'a': 1}", '{"a": NaN}', '[1 2]', '"open']) {
      expect(() => JSON.parse(bad)).toThrow();
      expect(() => parseJsonLocated(bad)).toThrow(InputError);
    }
  });
});

describe('parseQcSpec', () => {
  it('parseQcSpec(every example in qc-specs/) validates', () => {
    const files = readdirSync('qc-specs').filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) {
      const spec = parseQcSpec(readFileSync(`qc-specs/${f}`, 'utf8'), f);
      // A referenced chip description must exist (paths are relative to the spec file).
      if (spec.test.chipDescription) expect(existsSync(join('qc-specs', spec.test.chipDescription)), `${f}: ${spec.test.chipDescription}`).toBe(true);
    }
  });

  it('parseQcSpec(nominal ± %) gives limits nominal·(1 ∓ tol/100) in SI', () => {
    const spec = parseQcSpec(minimal('{ "resistance": { "unit": "Pa_s_per_m3", "nominal": 2.4e13, "tolerance_percent": 10 } }'));
    const r = spec.limits[0];
    // Derivation: 2.4e13 × 0.9 = 2.16e13, × 1.1 = 2.64e13.
    expect(r?.lowerSi).toBeCloseTo(2.16e13, -6);
    expect(r?.upperSi).toBeCloseTo(2.64e13, -6);
    expect(spec.inconclusiveCountsAs).toBe('inconclusive');
    expect(spec.fitQuality.requireConverged).toBe(true);
  });

  it('parseQcSpec converts spec units to SI (physics.md §5: 1 µL/mbar = 1e-11 m³/Pa; 1 mbar/(µL/min) = 6e12 Pa·s/m³)', () => {
    const spec = parseQcSpec(minimal('{ "compliance": { "unit": "uL_per_mbar", "max": 2 }, "trapped_air": { "unit": "uL", "max": 0.5 }, "resistance": { "unit": "mbar_per_uL_per_min", "min": 1 } }'));
    const by = Object.fromEntries(spec.limits.map((l) => [l.quantity, l]));
    expect(by.compliance?.upperSi).toBeCloseTo(2e-11, 24); // 2 µL/mbar = 2e-9 m³ / 100 Pa
    expect(by.trapped_air?.upperSi).toBeCloseTo(5e-10, 22); // 0.5 µL = 0.5e-9 m³ (BIPM SI Brochure Table 8: 1 L = 1e-3 m³)
    // 1 mbar/(µL/min) = 100 Pa / (1e-9 m³ / 60 s) = 6e12 Pa·s/m³ (from the unit definitions).
    expect(by.resistance?.lowerSi).toBeCloseTo(6e12, 0);
  });

  it('parseQcSpec(unknown unit) names the path and the line:column of the value, and the allowed units', () => {
    const text = minimal('{\n    "trapped_air": { "unit": "gallons", "max": 1 }\n  }');
    const e = errorOf(() => parseQcSpec(text, 'spec.json'));
    expect(e.code).toBe('qc-spec-invalid');
    // Counted in the text: the limits object opens on line 5; the value "gallons" (its opening quote) is at line 6, column 30.
    expect(e.location).toEqual({ file: 'spec.json', line: 6, column: 30 });
    expect(e.message).toMatch(/limits\.trapped_air\.unit/);
    expect(e.message).toMatch(/uL/);
  });

  it('parseQcSpec lists every problem, each located', () => {
    const text = minimal('{ "tau": { "unit": "s", "min": 5, "max": 2 } }', ',\n  "inconclusive_counts_as": "maybe",\n  "colour": "red"');
    const e = errorOf(() => parseQcSpec(text, 's.json'));
    const issues = (e as InputError & { issues: { path: string; line: number }[] }).issues;
    // In file order.
    expect(issues.map((i) => i.path)).toEqual(['limits.tau.max', 'inconclusive_counts_as', 'colour']);
    expect(issues.find((i) => i.path === 'colour')?.line).toBe(7); // counted in the text of minimal() + extra
    expect(e.message).toMatch(/2 more problem/);
  });

  it('parseQcSpec rejects min/max mixed with nominal, missing tolerance, tolerance ≥ 100, text numbers', () => {
    // Rules of our own spec format (docs/qc-spec.md); the numbers are test inputs.
    expect(() => parseQcSpec(minimal('{ "resistance": { "unit": "Pa_s_per_m3", "nominal": 1, "tolerance_percent": 5, "max": 2 } }'))).toThrow(/mixes/);
    expect(() => parseQcSpec(minimal('{ "resistance": { "unit": "Pa_s_per_m3", "nominal": 1 } }'))).toThrow(/needs both/);
    expect(() => parseQcSpec(minimal('{ "resistance": { "unit": "Pa_s_per_m3", "nominal": 1, "tolerance_percent": 100 } }'))).toThrow(/between 0 and 100/);
    expect(() => parseQcSpec(minimal('{ "t95": { "unit": "s", "max": "20" } }'))).toThrow(/must be a number/);
    expect(() => parseQcSpec(minimal('{}'))).toThrow(/empty/);
  });

  it('parseQcSpec(bad chip_id_from regex, unknown fit flag) is rejected with the reason', () => {
    expect(() => parseQcSpec(minimal('{ "t95": { "unit": "s", "max": 20 } }', ',\n "chip_id_from": "filename:(["'))).toThrow(/invalid regular expression/);
    expect(() => parseQcSpec(minimal('{ "t95": { "unit": "s", "max": 20 } }', ',\n "fit_quality": { "reject_flags": ["wobbly"] }'))).toThrow(/Unknown fit flag/);
  });
});

describe('parseJsonLocated (shared located parser)', () => {
  it('parseJsonLocated keeps a "__proto__" key as an own property, as JSON.parse does (ECMA-262 JSON.parse as reference)', () => {
    const text = '{"__proto__": {"polluted": 1}}';
    const doc = parseJsonLocated(text);
    expect(doc.value).toEqual(JSON.parse(text));
    expect(Object.getPrototypeOf(doc.value)).toBe(Object.prototype);
  });

  it('parseJsonLocated refuses nesting deeper than 200 levels with a located error instead of a stack overflow', () => {
    const e = errorOf(() => parseJsonLocated('['.repeat(5000) + ']'.repeat(5000), 'deep.json'));
    expect(e.code).toBe('json-syntax');
    expect(e.location).toMatchObject({ file: 'deep.json', line: 1, column: 201 }); // counted: the 201st '[' opens level 201
  });
});
