/**
 * buildNetwork(chip, setup): the lumped network of a chip description in one of the two set-ups,
 * with the nominal R and C of predictNominal (physics.md §4.2, §4.3) and any trapped gas kept as
 * a pressure-dependent (isothermal) compliance, so that simulated steps at different pressures
 * show the gas fingerprint (physics.md §3.3–3.4).
 *
 *   flow-driven:     pump ──▶ node (C) ── R_down (chip + downstream) ──▶ outlet
 *   pressure-driven: regulator (lag) ── R_up ── node (C) ── R_down ──▶ outlet
 *
 * With `nodes: 'two'` the compliance of the upstream section (syringe, tubing) sits at its own node
 * `inlet`, apart from the chip section's at `node` (a two-node ladder, physics.md §4.4):
 *
 *   flow-driven:     pump ──▶ inlet (C_up) ── R_up ── node (C_chip) ── R_down ──▶ outlet
 *   pressure-driven: regulator ── R_up/2 ── inlet (C_up) ── R_up/2 ── node (C_chip) ── R_down ──▶ outlet
 *
 * (the upstream line's compliance is spread along R_up; putting it at the middle is the usual
 * two-cell discretisation, physics.md §3.7). Extra trapped air goes to `node` (in the chip).
 *
 * The outlet is at 0 gauge, or at the liquid head ρ·g·h of an outlet reservoir h above the node.
 */
import type { ChipDescription } from '../chip/types';
import { InputError } from '../errors';
import { predictNominal } from '../nominal/predict';
import type { NominalPrediction, Setup } from '../nominal/types';
import { STANDARD_GRAVITY } from './assemble';
import type { Network, Probe } from './types';

export interface BuildOptions {
  /** First-order lag of the regulator (pressure-driven) or pump (flow-driven) behind its setpoint, s. Default 0. */
  sourceLagS?: number;
  /** Extra trapped air at the node, volume at atmospheric pressure, m³ (e.g. a bubble left after priming). */
  extraGasAtAtmM3?: number;
  /** 'nonlinear' (default): gas compliance follows V_atm·p_atm/p_abs²; 'linearised': frozen at the operating pressure. */
  gas?: 'nonlinear' | 'linearised';
  /** Height of the outlet liquid surface above the node, m (hydrostatic back-pressure). Default 0. */
  outletHeightM?: number;
  /** Overrides the description's operating (gauge) pressure, Pa. */
  operatingPressurePa?: number;
  /** 'one' (default): all counted compliance at one node, as predictNominal lumps it; 'two': upstream and chip apart. */
  nodes?: 'one' | 'two';
  /**
   * With two nodes, which node the pressure sensor reads: 'inlet' (default: the pump-side compliant node,
   * where a flow-driven user's sensor normally sits, physics.md §4.2) or 'chip' (the chip node). The ladder
   * inverse of `estimateLadder` needs the inlet (node-1) pressure; docs/setups.md §4.
   */
  pressureAt?: 'inlet' | 'chip';
}

export interface BuiltNetwork {
  network: Network;
  setup: Setup;
  /** The program channel that drives the source: 'flow' or 'pressure'. */
  drive: 'flow' | 'pressure';
  nominal: NominalPrediction;
  /** Where a pressure sensor and a flow sensor look by default. */
  pressureTarget: Probe['target'];
  /** The node the pressure sensor reads: 'node' (one node, or two with pressureAt 'chip') or 'inlet'. */
  sensedNodeId: string;
  flowTarget: Probe['target'];
  /** Inlet flow (pressure-driven: through R_up; flow-driven: the pump). */
  inletFlowTarget: Probe['target'];
  /** Linear (non-gas) compliance of all nodes, m³/Pa. */
  linearComplianceM3PerPa: number;
  /** Trapped gas of all nodes, volume at atmospheric pressure, m³. */
  gasVolumeAtAtmM3: number;
}

/** Node, source and resistor ids used by buildNetwork. */
export const IDS = { node: 'node', inlet: 'inlet', pump: 'pump', regulator: 'regulator', supply: 'supply', upstream: 'upstream', downstream: 'downstream', outlet: 'outlet' } as const;

export function buildNetwork(chip: ChipDescription, setup: Setup, options: BuildOptions = {}): BuiltNetwork {
  const nominal = predictNominal(chip, setup, options.operatingPressurePa === undefined ? {} : { operatingPressurePa: options.operatingPressurePa });
  const pAtm = nominal.ambientPressurePa;
  const pAbs = nominal.nodeAbsolutePressurePa;
  const two = options.nodes === 'two';
  let cLin = 0;
  let vAtm = 0;
  let cUp = 0;
  let vUp = 0;
  for (const item of nominal.compliance.breakdown) {
    if (!item.counted) continue;
    // predictNominal gives a gas pocket as V/p_abs at the operating pressure (isothermal, physics.md §3.3):
    // so V = C·p_abs there, and at atmosphere V_atm = V·p_abs/p_atm (Boyle).
    const upstream = two && item.section === 'upstream';
    if (item.source === 'gas') {
      const v = (item.complianceM3PerPa.nominal * pAbs * pAbs) / pAtm;
      if (upstream) vUp += v;
      else vAtm += v;
    } else if (upstream) cUp += item.complianceM3PerPa.nominal;
    else cLin += item.complianceM3PerPa.nominal;
  }
  const extra = options.extraGasAtAtmM3 ?? 0;
  if (!(extra >= 0)) throw new InputError('bad-gas-volume', `extra gas volume must be ≥ 0, got ${extra} m³`, 'give a volume such as 2 uL');
  vAtm += extra;
  const linearised = options.gas === 'linearised';
  const nodeC = linearised ? cLin + (vAtm * pAtm) / (pAbs * pAbs) : cLin;
  const inletC = linearised ? cUp + (vUp * pAtm) / (pAbs * pAbs) : cUp;
  const rDown = nominal.resistance.downstreamPaSPerM3.nominal;
  const rUp = nominal.resistance.upstreamPaSPerM3.nominal;
  if (!(rDown > 0)) throw new InputError('no-chip-resistance', 'the chip and downstream sections have no resistance', 'describe at least one channel in "chip"', { file: chip.fileName });
  if (nodeC + vAtm <= 0) throw new InputError('no-compliance', 'the description gives the node no compliance', 'add tubing, a syringe or a measured compliance', { file: chip.fileName });

  const lag = options.sourceLagS ?? 0;
  const heightM = options.outletHeightM ?? 0;
  const density = nominal.fluid.densityKgPerM3;
  const outletEnd = heightM !== 0 ? IDS.outlet : 'ground';
  const network: Network = {
    nodes: [{ id: IDS.node, complianceM3PerPa: nodeC, ...(linearised || vAtm === 0 ? {} : { gasVolumeAtAtmM3: vAtm }) }],
    resistors: [{ id: IDS.downstream, from: IDS.node, to: outletEnd, resistancePaSPerM3: rDown }],
    flowSources: [],
    pressureSources: [],
    heads: heightM !== 0 ? [{ id: IDS.outlet, heightM, densityKgPerM3: density, gravityMPerS2: STANDARD_GRAVITY }] : [],
    ambientPressurePa: pAtm,
  };
  if (two) {
    if (!(rUp > 0) || cUp + vUp <= 0) {
      throw new InputError('no-upstream-node', 'two nodes need an upstream section with both resistance and compliance', 'describe the supply tubing in "upstream", or use one node', { file: chip.fileName });
    }
    network.nodes.unshift({ id: IDS.inlet, complianceM3PerPa: inletC, ...(linearised || vUp === 0 ? {} : { gasVolumeAtAtmM3: vUp }) });
  }
  if (setup === 'flow-driven') {
    network.flowSources.push({ id: IDS.pump, into: two ? IDS.inlet : IDS.node, drive: 'flow', ...(lag > 0 ? { lagS: lag } : {}) });
    if (two) network.resistors.unshift({ id: IDS.upstream, from: IDS.inlet, to: IDS.node, resistancePaSPerM3: rUp });
  } else {
    if (!(rUp > 0)) {
      throw new InputError('no-upstream-resistance', 'pressure-driven set-up without resistance upstream of the node: the regulator would hold the node and nothing settles', 'add the supply tubing or sensor to "upstream" in the chip description', { file: chip.fileName });
    }
    network.pressureSources.push({ id: IDS.regulator, drive: 'pressure', ...(lag > 0 ? { lagS: lag } : {}) });
    if (two) {
      network.resistors.unshift(
        { id: IDS.supply, from: IDS.regulator, to: IDS.inlet, resistancePaSPerM3: rUp / 2 },
        { id: IDS.upstream, from: IDS.inlet, to: IDS.node, resistancePaSPerM3: rUp / 2 },
      );
    } else network.resistors.unshift({ id: IDS.upstream, from: IDS.regulator, to: IDS.node, resistancePaSPerM3: rUp });
  }
  const pressureAt = options.pressureAt ?? 'inlet';
  if (pressureAt !== 'inlet' && pressureAt !== 'chip') {
    throw new InputError('bad-pressure-at', `unknown sensed node '${String(pressureAt)}'`, 'use inlet or chip');
  }
  const sensedNodeId = two && pressureAt === 'inlet' ? IDS.inlet : IDS.node;
  return {
    network,
    setup,
    drive: setup === 'flow-driven' ? 'flow' : 'pressure',
    nominal,
    pressureTarget: { kind: 'node', id: sensedNodeId },
    sensedNodeId,
    flowTarget: { kind: 'resistor', id: IDS.downstream },
    inletFlowTarget: setup === 'flow-driven' ? { kind: 'source', id: IDS.pump } : { kind: 'resistor', id: two ? IDS.supply : IDS.upstream },
    linearComplianceM3PerPa: cLin + cUp,
    gasVolumeAtAtmM3: vAtm + vUp,
  };
}
