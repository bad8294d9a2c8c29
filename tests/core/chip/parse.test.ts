import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { ChipDescriptionError, parseChipDescription } from '../../../src/core/chip/parse';
import { parseLocatedJson } from '../../../src/core/json/located-json';
import { inputErrorOf } from '../../helpers/error-of';

/** Runs the parser and returns the error it throws (fails the test when none). */
function errorOf(text: string): InputError {
  return inputErrorOf(() => parseChipDescription(text, 'chip.json'));
}

const valid = `{
  "format": "lagbench-chip/1",
  "fluid": { "preset": "water", "temperature": "22 C" },
  "chipBody": { "material": "pdms" },
  "path": {
    "upstream": [
      { "type": "tubing", "innerDiameter": "0.8 mm", "outerDiameter": "1/16 in", "length": "50 cm", "material": "ptfe" }
    ],
    "chip": [
      { "type": "rectangular-channel", "width": "100 um", "height": "50 um", "length": "1 cm" }
    ]
  },
  "ratings": { "chip": "2 bar" }
}`;

// Format, codes and wording are our own (docs/chip-description.md); line numbers are counted in the texts above.
describe('parseChipDescription', () => {
  it('parseChipDescription converts lengths, temperatures and pressures to SI', () => {
    const c = parseChipDescription(valid, 'chip.json');
    const tube = c.path.upstream[0];
    expect(tube?.type).toBe('tubing');
    if (tube?.type !== 'tubing') return;
    expect(tube.innerDiameterM).toBeCloseTo(0.8e-3, 15);
    expect(tube.outerDiameterM).toBeCloseTo(0.0015875, 15); // 1/16 in = 1.5875 mm (1 in = 25.4 mm exactly)
    expect(tube.lengthM).toBeCloseTo(0.5, 15);
    expect(tube.material.id).toBe('ptfe');
    expect(tube.ends).toBe('open');
    expect(c.fluid.temperatureK).toBeCloseTo(295.15, 12); // 22 °C + 273.15 (BIPM SI Brochure §2.3.1, exact)
    expect(c.ambientPressurePa).toBe(101325); // default: standard atmosphere (ISO 2533; NIST SP 811 B.8)
    expect(c.ratingsPa.chip).toBe(2e5); // 2 bar = 2e5 Pa (NIST SP 811 B.8, exact)
    expect(c.body.kind).toBe('elastomer');
    expect(tube.origin).toEqual({ jsonPath: '$.path.upstream[0]', line: 7, column: 7 });
  });

  it('parseChipDescription parses every sample chip description', () => {
    for (const f of ['pdms-mixer.json', 'glass-chip-pressure.json', 'pdms-mixer-soft-tubing.json']) {
      const c = parseChipDescription(readFileSync(`sample-logs/chips/${f}`, 'utf8'), f);
      expect(c.path.chip.length).toBeGreaterThan(0);
      expect(c.note).toMatch(/[Ii]nvented/);
    }
  });

  it('parseChipDescription accepts the complete example of docs/chip-description.md (docs stay true)', () => {
    const md = readFileSync('docs/chip-description.md', 'utf8');
    const block = /## Complete example\s+```json\n([\s\S]*?)```/.exec(md)?.[1];
    expect(block).toBeDefined();
    const c = parseChipDescription(block as string, 'docs-example.json');
    // Expected: the 4 chip elements and the ratings written in that docs example, converted (1 bar = 1e5 Pa).
    expect(c.path.chip).toHaveLength(4);
    expect(c.ratingsPa).toEqual({ chip: 2e5, bonding: 2e5, tubing: 1e6, fittings: 7e5 });
  });

  it('parseChipDescription reports a JSON syntax error at its line and column', () => {
    const text = valid.replace('"length": "1 cm" }', '"length": "1 cm", }');
    const e = errorOf(text);
    expect(e.code).toBe('json-syntax');
    // The error points at the '}' that follows the trailing comma on line 10.
    const column = (text.split('\n')[9] as string).indexOf(', }') + 3;
    expect(e.location).toEqual({ file: 'chip.json', line: 10, column });
    expect(e.message).toMatch(new RegExp(`^chip\\.json:10:${column}: JSON syntax error: trailing comma`));
  });

  it('parseChipDescription rejects an unquoted value with a unit and says how to write it', () => {
    const e = errorOf(valid.replace('"width": "100 um"', '"width": 100um'));
    expect(e.location.line).toBe(10);
    expect(e.hint).toMatch(/double quotes/);
  });

  it('parseChipDescription locates a bad unit at the offending value, with its JSON path', () => {
    const e = errorOf(valid.replace('"height": "50 um"', '"height": "50 furlongs"'));
    expect(e.code).toBe('bad-quantity');
    expect(e.problem).toMatch(/^\$\.path\.chip\[0\]\.height: unknown length unit "furlongs"/);
    // Line 10; the value starts after `"height": ` on that line.
    const line = valid.split('\n')[9] as string;
    expect(e.location).toEqual({ file: 'chip.json', line: 10, column: line.indexOf('"50 um"') + 1 });
    expect(e.hint).toMatch(/250 um/);
  });

  it('parseChipDescription suggests the right spelling of a misspelt member and points at its key', () => {
    const e = errorOf(valid.replace('"innerDiameter"', '"innerDiamter"'));
    expect(e.code).toBe('unknown-member');
    expect(e.hint).toMatch(/Did you mean "innerDiameter"/);
    const line = valid.split('\n')[6] as string;
    expect(e.location.line).toBe(7);
    expect(e.location.column).toBe(line.indexOf('"innerDiameter"') + 1);
  });

  it('parseChipDescription names a missing required member and the object that lacks it', () => {
    const e = errorOf(valid.replace(', "length": "1 cm"', ''));
    expect(e.code).toBe('missing-member');
    expect(e.problem).toMatch(/\$\.path\.chip\[0\]: the required member "length" is missing/);
    expect(e.location.line).toBe(10);
  });

  it('parseChipDescription rejects tubing whose outer diameter is not larger than the inner one', () => {
    const e = errorOf(valid.replace('"outerDiameter": "1/16 in"', '"outerDiameter": "0.5 mm"'));
    expect(e.code).toBe('bad-geometry');
    expect(e.problem).toMatch(/outerDiameter/);
  });

  it('parseChipDescription reports all problems of several elements together', () => {
    const text = valid
      .replace('"material": "ptfe"', '"material": "teflon"')
      .replace('"width": "100 um"', '"width": "-100 um"');
    const e = errorOf(text);
    expect(e).toBeInstanceOf(ChipDescriptionError);
    expect((e as ChipDescriptionError).problems).toHaveLength(2);
    expect(e.message).toMatch(/2 problems in the chip description/);
    expect(e.message).toMatch(/chip\.json:7:\d+: \$\.path\.upstream\[0\]\.material: "teflon" is not one of the known values/);
    expect(e.message).toMatch(/chip\.json:10:\d+: \$\.path\.chip\[0\]\.width: the length must be greater than zero/);
  });

  it('parseChipDescription rejects a fluid temperature outside the data, located at the fluid', () => {
    const e = errorOf(valid.replace('"temperature": "22 C"', '"temperature": "22"'));
    expect(e.code).toBe('fluid-temperature-out-of-range');
    expect(e.location.line).toBe(3);
  });

  it('parseChipDescription rejects an unknown format tag', () => {
    expect(errorOf(valid.replace('lagbench-chip/1', 'lagbench-chip/9')).code).toBe('unknown-format');
  });

  it('parseChipDescription requires a glycerol mass fraction for glycerol-water', () => {
    const e = errorOf(valid.replace('"preset": "water"', '"preset": "glycerol-water"'));
    expect(e.problem).toMatch(/glycerolMassFraction/);
  });

  it('parseChipDescription needs at least two branches in a parallel group', () => {
    const e = errorOf(valid.replace('"chip": [', '"chip": [ { "type": "parallel", "branches": [[ { "type": "measured", "resistance": 1e13 } ]] },'));
    expect(e.code).toBe('parallel-branches');
  });

  it('parseChipDescription refuses a path without any resistance', () => {
    const e = errorOf(valid.replace(/"upstream": \[[\s\S]*?\],\n/, '').replace(/\{ "type": "rectangular-channel"[^}]*\}/, '{ "type": "chamber", "volume": "5 uL" }'));
    expect(e.code).toBe('no-resistance');
  });
});

describe('parseLocatedJson', () => {
  it('parseLocatedJson records 1-based positions of values and keys', () => {
    const node = parseLocatedJson('{\n  "a": [1, "x"]\n}', 'f');
    expect(node.kind).toBe('object');
    if (node.kind !== 'object') return;
    const entry = node.entries[0];
    expect(entry?.keyPos).toEqual({ line: 2, column: 3 });
    expect(entry?.value.pos).toEqual({ line: 2, column: 8 });
    if (entry?.value.kind !== 'array') return;
    expect(entry.value.items[1]?.pos).toEqual({ line: 2, column: 12 });
  });

  it('parseLocatedJson agrees with JSON.parse on values', () => {
    const text = '{"n": -1.5e-3, "s": "a\\u00b5\\n", "b": [true, false, null], "o": {}}';
    const toPlain = (n: ReturnType<typeof parseLocatedJson>): unknown => {
      switch (n.kind) {
        case 'object':
          return Object.fromEntries(n.entries.map((e) => [e.key, toPlain(e.value)]));
        case 'array':
          return n.items.map(toPlain);
        case 'null':
          return null;
        default:
          return n.value;
      }
    };
    expect(toPlain(parseLocatedJson(text, 'f'))).toEqual(JSON.parse(text));
  });

  it('parseLocatedJson rejects duplicate members, comments and single quotes with positions', () => {
    expect(() => parseLocatedJson('{"a": 1, "a": 2}', 'f')).toThrow(/f:1:10: .*appears twice/);
    expect(() => parseLocatedJson('{\n // note\n "a": 1}', 'f')).toThrow(/f:2:2: .*comments are not allowed/);
    expect(() => parseLocatedJson("{'a': 1}", 'f')).toThrow(/f:1:2: /);
    expect(() => parseLocatedJson('', 'f')).toThrow(/empty/);
  });
});

describe('parseChipDescription material and fluid options', () => {
  const base = (tube: object, fluid: object = { preset: 'water', temperature: '20 C' }): string =>
    JSON.stringify({
      format: 'lagbench-chip/1',
      fluid,
      chipBody: { material: 'glass' },
      path: { upstream: [{ type: 'tubing', innerDiameter: '1 mm', outerDiameter: '3 mm', length: '10 cm', ...tube }], chip: [{ type: 'measured', resistance: 1e13 }] },
    });

  it('parseChipDescription turns a Shore A hardness into a ±50 % modulus range (Gent 1958)', () => {
    // physics.md §3.8: Gent relation [M] gives about 2.5 MPa at Shore A 50 [N].
    const c = parseChipDescription(base({ material: 'custom', shoreA: 50 }), 'c.json');
    const t = c.path.upstream[0];
    if (t?.type !== 'tubing') throw new Error('expected tubing');
    expect(t.material.modulusPa.nominal / 1e6).toBeCloseTo(2.5, 1);
    expect(t.material.modulusPa.high / t.material.modulusPa.low).toBeCloseTo(3, 12); // ±50 % (physics.md §3.8): 1.5/0.5
    expect(t.material.tag).toBe('M');
  });

  it('parseChipDescription refuses "shoreA" together with a table material', () => {
    expect(() => parseChipDescription(base({ material: 'silicone', shoreA: 50 }), 'c.json')).toThrow(/"shoreA" is only for "material": "custom"/);
  });

  it('parseChipDescription reads a custom fluid with density in g/mL', () => {
    const c = parseChipDescription(base({ material: 'ptfe' }, { preset: 'custom', name: 'oil', temperature: '20 C', viscosity: '20 cP', density: '0.85 g/mL' }), 'c.json');
    expect(c.fluid.kind).toBe('custom');
    if (c.fluid.kind !== 'custom') return;
    expect(c.fluid.viscosityPaS).toBeCloseTo(0.02, 12); // 1 cP = 1e-3 Pa·s (NIST SP 811 B.8)
    expect(c.fluid.densityKgPerM3).toBeCloseTo(850, 9); // 1 g/mL = 1000 kg/m³ (definition of the units)
  });
});
