// Property: whatever text it is given, the importer either returns a recording whose time strictly increases
// or throws one InputError; never another exception (which the CLI would report as an internal error).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { parseLogText } from '../../../src/core/import/index';

const pieces = ['Time [s]', 'Pressure [mbar]', 'Flow (µL/min)', 'P_set_kPa', 'Elapsed', '# Operator: X', 'Date: 2026-03-14', 's', 'mbar',
  '0', '1.5', '-2,25', '"3.5"', '1e-3', 'NaN', '', 'abc', '00:00:01.5', '23:59:59,9', '2026-03-14T10:00:00Z', '2026-03-14 10:00:00,5+01:00', '\uFEFF'];

const lineArb = fc.array(fc.constantFrom(...pieces), { minLength: 0, maxLength: 5 }).chain((cells) =>
  fc.constantFrom(',', ';', '\t', '  ', ' ').map((sep) => cells.join(sep)),
);
const textArb = fc.tuple(fc.array(lineArb, { minLength: 0, maxLength: 12 }), fc.constantFrom('\n', '\r\n', '\r')).map(([lines, nl]) => lines.join(nl));

function check(text: string): void {
  try {
    const { recording } = parseLogText(text);
    for (let i = 1; i < recording.timeS.length; i++) expect(recording.timeS[i]!).toBeGreaterThan(recording.timeS[i - 1]!);
    for (const c of recording.channels) expect(c.values.length).toBe(recording.timeS.length);
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    expect(err.message.length).toBeGreaterThan(0);
  }
}

describe('parseLogText on arbitrary text (fast-check)', () => {
  it('parseLogText(log-like fragments in random order) returns a valid recording or throws InputError', () => {
    fc.assert(fc.property(textArb, (text) => check(text)), { seed: 42, numRuns: 2000 });
  });

  it('parseLogText(random unicode text) returns a valid recording or throws InputError', () => {
    fc.assert(fc.property(fc.string({ unit: 'grapheme', maxLength: 300 }), (text) => check(text)), { seed: 43, numRuns: 1000 });
  });
});
