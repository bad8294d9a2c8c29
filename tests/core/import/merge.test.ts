// mergeRecordings: expected values are derived in each test from linear interpolation between the
// neighbouring samples (a straight line is reproduced exactly by linear interpolation).
import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/errors';
import { parseLogText } from '../../../src/core/import/index';
import { interpolateOnto, medianIntervalS, mergeRecordings } from '../../../src/core/recording/merge';
import { summarizeRecording } from '../../../src/core/recording/summary';

// pressure logger: 10 Hz, ISO timestamps in UTC, pressure = sample index in mbar
const pressureLog = ['Timestamp,Pressure [mbar]', ...Array.from({ length: 31 }, (_, i) => `2026-03-14T10:00:${String(Math.floor(i / 10)).padStart(2, '0')}.${i % 10}00Z,${i}`)].join('\n');

describe('mergeRecordings', () => {
  it('mergeRecordings(fast pressure log, slow flow log) interpolates the slow one onto the fast time base, NaN outside its span', () => {
    const p = parseLogText(pressureLog, { sourceName: 'p.csv' }).recording;
    // flow log: samples at 0.3, 0.8, 1.3, 1.8 s after 10:00:00Z, flow = 10·t nL/s on the pressure log's axis
    const f = parseLogText('Time\tFlow [nL/s]\n2026-03-14T11:00:00.300+01:00\t3\n2026-03-14T11:00:00.800+01:00\t8\n2026-03-14T11:00:01.300+01:00\t13\n2026-03-14T11:00:01.800+01:00\t18\n', { sourceName: 'f.tsv' }).recording;
    const m = mergeRecordings([p, f]);
    expect(m.timeS).toBe(p.timeS);
    expect(m.startEpochMs).toBe(Date.UTC(2026, 2, 14, 10, 0, 0));
    expect(m.channels.map((c) => c.name)).toEqual(['pressure_Pa', 'flow_m3_per_s']);
    const flow = m.channels[1]!.values;
    // t = 0.0, 0.1, 0.2 s: before the flow log starts → NaN; t = 1.9 s and later: after it ends → NaN
    expect([flow[0], flow[1], flow[2]].every(Number.isNaN)).toBe(true);
    expect(Number.isNaN(flow[19]!)).toBe(true);
    // t = 0.3 s → 3 nL/s; t = 1.0 s → 10 nL/s (linear between 8 and 13); t = 1.8 s → 18 nL/s
    expect(flow[3]).toBeCloseTo(3e-12, 24);
    expect(flow[10]).toBeCloseTo(10e-12, 24);
    expect(flow[18]).toBeCloseTo(18e-12, 24);
    expect(m.channels[1]!.sourceIndex).toBe(1);
    expect(m.sources).toEqual(['p.csv', 'f.tsv']);
    expect(m.warnings.map((w) => w.code)).toContain('merge-outside-span');
  });

  it('mergeRecordings(logs without absolute time) needs an offset, then uses it', () => {
    const a = parseLogText('Time [s],P [Pa]\n0,0\n0.5,5\n1,10\n1.5,15\n2,20\n').recording;
    const b = parseLogText('Time [s],Q [uL/s]\n0,1\n1,2\n').recording;
    expect(() => mergeRecordings([a, b])).toThrow(InputError);
    const m = mergeRecordings([a, b], { offsetsS: [0.5] });
    // b's t = 0 is a's t = 0.5: on a's axis b spans 0.5…1.5 s; at 1.0 s it is halfway: 1.5 µL/s
    const q = Array.from(m.channels[1]!.values);
    expect(Number.isNaN(q[0]!)).toBe(true);
    expect(q[1]).toBeCloseTo(1e-9, 20);
    expect(q[2]).toBeCloseTo(1.5e-9, 20);
    expect(q[3]).toBeCloseTo(2e-9, 20);
    expect(Number.isNaN(q[4]!)).toBe(true);
  });

  it('mergeRecordings uses the faster log as the base even when it is given second', () => {
    const slow = parseLogText('Time [s],P [Pa]\n0,0\n1,10\n2,20\n').recording;
    const fast = parseLogText('Time [s],Q [nL/s]\n0,0\n0.25,1\n0.5,2\n0.75,3\n1,4\n').recording;
    const m = mergeRecordings([slow, fast], { offsetsS: [1] });
    // base = fast log (0.25 s); it starts at 1 s on the slow log's axis, so P at its samples = 10, 12.5, 15, 17.5, 20
    expect(Array.from(m.timeS)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(Array.from(m.channels[0]!.values)).toEqual([10, 12.5, 15, 17.5, 20]);
  });

  it('mergeRecordings(logs that do not overlap) → logs-do-not-overlap', () => {
    const a = parseLogText('Time [s],P [Pa]\n0,0\n1,1\n2,2\n').recording;
    const b = parseLogText('Time [s],P [Pa]\n0,0\n1,1\n').recording;
    // b shifted by 10 s spans 10–11 s; a spans 0–2 s: no common time (derivation).
    expect(() => mergeRecordings([a, b], { offsetsS: [10] })).toThrow(/does not overlap/);
  });

  it('mergeRecordings names repeated quantities pressure_Pa, pressure_Pa_2', () => {
    const a = parseLogText('Time [s],P [Pa]\n0,0\n1,1\n').recording;
    const b = parseLogText('Time [s],P [Pa]\n0,0\n1,1\n').recording;
    expect(mergeRecordings([a, b], { offsetsS: [0] }).channels.map((c) => c.name)).toEqual(['pressure_Pa', 'pressure_Pa_2']);
  });
});

describe('interpolateOnto and medianIntervalS', () => {
  it('interpolateOnto reproduces a straight line and never extrapolates', () => {
    const x = Float64Array.from([0, 1, 3]);
    const y = Float64Array.from([1, 3, 7]); // y = 2x + 1
    const out = interpolateOnto(x, y, Float64Array.from([-0.5, 0, 0.5, 2, 3, 3.5]));
    expect(Number.isNaN(out[0]!)).toBe(true);
    expect(Array.from(out.slice(1, 5))).toEqual([1, 2, 5, 7]);
    expect(Number.isNaN(out[5]!)).toBe(true);
  });

  it('interpolateOnto leaves gaps longer than maxGap as NaN', () => {
    const out = interpolateOnto(Float64Array.from([0, 1, 10]), Float64Array.from([0, 1, 10]), Float64Array.from([0.5, 5]), 2);
    expect(out[0]).toBe(0.5); // halfway between (0, 0) and (1, 1); the 1→10 gap of 9 exceeds maxGap 2
    expect(Number.isNaN(out[1]!)).toBe(true);
  });

  it('medianIntervalS and summarizeRecording find the rate and a gap', () => {
    const r = parseLogText('Time [s],P [Pa]\n0,1\n0.1,2\n0.2,3\n0.5,4\n0.6,\n0.7,6\n').recording;
    // Derivation: intervals 0.1, 0.1, 0.3, 0.1, 0.1 → median 0.1 s (10 Hz); one gap of 0.3 s after t = 0.2 s;
    // one missing value (the empty cell at 0.6 s).
    expect(medianIntervalS(r.timeS)).toBeCloseTo(0.1, 12);
    const s = summarizeRecording(r);
    expect(s.sampleRateHz).toBeCloseTo(10, 9);
    expect(s.gaps.count).toBe(1);
    expect(s.gaps.largestS).toBeCloseTo(0.3, 12);
    expect(s.gaps.firstAtS).toBeCloseTo(0.2, 12);
    expect(s.channels[0]).toMatchObject({ min: 1, max: 6, missing: 1 });
  });
});
