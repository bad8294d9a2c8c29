import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseChipDescription } from '../../../src/core/chip';
import { buildNetwork } from '../../../src/core/simulate/build-network';
import { simulate } from '../../../src/core/simulate/simulate';
import { timeConstantsAt } from '../../../src/core/simulate/truth';

const chipText = readFileSync('sample-logs/chips/pdms-mixer.json', 'utf8');
const chip = parseChipDescription(chipText, 'pdms-mixer.json');

describe('buildNetwork', () => {
  it('buildNetwork(chip, flow-driven) has τ = R_down·C of the nominal prediction (physics.md §4.2)', () => {
    const built = buildNetwork(chip, 'flow-driven');
    const taus = timeConstantsAt(built.network, ['flow'], { node: built.nominal.operatingPressurePa });
    // Cross-check of two code paths (network eigenvalue vs predictNominal); the nominal τ itself is checked
    // against hand derivations of §4.2/§4.3 in tests/core/nominal/predict.test.ts.
    expect(taus).toHaveLength(1);
    expect(taus[0]! / built.nominal.tauS.nominal).toBeCloseTo(1, 10);
    // The steady inlet pressure of the simulated circuit is Q·R_down (physics.md §1.1).
    const q = 1.666667e-11 * 5; // 5 µL/min (physics.md §5)
    const res = simulate(built.network, { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: q, rampS: 0 }] }] }, { timesS: Float64Array.from([0]) });
    expect(res.nodePressurePa.node![0]! / (q * built.nominal.resistance.downstreamPaSPerM3.nominal)).toBeCloseTo(1, 12);
  });

  it('buildNetwork(chip, pressure-driven) has τ = C·R_up·R_down/(R_up + R_down) (physics.md §4.3)', () => {
    const built = buildNetwork(chip, 'pressure-driven');
    const taus = timeConstantsAt(built.network, ['pressure']);
    // Cross-check of two code paths, as above; the resistor ids are our own naming.
    expect(taus[0]! / built.nominal.tauS.nominal).toBeCloseTo(1, 10);
    expect(built.network.resistors.map((r) => r.id)).toEqual(['upstream', 'downstream']);
  });

  it('buildNetwork(extra gas) adds V_atm·p_atm/p_abs² at the node (physics.md §3.3: 10 µL at 1 atm = 9.869e-14 m³/Pa)', () => {
    const plain = buildNetwork(chip, 'flow-driven');
    const bubbly = buildNetwork(chip, 'flow-driven', { extraGasAtAtmM3: 1e-8 });
    expect(bubbly.gasVolumeAtAtmM3 - plain.gasVolumeAtAtmM3).toBeCloseTo(1e-8, 20); // the 10 µL passed in
    const net = { ...bubbly.network, ambientPressurePa: 101325 };
    const cAt0 = timeConstantsAt(net, ['flow'], { node: 0 })[0]! / bubbly.nominal.resistance.downstreamPaSPerM3.nominal;
    expect((cAt0 - plain.linearComplianceM3PerPa) / 9.869e-14).toBeCloseTo(1, 3);
  });

  it('buildNetwork(outlet 10 cm above) adds the head ρ·g·h to the node pressure', () => {
    const built = buildNetwork(chip, 'flow-driven', { outletHeightM: 0.1 });
    const res = simulate(built.network, { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 0, rampS: 0 }] }] }, { timesS: Float64Array.from([0]) });
    // ρ of water at 22 °C ≈ 997.77 kg/m³ (physics.md §2.1 table brackets it: 998.207 at 20 °C, 997.048 at 25 °C); g = 9.80665.
    expect(res.nodePressurePa.node![0]!).toBeGreaterThan(997.048 * 9.80665 * 0.1);
    expect(res.nodePressurePa.node![0]!).toBeLessThan(998.207 * 9.80665 * 0.1);
  });
});

describe('timeConstantsAt', () => {
  it('timeConstantsAt(two-node ladder) gives τ = 1.80656 s and 0.276768 s (physics.md §4.4 check values)', () => {
    const taus = timeConstantsAt(
      {
        nodes: [{ id: 'n1', complianceM3PerPa: 1e-13 }, { id: 'n2', complianceM3PerPa: 5e-14 }],
        resistors: [
          { id: 'r1', from: 'src', to: 'n1', resistancePaSPerM3: 2e13 },
          { id: 'r2', from: 'n1', to: 'n2', resistancePaSPerM3: 1e13 },
          { id: 'r3', from: 'n2', to: 'ground', resistancePaSPerM3: 3e13 },
        ],
        flowSources: [],
        pressureSources: [{ id: 'src', drive: 'pressure' }],
        heads: [],
        ambientPressurePa: 101325,
      },
      ['pressure'],
    );
    expect(taus[0]).toBeCloseTo(1.80656, 5);
    expect(taus[1]).toBeCloseTo(0.276768, 6);
  });
});

describe('buildNetwork(nodes: two)', () => {
  const soft = parseChipDescription(readFileSync('sample-logs/chips/pdms-mixer-soft-tubing.json', 'utf8'), 'pdms-mixer-soft-tubing.json');

  it('buildNetwork(two nodes) keeps the total compliance and gives the ladder τ of physics.md §4.4 (flow-source version)', () => {
    const one = buildNetwork(soft, 'flow-driven', { gas: 'linearised' });
    const two = buildNetwork(soft, 'flow-driven', { gas: 'linearised', nodes: 'two' });
    const c = (b: typeof one): number => b.network.nodes.reduce((s, n) => s + n.complianceM3PerPa, 0);
    expect(c(two) / c(one)).toBeCloseTo(1, 12);
    const c1 = two.network.nodes.find((n) => n.id === 'inlet')!.complianceM3PerPa;
    const c2 = two.network.nodes.find((n) => n.id === 'node')!.complianceM3PerPa;
    const r2 = two.nominal.resistance.upstreamPaSPerM3.nominal;
    const r3 = two.nominal.resistance.downstreamPaSPerM3.nominal;
    // physics.md §4.4 with G1 = 0 (flow source): T = −[G2/C1 + (G2 + G3)/C2], D = 1/(R2 R3 C1 C2).
    const T = -(1 / r2 / c1 + (1 / r2 + 1 / r3) / c2);
    const D = 1 / (r2 * r3 * c1 * c2);
    const expected = [(T + Math.sqrt(T * T - 4 * D)) / 2, (T - Math.sqrt(T * T - 4 * D)) / 2].map((l) => -1 / l);
    const taus = timeConstantsAt(two.network, ['flow']);
    expect(taus[0]! / expected[0]!).toBeCloseTo(1, 9);
    expect(taus[1]! / expected[1]!).toBeCloseTo(1, 9);
  });

  it('buildNetwork(two nodes, pressure-driven) splits R_up around the inlet node: τ from physics.md §4.4', () => {
    const chip = parseChipDescription(readFileSync('sample-logs/simulated/regulator-bench.chip.json', 'utf8'), 'regulator-bench.chip.json');
    const two = buildNetwork(chip, 'pressure-driven', { nodes: 'two' });
    const c1 = two.network.nodes.find((n) => n.id === 'inlet')!.complianceM3PerPa;
    const c2 = two.network.nodes.find((n) => n.id === 'node')!.complianceM3PerPa;
    const r1 = two.nominal.resistance.upstreamPaSPerM3.nominal / 2;
    const r3 = two.nominal.resistance.downstreamPaSPerM3.nominal;
    const [g1, g2, g3] = [1 / r1, 1 / r1, 1 / r3];
    const T = -((g1 + g2) / c1 + (g2 + g3) / c2);
    const D = (g1 * g2 + g1 * g3 + g2 * g3) / (c1 * c2);
    const slow = -2 / (T + Math.sqrt(T * T - 4 * D));
    expect(timeConstantsAt(two.network, ['pressure'])[0]! / slow).toBeCloseTo(1, 9);
  });

  it('simulate(two nodes) starts the chip-node pressure with zero slope after a step (physics.md §4.4)', () => {
    const two = buildNetwork(soft, 'flow-driven', { gas: 'linearised', nodes: 'two' });
    const q = 1.666667e-10; // 10 µL/min
    const prog = { channels: [{ name: 'flow', quantity: 'flow' as const, points: [{ timeS: 0, valueSI: 0, rampS: 0 }, { timeS: 1, valueSI: q, rampS: 0 }] }] };
    // The fast mode here is ≈ 21 µs (R_up·C_chip), so look within 0.2 µs of the step.
    const res = simulate(two.network, prog, { timesS: Float64Array.from([1, 1 + 1e-7, 1 + 2e-7]) });
    const p = res.nodePressurePa.node!;
    const pIn = res.nodePressurePa.inlet!;
    // Derivation (Taylor expansion at the step, §4.4 [D]): the inlet rises linearly at first (Q/C1): p(2δ)/p(δ) = 2;
    // the chip node quadratically (zero slope): 4.
    expect((pIn[2]! - pIn[0]!) / (pIn[1]! - pIn[0]!)).toBeCloseTo(2, 1);
    expect((p[2]! - p[0]!) / (p[1]! - p[0]!)).toBeCloseTo(4, 1);
  });
});
