// Bad input: one located InputError (file, line, column, problem, hint), or a counted warning when the user
// asked to skip/sort/drop. Expected line numbers are counted by hand in each small log below.
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { createLogParser, parseLogText, type ImportOptions } from '../../../src/core/import/index';

function failure(text: string, options: ImportOptions = {}): InputError {
  try {
    parseLogText(text, { sourceName: 'log.csv', ...options });
  } catch (err) {
    if (err instanceof InputError) return err;
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('parseLogText refuses bad input with a located message', () => {
  it('parseLogText(empty file) → empty-file', () => {
    expect(failure('').code).toBe('empty-file');
    expect(failure('  \n\n').code).toBe('empty-file');
    expect(failure('').message).toMatch(/^log\.csv: The file is empty\./);
  });

  it('parseLogText(header only) → header-only', () => {
    const e = failure('Time [s],Pressure [mbar]\n');
    expect(e.code).toBe('header-only');
    expect(e.message).toContain('header but no data rows');
  });

  it('parseLogText(text in a numeric column) names line and column', () => {
    const e = failure('Time [s],Pressure [mbar]\n0,1\n1,2\n2,oops\n3,4\n');
    expect(e.code).toBe('non-numeric-value');
    expect(e.location).toEqual({ file: 'log.csv', line: 4, column: 2 });
    expect(e.message).toMatch(/^log\.csv:4:2: 'oops' in column 2 \('Pressure \[mbar\]'\) is not a number\./);
    expect(e.hint).toContain('--skip-bad-rows');
  });

  it('parseLogText(text in a numeric column, skipBadRows) skips and counts the row', () => {
    const { recording, report } = parseLogText('Time [s],Pressure [mbar]\n0,1\n1,2\n2,oops\n3,4\n4,x\n', { skipBadRows: true });
    expect(Array.from(recording.timeS)).toEqual([0, 1, 3]);
    const w = report.warnings.find((x) => x.code === 'skipped-bad-rows');
    expect(w?.count).toBe(2);
    expect(w?.location?.line).toBe(4);
    expect(report.skippedRows).toBe(2);
  });

  it('parseLogText(time going backwards) says where; sortTime sorts', () => {
    const text = 'Time [s],P [Pa]\n0,1\n1,2\n0.5,3\n2,4\n';
    const e = failure(text);
    expect(e.code).toBe('time-backwards');
    expect(e.location.line).toBe(4);
    expect(e.message).toContain('0.5 s earlier than line 3');
    expect(e.hint).toContain('--sort-time');
    const { recording, report } = parseLogText(text, { sortTime: true });
    expect(Array.from(recording.timeS)).toEqual([0, 0.5, 1, 2]);
    expect(Array.from(recording.channels[0]!.values)).toEqual([1, 3, 2, 4]);
    expect(report.warnings.map((w) => w.code)).toContain('rows-sorted-by-time');
  });

  it('parseLogText(repeated time) says where; dropRepeatedTime keeps the first', () => {
    const text = 'Time [s],P [Pa]\n0,1\n1,2\n1,3\n2,4\n';
    const e = failure(text);
    expect(e.code).toBe('repeated-time');
    expect(e.location.line).toBe(4);
    expect(e.message).toContain('same time as line 3');
    const { recording, report } = parseLogText(text, { dropRepeatedTime: true });
    expect(Array.from(recording.channels[0]!.values)).toEqual([1, 2, 4]);
    expect(report.warnings.find((w) => w.code === 'dropped-repeated-time')?.count).toBe(1);
  });

  it('parseLogText(sortTime with a repeat after sorting) needs dropRepeatedTime too', () => {
    const text = 'Time [s],P [Pa]\n0,1\n2,2\n1,3\n2,4\n';
    expect(failure(text, { sortTime: true }).code).toBe('repeated-time');
    const { recording } = parseLogText(text, { sortTime: true, dropRepeatedTime: true });
    expect(Array.from(recording.timeS)).toEqual([0, 1, 2]);
  });

  it('parseLogText(binary data) → binary-file', () => {
    expect(failure('PK\u0003\u0004\u0000\u0000binary\u0000stuff').code).toBe('binary-file');
  });

  it('parseLogText(no recognisable time column) lists the columns and the options', () => {
    const e = failure('Alpha [Pa],Beta [Pa]\n1,2\n3,4\n');
    expect(e.code).toBe('no-time-column');
    expect(e.message).toContain("'Alpha [Pa]', 'Beta [Pa]'");
    expect(e.hint).toContain('--time-column');
    expect(e.hint).toContain('--sample-rate');
  });

  it('parseLogText(unknown unit) lists the known units', () => {
    const e = failure('Time [s],Pressure [atm2]\n0,1\n1,2\n');
    expect(e.code).toBe('unknown-unit');
    expect(e.location).toMatchObject({ line: 1, column: 2 });
    for (const u of ['mbar', 'psi', 'µL/min', 'nL/s', 'mmH2O']) expect(e.hint).toContain(u);
  });

  it('parseLogText(flow column with an unknown unit) → unknown-unit', () => {
    expect(failure('Time [s],Flow [gal/min]\n0,1\n1,2\n').code).toBe('unknown-unit');
  });

  it('parseLogText(pressure column without a unit) → missing-unit with an example option', () => {
    const e = failure('Time [s],Pressure\n0,1\n1,2\n');
    expect(e.code).toBe('missing-unit');
    expect(e.hint).toContain('--column 2=pressure:mbar');
  });

  it('parseLogText(ragged row) names the line; skipBadRows counts it', () => {
    const text = 'Time [s],P [Pa],Q [nL/s]\n0,1,2\n1,2\n2,3,4\n3,4,5,6\n4,5,6\n';
    const e = failure(text);
    expect(e.code).toBe('ragged-row');
    expect(e.location.line).toBe(3);
    expect(e.message).toContain('2 fields where the header has 3');
    const { report } = parseLogText(text, { skipBadRows: true });
    expect(report.rows).toBe(3);
    expect(report.warnings.find((w) => w.code === 'skipped-bad-rows')?.count).toBe(2);
  });

  it('createLogParser(a bad value far into a streamed file) names the right line across chunk boundaries', () => {
    // line 1 comment, line 2 header, data from line 3: the value on data row k (0-based) is on line k + 3
    const rows = Array.from({ length: 30000 }, (_, k) => (k === 24999 ? `${k},bad` : `${k},${k % 10}`));
    const text = `# streamed\r\nTime [s],P [Pa]\r\n${rows.join('\r\n')}\r\n`;
    const parser = createLogParser({ sourceName: 'big.csv' });
    let err: unknown;
    try {
      for (let i = 0; i < text.length; i += 9973) parser.push(text.slice(i, i + 9973));
      parser.finish();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).location).toEqual({ file: 'big.csv', line: 25002, column: 2 });
  });

  it('parseLogText(bad time value) names the time column', () => {
    const e = failure('Time [s],P [Pa]\n0,1\n1,2\nlater,3\n');
    expect(e.code).toBe('bad-time-value');
    expect(e.location).toMatchObject({ line: 4, column: 1 });
  });

  it('parseLogText(unknown column in an option) lists the columns', () => {
    const e = failure('Time [s],P [Pa]\n0,1\n1,2\n', { columns: [{ column: 'Flow', quantity: 'flow', unit: 'nL/s' }] });
    expect(e.code).toBe('no-such-column');
    expect(e.hint).toContain("'P [Pa]'");
  });

  it('parseLogText(unit of the wrong kind in an option) → unit-mismatch', () => {
    expect(failure('Time [s],A\n0,1\n1,2\n', { columns: [{ column: 2, quantity: 'flow', unit: 'mbar' }] }).code).toBe('unit-mismatch');
  });
});
