// Property: any recording written by writeLog in any dialect the importer supports reads back to the same
// recording (to within the printed precision: values are written with the shortest round-trip text in their
// unit, so only the unit conversion's rounding remains, < 1e-14 relative). Seeded for determinism.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseLogText } from '../../../src/core/import/index';
import { writeLog, type LogDialect } from '../../../src/core/logformat/index';
import type { Quantity, Recording } from '../../../src/core/recording/types';

const UNITS: Record<Exclude<Quantity, 'other'>, string[]> = {
  pressure: ['Pa', 'hPa', 'kPa', 'MPa', 'mbar', 'bar', 'psi', 'mmHg', 'Torr', 'inH2O', 'cmH2O', 'mmH2O'],
  pressure_setpoint: ['mbar', 'kPa', 'psi'],
  flow: ['µL/min', 'μL/min', 'ul/min', 'uL/min', 'µL/h', 'µL/s', 'nL/min', 'nL/s', 'mL/min', 'mL/h', 'L/min', 'm³/s', 'm3/s'],
  flow_setpoint: ['µL/min', 'nL/s', 'mL/h'],
  hydrostatic_head: ['mm', 'cm', 'mbar', 'Pa'],
};
const QUANTITIES = Object.keys(UNITS) as Exclude<Quantity, 'other'>[];

const channelArb = fc.constantFrom(...QUANTITIES).chain((quantity) =>
  fc.record({ quantity: fc.constant(quantity), unit: fc.constantFrom(...UNITS[quantity]) }),
);

const caseArb = fc
  .record({
    rows: fc.integer({ min: 2, max: 40 }),
    stepsMs: fc.array(fc.integer({ min: 1, max: 5000 }), { minLength: 40, maxLength: 40 }),
    channels: fc.array(channelArb, { minLength: 1, maxLength: 4 }),
    values: fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }), { minLength: 160, maxLength: 160 }),
    missing: fc.array(fc.boolean(), { minLength: 160, maxLength: 160 }),
    startEpochMs: fc.integer({ min: Date.UTC(2000, 0, 1), max: Date.UTC(2030, 0, 1) }),
    delimiter: fc.constantFrom<LogDialect['delimiter']>(',', ';', '\t', 'whitespace'),
    decimal: fc.constantFrom<LogDialect['decimal']>('.', ','),
    lineEnding: fc.constantFrom<LogDialect['lineEnding']>('\n', '\r\n'),
    bom: fc.boolean(),
    timeFormat: fc.constantFrom<LogDialect['timeFormat']>('seconds', 'milliseconds', 'elapsed', 'clock', 'date-clock', 'iso'),
    isoZone: fc.constantFrom<LogDialect['isoZone']>('Z', 'offset', 'none'),
    utcOffsetMin: fc.constantFrom(0, 60, -300, 330),
    timeDecimalSign: fc.constantFrom<LogDialect['timeDecimalSign']>('.', ','),
    unitStyle: fc.constantFrom<LogDialect['unitStyle']>('brackets', 'parens', 'underscore', 'units-row'),
    quoteNumbers: fc.boolean(),
    trailingDelimiter: fc.boolean(),
    metadata: fc.dictionary(fc.constantFrom('Operator', 'Chip', 'Batch', 'Note'), fc.stringMatching(/^[A-Za-z0-9]([A-Za-z0-9 .-]{0,14}[A-Za-z0-9])?$/), { maxKeys: 3 }),
  })
  .map((c) => ({
    ...c,
    // a decimal comma in a comma-separated file needs quotes; so does a comma inside clock/ISO seconds
    quoteNumbers: c.quoteNumbers || (c.delimiter === ',' && c.decimal === ','),
    timeDecimalSign: c.delimiter === ',' ? '.' : c.timeDecimalSign,
  }));

describe('writeLog → parseLogText round trip (fast-check)', () => {
  it('parseLogText(writeLog(recording, dialect)) returns the recording for random recordings and dialects', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        let ms = 0;
        const timeS = Float64Array.from({ length: c.rows }, (_, i) => {
          if (i > 0) ms += c.stepsMs[i] as number;
          return ms / 1000;
        });
        const recording: Recording = {
          timeS,
          startEpochMs: c.startEpochMs,
          channels: c.channels.map((ch, k) => ({
            name: `c${k}`,
            quantity: ch.quantity,
            originalHeader: '',
            originalUnit: '',
            // keep some rows complete: a missing value is never in the first two rows
            values: Float64Array.from({ length: c.rows }, (_, i) => (i > 1 && c.missing[(k * 40 + i) % 160] && i % 3 === 0 ? Number.NaN : (c.values[(k * 40 + i) % 160] as number))),
            sourceIndex: 0,
          })),
          metadata: c.metadata,
          sources: [],
          warnings: [],
        };
        const dialect: Partial<LogDialect> = {
          delimiter: c.delimiter,
          decimal: c.decimal,
          lineEnding: c.lineEnding,
          bom: c.bom,
          timeFormat: c.timeFormat,
          timeDecimals: 3,
          isoZone: c.isoZone,
          utcOffsetMin: c.utcOffsetMin,
          timeDecimalSign: c.timeDecimalSign,
          unitStyle: c.unitStyle,
          units: Object.fromEntries(c.channels.map((ch) => [ch.quantity, ch.unit])),
          quoteNumbers: c.quoteNumbers,
          trailingDelimiter: c.trailingDelimiter,
          metadataLines: true,
          digits: 'shortest',
        };
        // a quantity appears with one unit per dialect (the writer's units map is per quantity)
        const unitOf = dialect.units as Record<string, string>;
        const text = writeLog(recording, dialect);
        const { recording: back, report } = parseLogText(text, c.isoZone === 'none' || c.timeFormat === 'date-clock' ? { timezoneOffsetMin: c.utcOffsetMin } : {});
        expect(report.dialect.delimiter).toBe(c.delimiter);
        expect(report.dialect.hadBom).toBe(c.bom);
        expect(back.metadata).toEqual(c.metadata);
        expect(back.timeS.length).toBe(c.rows);
        for (let i = 0; i < c.rows; i++) expect(Math.abs((back.timeS[i] as number) - (timeS[i] as number))).toBeLessThan(1e-9);
        if (c.timeFormat === 'iso' || c.timeFormat === 'date-clock') expect(back.startEpochMs).toBe(c.startEpochMs);
        expect(back.channels.map((x) => x.quantity)).toEqual(c.channels.map((x) => x.quantity));
        back.channels.forEach((ch, k) => {
          const original = recording.channels[k]!;
          expect(ch.originalUnit.replace(/_/g, '/')).toBe((unitOf[original.quantity] as string).replace(/_/g, '/'));
          for (let i = 0; i < c.rows; i++) {
            const a = original.values[i] as number;
            const b = ch.values[i] as number;
            if (Number.isNaN(a)) expect(b).toBeNaN();
            else expect(Math.abs(b - a)).toBeLessThanOrEqual(1e-14 * Math.abs(a) + 1e-300);
          }
        });
      }),
      { seed: 20260314, numRuns: 300 },
    );
  });
});
