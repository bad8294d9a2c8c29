/**
 * The truth of a simulated network, written beside every simulated log: R, C (with the nominal
 * breakdown), time constants, trapped air. Time constants are those of the network linearised at
 * given node pressures: τᵢ = −1/Re λᵢ of A = M(x)⁻¹K (physics.md §4.4 for two nodes), which for a
 * single node is τ = C(p)·R_th (physics.md §4.1).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { assemble, massAt } from './assemble';
import type { Network } from './types';

/** Time constants (s, descending) of the network linearised at the given node pressures (Pa gauge, by node id). */
export function timeConstantsAt(network: Network, driveNames: string[], nodePressurePa: Record<string, number> = {}): number[] {
  const sys = assemble(network, driveNames);
  const x = new Float64Array(sys.nState);
  for (const [id, i] of sys.nodeIndex) x[i] = nodePressurePa[id] ?? 0;
  const mass = new Float64Array(sys.nState);
  massAt(sys, x, mass);
  const n = sys.nState;
  if (n === 0) return [];
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) {
    const row: number[] = [];
    for (let j = 0; j < n; j++) row.push((sys.K.a[i * n + j] as number) / (mass[i] as number));
    rows.push(row);
  }
  const evd = new EigenvalueDecomposition(new Matrix(rows));
  return evd.realEigenvalues.map((l) => (l < 0 ? -1 / l : Infinity)).sort((a, b) => b - a);
}

/** Compliance at a node at gauge pressure p: linear C plus V_atm·p_atm/p_abs² (physics.md §3.3). */
export function nodeComplianceAt(network: Network, nodeId: string, pressurePa: number): number {
  const node = network.nodes.find((n) => n.id === nodeId);
  if (!node) return Number.NaN;
  const pAbs = network.ambientPressurePa + pressurePa;
  return node.complianceM3PerPa + ((node.gasVolumeAtAtmM3 ?? 0) * network.ambientPressurePa) / (pAbs * pAbs);
}
