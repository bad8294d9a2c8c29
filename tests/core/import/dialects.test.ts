// Dialect tests: each log below is hand-written; expected SI values follow from the unit definitions
// (1 mbar = 100 Pa, 1 kPa = 1000 Pa, 1 µL/min = 1e-9/60 m³/s: BIPM SI Brochure 9th ed., NIST SP 811 B.8).
import { describe, expect, it } from 'vitest';
import { createLogParser, parseLogText } from '../../../src/core/import/index';

const UL_MIN = 1e-9 / 60; // m³/s per µL/min (BIPM SI Brochure 9th ed., Table 8: litre, minute)

function channel(text: string, name: string, options = {}): number[] {
  const { recording } = parseLogText(text, options);
  const c = recording.channels.find((x) => x.name === name);
  if (!c) throw new Error(`no channel ${name}; have ${recording.channels.map((x) => x.name).join(', ')}`);
  return Array.from(c.values);
}

describe('parseLogText delimiters and decimal signs', () => {
  it('parseLogText(comma, brackets) reads time in s, mbar → Pa, µL/min → m³/s', () => {
    const text = 'Time [s],Pressure [mbar],Flow [µL/min]\n0,1.5,10\n0.1,1.6,11\n0.2,1.7,12\n';
    const { recording, report } = parseLogText(text);
    expect(report.dialect.delimiter).toBe(',');
    expect(Array.from(recording.timeS)).toEqual([0, 0.1, 0.2]);
    expect(channel(text, 'pressure_Pa')).toEqual([150, 160, 170]);
    const flow = channel(text, 'flow_m3_per_s');
    [10, 11, 12].forEach((q, i) => expect(flow[i]).toBeCloseTo(q * UL_MIN, 25));
    expect(recording.channels.map((c) => [c.quantity, c.originalHeader, c.originalUnit])).toEqual([
      ['pressure', 'Pressure [mbar]', 'mbar'],
      ['flow', 'Flow [µL/min]', 'µL/min'],
    ]);
  });

  it('parseLogText(semicolon, decimal comma, BOM, CRLF, trailing empty column, metadata) reads all of it', () => {
    const text = '\uFEFF# Operator: A. Lee\r\nChip: M-07\r\nTime (ms);P_set (mbar);Flow (ul/min);;\r\n0;1,5;10,25;;\r\n100;1,6;11,5;;\r\n200;1,7;12;;\r\n';
    const { recording, report } = parseLogText(text);
    expect(report.dialect).toMatchObject({ delimiter: ';', decimal: ',', hadBom: true, lineEnding: 'CRLF', preambleLines: 2, headerLine: 3, timeFormat: 'milliseconds' });
    expect(recording.metadata).toEqual({ Operator: 'A. Lee', Chip: 'M-07' });
    expect(Array.from(recording.timeS)).toEqual([0, 0.1, 0.2]);
    expect(recording.channels.map((c) => c.name)).toEqual(['pressure_setpoint_Pa', 'flow_m3_per_s']);
    expect(Array.from(recording.channels[0]!.values)).toEqual([150, 160, 170]);
    expect(recording.channels[1]!.values[0]).toBeCloseTo(10.25 * UL_MIN, 25);
  });

  it('parseLogText(tab) and parseLogText(runs of spaces) give the same recording', () => {
    const tab = 'time_s\tpressure_kPa\n0.0\t1.25\n0.5\t1.5\n';
    const spaces = '  time_s     pressure_kPa\n   0.0   1.25\n   0.5      1.5   \n';
    const a = parseLogText(tab);
    const b = parseLogText(spaces);
    expect(a.report.dialect.delimiter).toBe('\t');
    expect(b.report.dialect.delimiter).toBe('whitespace');
    expect(Array.from(a.recording.channels[0]!.values)).toEqual([1250, 1500]);
    expect(Array.from(b.recording.channels[0]!.values)).toEqual([1250, 1500]);
    expect(Array.from(b.recording.timeS)).toEqual([0, 0.5]);
  });

  it('parseLogText(quoted numbers with decimal commas in a comma-separated file) reads the numbers', () => {
    const text = '"Time [s]","Pressure [bar]"\n"0,0","0,5"\n"1,0","0,75"\n';
    const { recording, report } = parseLogText(text);
    expect(report.dialect.decimal).toBe(',');
    expect(Array.from(recording.channels[0]!.values)).toEqual([50000, 75000]);
  });

  it('parseLogText(quoted numbers, decimal point) reads them', () => {
    expect(channel('Time [s],Pressure [Pa]\n"0","12.5"\n"1","13.5"\n', 'pressure_Pa')).toEqual([12.5, 13.5]);
  });

  it('parseLogText(lone CR line ends) reads the rows', () => {
    const { recording, report } = parseLogText('Time [s],Pressure [Pa]\r0,1\r1,2\r2,3\r');
    expect(report.dialect.lineEnding).toBe('CR');
    expect(Array.from(recording.timeS)).toEqual([0, 1, 2]);
  });
});

describe('parseLogText units in headers', () => {
  it.each([
    ['brackets', 'Time [s],Pressure [hPa]\n0,1\n1,2\n'],
    ['parentheses', 'Time (s),Pressure (hPa)\n0,1\n1,2\n'],
    ['underscore', 'time_s,pressure_hPa\n0,1\n1,2\n'],
    ['second header row', 'Time,Pressure\ns,hPa\n0,1\n1,2\n'],
    ['second header row in brackets', 'Time,Pressure\n[s],[hPa]\n0,1\n1,2\n'],
    ['space after the name', 'Time s,Pressure hPa\n0,1\n1,2\n'],
  ])('parseLogText(unit in %s) reads hPa → 100 Pa', (_style, text) => {
    const { recording } = parseLogText(text);
    expect(Array.from(recording.channels[0]!.values)).toEqual([100, 200]);
    expect(recording.channels[0]!.originalUnit).toBe('hPa');
  });

  it('parseLogText(second header row) reports two header rows and the unit source', () => {
    const { report } = parseLogText('Time,Flow\ns,nL/s\n0,1\n1,2\n');
    expect(report.dialect.headerRows).toBe(2);
    expect(report.columns[1]).toMatchObject({ unitFrom: 'units-row', quantity: 'flow' });
  });

  it('parseLogText names setpoints, heads and repeats: pressure_setpoint_Pa, hydrostatic_head_Pa, pressure_Pa_2', () => {
    const text = 'Time [s],Setpoint [mbar],Pressure inlet [mbar],Pressure outlet [mbar],Flow setpoint [uL/min],Reservoir level [mm]\n0,1,2,3,4,5\n1,1,2,3,4,5\n';
    const { recording } = parseLogText(text);
    expect(recording.channels.map((c) => c.name)).toEqual(['pressure_setpoint_Pa', 'pressure_Pa', 'pressure_Pa_2', 'flow_setpoint_m3_per_s', 'hydrostatic_head_Pa']);
    // ρ·g·h: 998.2 kg/m³ (physics.md §2.1, 20 °C) × 9.80665 m/s² (3rd CGPM 1901) × 5 mm
    expect(recording.channels[4]!.values[0]).toBeCloseTo(998.2 * 9.80665 * 0.005, 10);
  });

  it('parseLogText(head in cm, density option) uses the given density', () => {
    const v = channel('Time [s],Head [cm]\n0,10\n1,10\n', 'hydrostatic_head_Pa', { liquidDensityKgPerM3: 1260 });
    expect(v[0]).toBeCloseTo(1260 * 9.80665 * 0.1, 10); // ρ·g·h with the given ρ, g_n = 9.80665 m/s² (3rd CGPM 1901), 10 cm
  });

  it('parseLogText keeps a non-pressure column as other in its own unit, with a warning', () => {
    const { recording, report } = parseLogText('Time [s],Pressure [Pa],Temperature [°C]\n0,1,21.5\n1,2,21.6\n');
    expect(recording.channels[1]).toMatchObject({ quantity: 'other', name: 'other_C', originalUnit: '°C' });
    expect(Array.from(recording.channels[1]!.values)).toEqual([21.5, 21.6]);
    expect(report.warnings.some((w) => w.code === 'column-kept-as-other')).toBe(true);
  });

  it('parseLogText(column override) sets quantity and unit of an unlabelled column', () => {
    const { recording } = parseLogText('Time [s],Channel A\n0,1\n1,2\n', { columns: [{ column: 2, quantity: 'flow', unit: 'mL/min' }] });
    expect(recording.channels[0]!.quantity).toBe('flow');
    expect(recording.channels[0]!.values[1]).toBeCloseTo(2e-6 / 60, 20);
  });

  it('parseLogText(column override ignore) drops the column', () => {
    const { recording } = parseLogText('Time [s],Pressure [Pa],Flow [nL/s]\n0,1,2\n1,2,3\n', { columns: [{ column: 'Flow', quantity: 'ignore' }] });
    expect(recording.channels.map((c) => c.name)).toEqual(['pressure_Pa']);
  });
});

describe('parseLogText time formats', () => {
  it('parseLogText(milliseconds) divides by 1000 exactly', () => {
    expect(Array.from(parseLogText('t [ms],P [Pa]\n0,1\n1,2\n250,3\n').recording.timeS)).toEqual([0, 0.001, 0.25]);
  });

  it('parseLogText(seconds not starting at 0) counts from the first sample', () => {
    expect(Array.from(parseLogText('Time [s],P [Pa]\n10.5,1\n11,2\n').recording.timeS)).toEqual([0, 0.5]);
  });

  it('parseLogText(elapsed hh:mm:ss.sss) converts to seconds, hours beyond 24 allowed', () => {
    const { recording, report } = parseLogText('Elapsed,P [Pa]\n00:00:00.000,1\n00:01:30.250,2\n25:00:00,3\n');
    expect(report.dialect.timeFormat).toBe('elapsed');
    expect(Array.from(recording.timeS)).toEqual([0, 90.25, 90000]);
  });

  it('parseLogText(clock time across midnight) adds 24 h and warns', () => {
    const { recording, report } = parseLogText('# Date: 2026-03-14\nClock,P [Pa]\n23:59:59.5,1\n23:59:59.9,2\n00:00:00.3,3\n');
    expect(report.dialect.timeFormat).toBe('clock');
    expect(Array.from(recording.timeS)).toEqual([0, 0.4, 0.8]);
    expect(report.warnings.map((w) => w.code)).toContain('midnight-rollover');
    // date from metadata + first clock time, taken as UTC
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 23, 59, 59, 500));
  });

  it('parseLogText(separate Date and Time columns) combines them, across midnight without a rollover guess', () => {
    const { recording, report } = parseLogText('Date;Time;Pressure [mbar]\n2026-03-14;23:59:59,5;1\n2026-03-15;00:00:00,5;2\n2026-03-16;00:00:00,5;3\n');
    expect(report.dialect).toMatchObject({ timeFormat: 'clock', timeColumn: 2, dateColumn: 1 });
    expect(report.columns[0]!.role).toBe('date');
    expect(Array.from(recording.timeS)).toEqual([0, 1, 86401]);
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 23, 59, 59, 500));
    expect(report.warnings.map((w) => w.code)).not.toContain('midnight-rollover');
  });

  it('parseLogText(date and time separated by a space in a space-separated log) reads them as one time', () => {
    const { recording, report } = parseLogText('Timestamp   Pressure[mbar]\n2026-03-14 10:00:00.000   1.5\n2026-03-14 10:00:00.250   1.6\n');
    expect(report.dialect).toMatchObject({ delimiter: 'whitespace', timeFormat: 'clock', dateColumn: 1, timeColumn: 2 });
    expect(Array.from(recording.timeS)).toEqual([0, 0.25]);
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 10, 0, 0));
    expect(Array.from(recording.channels[0]!.values)).toEqual([150, 160]);
  });

  // ISO 8601-1:2019 (from memory): 'Z' = UTC, ±hh:mm offsets, comma or full stop as the decimal sign of seconds.
  it('parseLogText(ISO 8601 with Z, dot decimals) keeps the absolute start', () => {
    const { recording } = parseLogText('Timestamp,P [Pa]\n2026-03-14T09:00:00.000Z,1\n2026-03-14T09:00:00.010Z,2\n');
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 9, 0, 0, 0));
    expect(Array.from(recording.timeS)).toEqual([0, 0.01]);
  });

  it('parseLogText(ISO 8601 with offset and comma decimals) converts to UTC', () => {
    const { recording } = parseLogText('Timestamp\tP [Pa]\n2026-03-14T10:00:00,250+01:00\t1\n2026-03-14T10:00:01,000+01:00\t2\n');
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 9, 0, 0, 250));
    expect(Array.from(recording.timeS)).toEqual([0, 0.75]);
  });

  it('parseLogText(ISO without zone) takes UTC and warns; the timezone option shifts it', () => {
    const text = 'Time,P [Pa]\n2026-03-14 10:00:00.5,1\n2026-03-14 10:00:01.5,2\n';
    const utc = parseLogText(text);
    expect(utc.recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 10, 0, 0, 500));
    expect(utc.report.warnings.map((w) => w.code)).toContain('timezone-assumed-utc');
    // An offset of +120 min means local = UTC + 2 h, so 10:00:00.5 local is 08:00:00.5 UTC.
    const local = parseLogText(text, { timezoneOffsetMin: 120 });
    expect(local.recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 8, 0, 0, 500));
    expect(local.report.warnings.map((w) => w.code)).not.toContain('timezone-assumed-utc');
  });

  it('parseLogText(header-less, sample rate) makes time from the row index', () => {
    const { recording, report } = parseLogText('1.0\n2.0\n3.0\n4.0\n', { sampleRateHz: 4, columns: [{ column: 1, quantity: 'pressure', unit: 'mbar' }] });
    expect(report.dialect.headerRows).toBe(0);
    expect(Array.from(recording.timeS)).toEqual([0, 0.25, 0.5, 0.75]);
    expect(Array.from(recording.channels[0]!.values)).toEqual([100, 200, 300, 400]);
  });

  it('parseLogText(header-less with a time column option) reads the first column as seconds', () => {
    const { recording } = parseLogText('0,5\n0.5,6\n1,7\n', { timeColumn: 1, columns: [{ column: 2, quantity: 'pressure', unit: 'Pa' }] });
    expect(Array.from(recording.timeS)).toEqual([0, 0.5, 1]);
  });

  it('parseLogText(start time in metadata) sets startEpochMs for a seconds log', () => {
    const { recording } = parseLogText('# Start: 2026-03-14T09:30:00Z\nTime [s],P [Pa]\n2,1\n3,2\n');
    expect(recording.startEpochMs).toBe(Date.UTC(2026, 2, 14, 9, 30, 2));
  });
});

describe('createLogParser streaming', () => {
  it('createLogParser gives the same recording whatever the chunk boundaries', () => {
    const rows = Array.from({ length: 5000 }, (_, i) => `${i / 100},${(i % 97) / 7},${(i % 13) * 0.25}`).join('\r\n');
    const text = `# note: chunk test\r\nTime [s],Pressure [mbar],Flow [uL/h]\r\n${rows}\r\n`;
    const whole = parseLogText(text).recording;
    for (const size of [1, 7, 1000, 65536, 100003]) {
      if (size === 1) continue; // a 1-char chunk run over 500 kB is slow; 7 already splits every CRLF
      const p = createLogParser();
      for (let i = 0; i < text.length; i += size) p.push(text.slice(i, i + size));
      const r = p.finish().recording;
      expect(r.timeS).toEqual(whole.timeS);
      expect(r.channels.map((c) => c.values)).toEqual(whole.channels.map((c) => c.values));
    }
  });

  it('parseLogText reads numbers exactly as Number() does (fast path and fallback)', () => {
    const values = ['0.1', '-2.5e-3', '123456789012345678', '1e-30', '3.14159265358979323846', '+7', '.5', '5.', '1E5'];
    const text = `Time [s],P [Pa]\n${values.map((v, i) => `${i},${v}`).join('\n')}\n`;
    expect(channel(text, 'pressure_Pa')).toEqual(values.map(Number));
  });

  it('parseLogText(kPa) folds the factor into the decimal exponent: 0.315068 kPa is exactly 315.068 Pa', () => {
    expect(channel('Time [s],P [kPa]\n0,0.315068\n1,1\n', 'pressure_Pa')[0]).toBe(315.068);
  });
});
