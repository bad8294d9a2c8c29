import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { InputError } from '../../../src/core/errors';
import { meetingRanges, parseVary, whatIf, whatIfStepResponses, type WhatIfRow } from '../../../src/core/whatif';

const chipText = readFileSync('sample-logs/chips/pdms-mixer.json', 'utf8');
const FLOW_5_UL_MIN = 5 * 1.666667e-11; // physics.md §5

describe('parseVary', () => {
  it('parseVary(label.length=from:to:steps) gives linearly spaced SI values', () => {
    const v = parseVary('PTFE feed line.length=10cm:1m:10');
    expect(v.target).toBe('PTFE feed line');
    expect(v.property).toBe('length');
    // Derivation: 10 linearly spaced values from 0.1 m to 1 m (10 cm = 0.1 m exactly).
    expect(v.values).toHaveLength(10);
    expect(v.values[0]).toBeCloseTo(0.1, 12);
    expect(v.values[9]).toBeCloseTo(1, 12);
  });

  it('parseVary(comma lists, categories, bad input)', () => {
    // 40 µm = 4e-5 m (SI prefix µ = 1e-6, BIPM SI Brochure Table 7); the refusals are rules of our own.
    const h = parseVary('chip[0].height=40um,50um').values as number[];
    expect(h[0]).toBeCloseTo(4e-5, 18);
    expect(h[1]).toBeCloseTo(5e-5, 18);
    expect(parseVary('upstream[1].material=ptfe,fep,silicone').values).toEqual(['ptfe', 'fep', 'silicone']);
    expect(() => parseVary('feed.colour=red')).toThrow(/cannot be swept/);
    expect(() => parseVary('feed.length=1m:2m:1')).toThrow(/steps/);
    expect(() => parseVary('feed.length=abc:2m')).toThrow(InputError);
  });
});

describe('whatIf', () => {
  it('whatIf(feed-line length) grows C by the PTFE wall + liquid compliance per metre (physics.md §3.5 table: 4.28e-15 m³/Pa per m)', () => {
    const res = whatIf(chipText, 'pdms-mixer.json', parseVary('PTFE feed line.length=0.5m:1.5m:3'), { setup: 'flow-driven', driveSI: FLOW_5_UL_MIN });
    const [a, , c] = res.rows as [WhatIfRow, WhatIfRow, WhatIfRow];
    const perMetre = c.complianceM3PerPa.nominal - a.complianceM3PerPa.nominal;
    // Wall 4.28e-15 (physics.md §3.5, PTFE 0.8/1.6 mm, E 0.5 GPa, ν 0.46, open ends) + water inside
    // V·κ_T = π(0.4 mm)²·1 m · ~4.57e-10 /Pa at 22 °C (physics.md §2.1/§3.2) ≈ 2.3e-16.
    expect(perMetre / (4.28e-15 + 2.3e-16)).toBeCloseTo(1, 2);
    // Flow-driven: τ = R_down·C (physics.md §4.2), R_down does not depend on the feed line.
    expect(c.tauS.nominal / c.complianceM3PerPa.nominal).toBeCloseTo(a.tauS.nominal / a.complianceM3PerPa.nominal, 0);
    expect(c.t95S.nominal / c.tauS.nominal).toBeCloseTo(2.9957, 4); // physics.md §4.1
    expect(c.networkTauS[0]! / c.tauS.nominal).toBeCloseTo(1, 8);
    expect(c.steadyFlowM3PerS).toBe(FLOW_5_UL_MIN);
  });

  it('whatIf(bubble volume) adds V_atm·p_atm/p_abs² (physics.md §3.3: 10 µL at 1 atm → 9.869e-14 m³/Pa)', () => {
    const res = whatIf(chipText, 'pdms-mixer.json', parseVary('bubble.volume=0:10uL:2'), { setup: 'flow-driven', driveSI: FLOW_5_UL_MIN, build: { operatingPressurePa: 0 } });
    const dC = res.rows[1]!.complianceM3PerPa.nominal - res.rows[0]!.complianceM3PerPa.nominal;
    // The description's ambient is 1013 mbar, not 1013.25: 0.025 % difference.
    expect(dC / 9.869e-14).toBeCloseTo(1, 3);
  });

  it('whatIf(pressure-driven) gives the steady flow Δp/R_total and flags the target', () => {
    const res = whatIf(chipText, 'pdms-mixer.json', parseVary('outlet channel.length=5mm:20mm:4'), { setup: 'pressure-driven', driveSI: 20_000, targetT95S: 1e9 });
    for (const r of res.rows) {
      expect(r.steadyFlowM3PerS * r.resistanceTotalPaSPerM3).toBeCloseTo(20_000, 6); // physics.md §1.1
      expect(r.meetsTarget).toBe(true);
    }
    // A 1e9 s target is met by every row, so the range is the whole sweep 5–20 mm (derivation).
    expect(res.meetingRanges).toEqual([[0.005, 0.02]]);
  });

  // The next two: message wording is our own; element names come from the invented sample chip pdms-mixer.json.
  it('whatIf(unknown element) lists the known ones', () => {
    expect(() => whatIf(chipText, 'pdms-mixer.json', parseVary('feed.length=1m:2m'), { setup: 'flow-driven', driveSI: 1e-11 })).toThrow(/known elements: '1 mL plastic syringe' \(upstream\[0\]\)/);
  });

  it('whatIf(value the description refuses) names the value', () => {
    expect(() => whatIf(chipText, 'pdms-mixer.json', parseVary('PTFE feed line.innerDiameter=0.8mm,2mm'), { setup: 'flow-driven', driveSI: 1e-11 })).toThrow(/innerDiameter = 0.002/);
  });
});

describe('meetingRanges', () => {
  const row = (value: number, t95: number): WhatIfRow => ({
    value, resistanceTotalPaSPerM3: 1, resistanceTheveninPaSPerM3: 1, complianceM3PerPa: { low: 1, nominal: 1, high: 1 },
    tauS: { low: 1, nominal: 1, high: 1 }, t95S: { low: t95, nominal: t95, high: t95 }, networkTauS: [], steadyFlowM3PerS: 0, steadySourcePressurePa: 0, meetsTarget: null,
  });
  it('meetingRanges(t95 rising through the target) interpolates the crossing linearly', () => {
    // Derived here: between (1, 8) and (2, 12) the line reaches 10 at x = 1.5.
    expect(meetingRanges([row(0, 4), row(1, 8), row(2, 12), row(3, 16)], 10)).toEqual([[0, 1.5]]);
    // (0, 20)→(1, 8) reaches 14 at x = 0.5; (1, 8)→(2, 20) at x = 1.5; never ≤ 10 in the last case.
    expect(meetingRanges([row(0, 20), row(1, 8), row(2, 20)], 14)).toEqual([[0.5, 1.5]]);
    expect(meetingRanges([row(0, 20), row(1, 30)], 10)).toEqual([]);
  });
});

describe('whatIfStepResponses', () => {
  it('whatIfStepResponses(flow-driven) reaches 63.2 % at τ and 95 % at 2.9957 τ (physics.md §4.1)', () => {
    const spec = parseVary('PTFE feed line.length=0.5m,1m');
    const opts = { setup: 'flow-driven' as const, driveSI: FLOW_5_UL_MIN };
    const sweep = whatIf(chipText, 'pdms-mixer.json', spec, opts);
    const tau = sweep.rows[1]!.tauS.nominal;
    const curves = whatIfStepResponses(chipText, 'pdms-mixer.json', spec, opts, { durationS: 3 * tau * 2, points: 601 });
    expect(curves).toHaveLength(2);
    const c = curves[1]!;
    // Samples at k·τ/100: index 100 is t = τ, index 300 is t = 3τ.
    expect(c.timeS[100]! / tau).toBeCloseTo(1, 12);
    expect(c.fraction[100]).toBeCloseTo(1 - Math.exp(-1), 8);
    expect(c.fraction[300]).toBeCloseTo(0.95021, 5); // physics.md §4.1 [N]: 0.95021 at 3τ
  });
});
