/**
 * Turns a Network into the state equations
 *
 *     M(x)·dx/dt = K·x + B·u(t) + h
 *
 * x: node pressures (Pa gauge), then the lag states of sources (Pa or m³/s), then probe states;
 * u: program channel values (SI); M: diagonal, the node compliances (m³/Pa) and 1 for lag and
 * probe states. Node rows are Kirchhoff's current law (flow balance, physics.md §1.1, §3.1):
 * C·dp/dt = Σ (p_other − p)/R + Σ pump flows. Lag rows are first-order lags τ·dy/dt = u − y.
 * Only the gas term of M depends on x (physics.md §3.3, isothermal): everything else is linear.
 */
import { InputError } from '../errors';
import { add, zeros, type Mat } from './matrix';
import type { Network, Probe } from './types';

/** Standard gravity, m/s² (3rd CGPM 1901; BIPM SI brochure). */
export const STANDARD_GRAVITY = 9.80665;

/** A linear expression in the state, the drives and a constant. */
export interface Affine {
  x: Float64Array;
  u: Float64Array;
  c: number;
}

export interface Assembled {
  nState: number;
  nDrive: number;
  driveNames: string[];
  /** Index of each node's pressure in x. */
  nodeIndex: Map<string, number>;
  K: Mat;
  /** B is nState × nDrive, row-major. */
  B: Float64Array;
  h: Float64Array;
  /** Linear part of the diagonal mass (node compliance, or 1). */
  massLinear: Float64Array;
  /** Gas volume at atmosphere per state (0 for none), m³. */
  gasVolumeAtAtmM3: Float64Array;
  ambientPressurePa: number;
  /** What the outputs are, as affine expressions. */
  resistorFlow: Map<string, Affine>;
  sourceOutput: Map<string, Affine>;
  probe: Map<string, Affine>;
  /** Which states are flows (m³/s) rather than pressures, for tolerances. */
  isFlowState: Uint8Array;
}

function affine(nState: number, nDrive: number): Affine {
  return { x: new Float64Array(nState), u: new Float64Array(nDrive), c: 0 };
}

function scaleAdd(target: Affine, src: Affine, k: number): void {
  for (let i = 0; i < target.x.length; i++) target.x[i] = (target.x[i] as number) + k * (src.x[i] as number);
  for (let i = 0; i < target.u.length; i++) target.u[i] = (target.u[i] as number) + k * (src.u[i] as number);
  target.c += k * src.c;
}

/** Evaluates an affine expression. */
export function evalAffine(e: Affine, x: Float64Array, u: Float64Array): number {
  let s = e.c;
  for (let i = 0; i < e.x.length; i++) {
    const k = e.x[i] as number;
    if (k !== 0) s += k * (x[i] as number);
  }
  for (let i = 0; i < e.u.length; i++) {
    const k = e.u[i] as number;
    if (k !== 0) s += k * (u[i] as number);
  }
  return s;
}

function bad(problem: string, hint: string): InputError {
  return new InputError('bad-network', problem, hint);
}

function checkPositive(v: number, what: string): void {
  if (!(Number.isFinite(v) && v > 0)) throw bad(`${what} must be a positive finite number, got ${v}`, 'check the chip description or network values');
}

/** Builds the state equations; throws InputError for an inconsistent network. */
export function assemble(net: Network, driveNames: string[], probes: Probe[] = []): Assembled {
  const ids = new Set<string>(['ground']);
  const claim = (id: string): void => {
    if (ids.has(id)) throw bad(`the id '${id}' is used twice (or is the reserved 'ground')`, 'give every node, resistor, source and head its own id');
    ids.add(id);
  };
  for (const n of [...net.nodes, ...net.resistors, ...net.flowSources, ...net.pressureSources, ...net.heads]) claim(n.id);
  if (!(net.ambientPressurePa > 0)) throw bad(`ambient pressure must be positive (absolute), got ${net.ambientPressurePa} Pa`, 'use about 101325 Pa');

  const nodeIndex = new Map<string, number>();
  net.nodes.forEach((n, i) => nodeIndex.set(n.id, i));
  let nState = net.nodes.length;
  const lagIndex = new Map<string, number>();
  for (const s of [...net.flowSources, ...net.pressureSources]) {
    if (s.lagS !== undefined && s.lagS !== 0) {
      checkPositive(s.lagS, `lag of source '${s.id}'`);
      lagIndex.set(s.id, nState++);
    }
  }
  const probeIndex = new Map<string, number>();
  for (const p of probes) {
    if (p.lagS !== 0) {
      checkPositive(p.lagS, `lag of probe '${p.id}'`);
      probeIndex.set(p.id, nState++);
    }
  }
  const nDrive = driveNames.length;
  const driveOf = (name: string, owner: string): number => {
    const d = driveNames.indexOf(name);
    if (d < 0) throw new InputError('unknown-drive', `source '${owner}' is driven by program channel '${name}', which the program does not have`, `add a '${name}' column to the program`);
    return d;
  };

  const isFlowState = new Uint8Array(nState);
  const massLinear = new Float64Array(nState).fill(1);
  const gas = new Float64Array(nState);
  net.nodes.forEach((n, i) => {
    const c = n.complianceM3PerPa;
    const v = n.gasVolumeAtAtmM3 ?? 0;
    if (!(Number.isFinite(c) && c >= 0) || !(Number.isFinite(v) && v >= 0) || c + v === 0) {
      throw bad(`node '${n.id}' needs a compliance > 0 or a gas volume > 0 (got C = ${c} m³/Pa, V = ${v} m³)`, 'a junction without compliance should be merged into its resistors');
    }
    massLinear[i] = c;
    gas[i] = v;
  });

  // Pressure at each end, as an affine expression.
  const endPressure = new Map<string, Affine>();
  const ground = affine(nState, nDrive);
  endPressure.set('ground', ground);
  for (const [id, i] of nodeIndex) {
    const e = affine(nState, nDrive);
    e.x[i] = 1;
    endPressure.set(id, e);
  }
  for (const h of net.heads) {
    checkPositive(h.densityKgPerM3, `density of head '${h.id}'`);
    if (!Number.isFinite(h.heightM)) throw bad(`height of head '${h.id}' is not a number`, 'give the height in m');
    const e = affine(nState, nDrive);
    e.c = h.densityKgPerM3 * (h.gravityMPerS2 ?? STANDARD_GRAVITY) * h.heightM;
    endPressure.set(h.id, e);
  }
  const sourceOutput = new Map<string, Affine>();
  const K = zeros(nState);
  const B = new Float64Array(nState * nDrive);
  const hVec = new Float64Array(nState);
  const addRow = (row: number, e: Affine, k: number): void => {
    for (let j = 0; j < nState; j++) if (e.x[j] !== 0) add(K, row, j, k * (e.x[j] as number));
    for (let d = 0; d < nDrive; d++) B[row * nDrive + d] = (B[row * nDrive + d] as number) + k * (e.u[d] as number);
    hVec[row] = (hVec[row] as number) + k * e.c;
  };
  const lagRow = (row: number, d: number, tau: number): void => {
    add(K, row, row, -1 / tau);
    B[row * nDrive + d] = (B[row * nDrive + d] as number) + 1 / tau;
  };

  for (const s of net.pressureSources) {
    const d = driveOf(s.drive, s.id);
    const e = affine(nState, nDrive);
    const li = lagIndex.get(s.id);
    if (li === undefined) e.u[d] = 1;
    else {
      e.x[li] = 1;
      lagRow(li, d, s.lagS as number);
    }
    e.c = s.offsetPa ?? 0;
    endPressure.set(s.id, e);
    sourceOutput.set(s.id, e);
  }
  for (const s of net.flowSources) {
    const d = driveOf(s.drive, s.id);
    const node = nodeIndex.get(s.into);
    if (node === undefined) throw bad(`flow source '${s.id}' pumps into '${s.into}', which is not a compliant node`, 'name a node id as its target');
    const e = affine(nState, nDrive);
    const li = lagIndex.get(s.id);
    if (li === undefined) e.u[d] = 1;
    else {
      e.x[li] = 1;
      isFlowState[li] = 1;
      lagRow(li, d, s.lagS as number);
    }
    sourceOutput.set(s.id, e);
    addRow(node, e, 1);
  }

  const resistorFlow = new Map<string, Affine>();
  for (const r of net.resistors) {
    checkPositive(r.resistancePaSPerM3, `resistance of '${r.id}'`);
    const pf = endPressure.get(r.from);
    const pt = endPressure.get(r.to);
    if (!pf || !pt) {
      const which = pf ? r.to : r.from;
      throw bad(`resistor '${r.id}' connects to '${which}', which is not a node, pressure source, head or 'ground'`, 'check the ends of the resistor');
    }
    const q = affine(nState, nDrive);
    scaleAdd(q, pf, 1 / r.resistancePaSPerM3);
    scaleAdd(q, pt, -1 / r.resistancePaSPerM3);
    resistorFlow.set(r.id, q);
    const fi = nodeIndex.get(r.from);
    const ti = nodeIndex.get(r.to);
    if (fi !== undefined) addRow(fi, q, -1);
    if (ti !== undefined) addRow(ti, q, 1);
  }

  const probe = new Map<string, Affine>();
  for (const p of probes) {
    let target: Affine | undefined;
    if (p.target.kind === 'node') target = endPressure.get(p.target.id) && nodeIndex.has(p.target.id) ? endPressure.get(p.target.id) : undefined;
    else if (p.target.kind === 'resistor') target = resistorFlow.get(p.target.id);
    else target = sourceOutput.get(p.target.id);
    if (!target) throw bad(`probe '${p.id}' looks at ${p.target.kind} '${p.target.id}', which does not exist`, 'check the probe target');
    const pi = probeIndex.get(p.id);
    if (pi === undefined) probe.set(p.id, target);
    else {
      const e = affine(nState, nDrive);
      e.x[pi] = 1;
      probe.set(p.id, e);
      isFlowState[pi] = p.target.kind === 'resistor' || net.flowSources.some((s) => s.id === p.target.id) ? 1 : 0;
      addRow(pi, target, 1 / p.lagS);
      add(K, pi, pi, -1 / p.lagS);
    }
  }

  return {
    nState,
    nDrive,
    driveNames,
    nodeIndex,
    K,
    B,
    h: hVec,
    massLinear,
    gasVolumeAtAtmM3: gas,
    ambientPressurePa: net.ambientPressurePa,
    resistorFlow,
    sourceOutput,
    probe,
    isFlowState,
  };
}

/** Diagonal mass at state x: linear compliance plus the isothermal gas term V_atm·p_atm/p_abs² (physics.md §3.3). */
export function massAt(sys: Assembled, x: Float64Array, out: Float64Array): void {
  const pAtm = sys.ambientPressurePa;
  for (let i = 0; i < sys.nState; i++) {
    const v = sys.gasVolumeAtAtmM3[i] as number;
    if (v === 0) out[i] = sys.massLinear[i] as number;
    else {
      const pAbs = pAtm + (x[i] as number);
      out[i] = (sys.massLinear[i] as number) + (v * pAtm) / (pAbs * pAbs);
    }
  }
}

/** Whether any node holds gas (the network is then nonlinear). */
export function hasGas(sys: Assembled): boolean {
  return sys.gasVolumeAtAtmM3.some((v) => v > 0);
}
