// The byte tokenizer (createLogParser().push(Uint8Array), used by readLogFile for UTF-8 files) against two
// references: ECMAScript's Number(text), which reads decimal text to the nearest double (ECMA-262,
// StringToNumber; V8 rounds correctly), and the importer's text path (parseLogText), whose behaviour the other
// import tests pin down. Seeded for determinism.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { createLogParser, parseLogText, type ImportOptions, type ImportResult } from '../../../src/core/import/index';
import { writeLog, type LogDialect } from '../../../src/core/logformat/index';
import type { Recording } from '../../../src/core/recording/types';

/** Feeds the UTF-8 bytes of `text` to a parser, cut at the given points. */
function parseBytes(text: string, cuts: number[], options: ImportOptions = {}): ImportResult {
  const bytes = new TextEncoder().encode(text);
  const points = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
  const parser = createLogParser(options);
  let from = 0;
  // one reused buffer, as readLogFile reuses its read buffer: the parser must copy what it keeps
  const buffer = new Uint8Array(bytes.length);
  for (const p of [...points, bytes.length]) {
    buffer.set(bytes.subarray(from, p));
    parser.push(buffer.subarray(0, p - from));
    buffer.fill(0x2a);
    from = p;
  }
  return parser.finish();
}

type Outcome = { ok: ImportResult } | { error: { code: string; message: string; location: unknown } };

function outcome(run: () => ImportResult): Outcome {
  try {
    return { ok: run() };
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    return { error: { code: err.code, message: err.message, location: err.location } };
  }
}

/** Same recording and report (bytes counted as bytes, not characters), or the same located error. */
function expectSameOutcome(fromBytes: Outcome, fromText: Outcome): void {
  if ('error' in fromText) {
    expect(fromBytes).toEqual(fromText);
    return;
  }
  expect('ok' in fromBytes).toBe(true);
  if (!('ok' in fromBytes)) return;
  const a = fromBytes.ok;
  const b = fromText.ok;
  expect({ ...a.report, bytes: 0 }).toEqual({ ...b.report, bytes: 0 });
  expect(a.recording.warnings).toEqual(b.recording.warnings);
  expect(a.recording.startEpochMs).toBe(b.recording.startEpochMs);
  expect(Array.from(a.recording.timeS)).toEqual(Array.from(b.recording.timeS));
  a.recording.channels.forEach((c, k) => expect(Array.from(c.values)).toEqual(Array.from(b.recording.channels[k]!.values)));
}

const cutsArb = fc.array(fc.nat(), { maxLength: 8 });

describe('createLogParser().push(bytes) reads numbers to the nearest double (fast-check)', () => {
  // decimal texts of random doubles in the forms loggers write: fixed, exponent, many digits, signs
  const numberTextArb = fc
    .tuple(fc.double({ min: -1e12, max: 1e12, noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 1, max: 21 }), fc.constantFrom('precision', 'exponential', 'fixed', 'shortest', 'plus'))
    .map(([x, digits, form]) => {
      if (form === 'precision') return x.toPrecision(digits);
      if (form === 'exponential') return x.toExponential(Math.min(digits - 1, 20));
      if (form === 'fixed') return x.toFixed(Math.min(digits, 20));
      if (form === 'plus') return x < 0 ? String(x) : `+${x}`;
      return String(x);
    })
    .filter((t) => !/e[+-]?\d{3}|Infinity/.test(t));

  it('push(bytes of a Pa log) gives Number(text) for every value; in mbar, Number(text e+2) (one rounding)', () => {
    fc.assert(
      fc.property(fc.array(numberTextArb, { minLength: 1, maxLength: 30 }), cutsArb, fc.constantFrom('\n', '\r\n'), (texts, cuts, nl) => {
        const body = texts.map((t, i) => `${i},${t},${t}`).join(nl);
        const { recording } = parseBytes(`Time [s],Pressure [Pa],Pressure setpoint [mbar]${nl}${body}${nl}`, cuts);
        texts.forEach((t, i) => {
          expect(recording.channels[0]!.values[i]).toBe(Number(t));
          const [mantissa, exp] = t.split(/e/i);
          expect(recording.channels[1]!.values[i]).toBe(Number(`${mantissa}e${Number(exp ?? 0) + 2}`));
        });
      }),
      { seed: 11, numRuns: 1500 },
    );
  });
});

describe('createLogParser().push(bytes) matches parseLogText(text) (fast-check)', () => {
  const pieces = ['Time [s]', 'Pressure [mbar]', 'Flow (µL/min)', 'P_set_kPa', 'Elapsed', '# Operator: X', 's', 'mbar',
    '0', '1.5', '-2,25', '"3.5"', '1e-3', '2E+2', '-.5', '+7.', 'NaN', '', 'abc', 'µ', '00:00:01.5', '2026-03-14T10:00:00Z', '\uFEFF', '1.2.3', '--1', '1e', '12345678901234567890'];
  const lineArb = fc.array(fc.constantFrom(...pieces), { minLength: 0, maxLength: 5 }).chain((cells) => fc.constantFrom(',', ';', '\t', '  ', ' ').map((sep) => cells.join(sep)));
  const numericRowArb = fc.tuple(fc.integer({ min: 0, max: 3 }), fc.array(fc.constantFrom('1', '-2.5', '3e2', ' 4 ', '5.', '0.000123', '"6"', '', 'x', '7,5'), { minLength: 2, maxLength: 3 }));

  it('push(bytes of log-like fragments, cut anywhere) gives the same recording, report or error as the text', () => {
    const textArb = fc.tuple(fc.array(lineArb, { minLength: 0, maxLength: 12 }), fc.constantFrom('\n', '\r\n', '\r')).map(([lines, nl]) => lines.join(nl));
    fc.assert(
      fc.property(textArb, cutsArb, fc.boolean(), (text, cuts, skipBadRows) => {
        expectSameOutcome(outcome(() => parseBytes(text, cuts, { skipBadRows })), outcome(() => parseLogText(text, { skipBadRows })));
      }),
      { seed: 12, numRuns: 2000 },
    );
  });

  it('push(bytes of a numeric log with odd rows: blanks, quotes, empty and text values, comments) matches the text path', () => {
    const textArb = fc
      .tuple(fc.array(numericRowArb, { minLength: 1, maxLength: 40 }), fc.constantFrom('\n', '\r\n', '\r'), fc.constantFrom(',', ';', '\t'), fc.boolean())
      .map(([rows, nl, sep, comments]) => {
        const lines = rows.map(([gap, cells], i) => (comments && i % 7 === 3 ? '# note µ' : `${i + gap / 4}${sep}${cells.join(sep)}`));
        return `Time [s]${sep}Pressure [mbar]${sep}Flow [µL/min]${sep}Other [Pa]${nl}${lines.join(nl)}`;
      });
    fc.assert(
      fc.property(textArb, cutsArb, fc.boolean(), fc.boolean(), (text, cuts, skipBadRows, sortTime) => {
        const options = { skipBadRows, sortTime, dropRepeatedTime: sortTime };
        expectSameOutcome(outcome(() => parseBytes(text, cuts, options)), outcome(() => parseLogText(text, options)));
      }),
      { seed: 13, numRuns: 2000 },
    );
  });

  it('push(bytes of writeLog output in random dialects) matches parseLogText of the same text', () => {
    const caseArb = fc.record({
      rows: fc.integer({ min: 2, max: 30 }),
      values: fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }), { minLength: 60, maxLength: 60 }),
      delimiter: fc.constantFrom<LogDialect['delimiter']>(',', ';', '\t', 'whitespace'),
      decimal: fc.constantFrom<LogDialect['decimal']>('.', ','),
      lineEnding: fc.constantFrom<LogDialect['lineEnding']>('\n', '\r\n'),
      bom: fc.boolean(),
      timeFormat: fc.constantFrom<LogDialect['timeFormat']>('seconds', 'milliseconds', 'elapsed', 'clock', 'date-clock', 'iso'),
      unitStyle: fc.constantFrom<LogDialect['unitStyle']>('brackets', 'parens', 'underscore', 'units-row'),
      quoteNumbers: fc.boolean(),
      trailingDelimiter: fc.boolean(),
      pressureUnit: fc.constantFrom('mbar', 'kPa', 'psi', 'Pa'),
      flowUnit: fc.constantFrom('µL/min', 'nL/s', 'mL/h'),
    });
    fc.assert(
      fc.property(caseArb, cutsArb, (c, cuts) => {
        const timeS = Float64Array.from({ length: c.rows }, (_, i) => i * 0.125);
        const recording: Recording = {
          timeS,
          startEpochMs: Date.UTC(2026, 2, 14, 9, 30),
          channels: (['pressure', 'flow'] as const).map((quantity, k) => ({
            name: quantity,
            quantity,
            originalHeader: '',
            originalUnit: '',
            values: Float64Array.from({ length: c.rows }, (_, i) => c.values[(k * 30 + i) % 60] as number),
            sourceIndex: 0,
          })),
          metadata: { Chip: 'A-07 (invented)' },
          sources: [],
          warnings: [],
        };
        const text = writeLog(recording, {
          delimiter: c.delimiter,
          decimal: c.decimal,
          lineEnding: c.lineEnding,
          bom: c.bom,
          timeFormat: c.timeFormat,
          timeDecimals: 3,
          timeDecimalSign: '.',
          unitStyle: c.unitStyle,
          units: { pressure: c.pressureUnit, flow: c.flowUnit },
          quoteNumbers: c.quoteNumbers || (c.delimiter === ',' && c.decimal === ','),
          trailingDelimiter: c.trailingDelimiter,
          metadataLines: true,
          digits: 'shortest',
        });
        const options = { timezoneOffsetMin: 0 };
        expectSameOutcome(outcome(() => parseBytes(text, cuts, options)), outcome(() => parseLogText(text, options)));
      }),
      { seed: 14, numRuns: 500 },
    );
  });

  it('push(bytes of a log longer than the detection sample, a µ and a CR LF cut at chunk edges) reads every row as the text path does', () => {
    const rows = Array.from({ length: 12000 }, (_, i) => `${(i / 1000).toFixed(3)},${(i % 97) - 48.5},${i % 13 === 0 ? '"1.5"' : (i % 11) * 0.01}`);
    rows[7001] = '# operator note: µ-valve closed';
    const text = `Time [s],Pressure [mbar],Flow [µL/min]\r\n${rows.join('\r\n')}\r\n`;
    const bytes = new TextEncoder().encode(text);
    const micro = bytes.indexOf(0xb5); // second byte of the first µ in the body
    const crlf = bytes.indexOf(13, 70000);
    const cuts = [bytes.indexOf(0xb5, 40) /* header µ */, 65536, crlf + 1, micro];
    const fromBytes = parseBytes(text, cuts);
    expect(fromBytes.report.rows).toBe(11999);
    expect(fromBytes.report.bytes).toBe(bytes.length);
    expectSameOutcome({ ok: fromBytes }, { ok: parseLogText(text) });
  });
});
