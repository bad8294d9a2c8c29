/**
 * The pressure fingerprint of trapped gas, needing no chip description. A fixed amount of
 * air has isothermal compliance C_gas = V/p_abs = V_atm·p_atm/p_abs² (Boyle: V = V_atm·p_atm/p_abs,
 * physics.md §3.3), while liquid and wall compliances do not depend on the pressure level
 * (linear elasticity, §3.2, §3.5). So the compliances of steps at several mean pressures obey
 *
 *   C = C_rigid + V_atm · (p_atm / p_abs²)
 *
 * a straight line in x = (p_atm/p_abs)² (dimensionless, fitted for conditioning): intercept C_rigid
 * (m³/Pa), slope V_atm/p_atm (m³/Pa), so V_atm = slope·p_atm.
 * Weighted least squares with wᵢ = 1/SE(Cᵢ)² (see weighted-line.ts), 95 % CIs from the
 * t-quantile with n − 2 degrees of freedom. Gas is claimed only when the lower CI end of V_atm
 * is above zero. Needs ≥ 3 steps at ≥ 2 distinct pressure levels.
 */
import type { Warning } from '../errors';
import { studentTQuantile } from '../stats';
import type { TrappedAirEstimate } from './types';
import { fitWeightedLine } from './weighted-line';

export interface CompliancePoint {
  /** Compliance of one step, m³/Pa. */
  complianceM3PerPa: number;
  /** Its 1σ, m³/Pa (from the circuit layer); absent = unknown (unweighted fit). */
  standardError?: number;
  /** Mean absolute pressure at the compliant node during the step, Pa. */
  pressureAbsPa: number;
}

export interface FingerprintOptions {
  /** Ambient pressure, Pa absolute; default 101325 Pa (standard atmosphere, ISO 2533). */
  ambientPressurePa?: number;
  /** Two pressure levels count as distinct when they differ by more than this fraction; default 0.02. */
  distinctLevelFraction?: number;
}

export interface PressureFingerprint extends TrappedAirEstimate {
  method: 'pressure-fingerprint';
  /** Pressure-independent compliance (liquid + walls), m³/Pa, with CI; null when inconclusive. */
  rigidComplianceM3PerPa: { value: number; standardError: number; ci95: [number, number] } | null;
  /** Standard error of V_atm, m³. */
  volumeStandardErrorM3: number | null;
  /** Number of steps and of distinct pressure levels used. */
  steps: number;
  pressureLevels: number;
  dof: number;
  /** Reduced χ² of the weighted fit (NaN when unweighted or dof = 0). */
  reducedChiSquare: number;
}

const MICROLITRE = 1e-9;

/** Counts distinct levels: sorted pressures, a new level when the gap exceeds `fraction` of the level. */
function countLevels(pressures: number[], fraction: number): number {
  const sorted = [...pressures].sort((a, b) => a - b);
  let levels = 0;
  let last = Number.NaN;
  for (const p of sorted) {
    if (!(Math.abs(p - last) <= fraction * Math.abs(last))) {
      levels++;
      last = p;
    }
  }
  return levels;
}

/** Separates gas from wall/liquid compliance by the 1/p² signature (header). */
export function pressureFingerprint(points: CompliancePoint[], options: FingerprintOptions = {}): PressureFingerprint {
  const pAtm = options.ambientPressurePa ?? 101325;
  const usable = points.filter((p) => Number.isFinite(p.complianceM3PerPa) && p.pressureAbsPa > 0);
  const levels = countLevels(usable.map((p) => p.pressureAbsPa), options.distinctLevelFraction ?? 0.02);
  const warnings: Warning[] = [];
  const base = {
    method: 'pressure-fingerprint' as const,
    ambientPressurePa: pAtm,
    steps: usable.length,
    pressureLevels: levels,
  };
  if (usable.length < 3 || levels < 2) {
    const reason =
      usable.length < 3
        ? `only ${usable.length} step(s) with a compliance; the fingerprint needs at least 3`
        : 'all steps ran at the same pressure level; the fingerprint needs at least 2 distinct levels';
    warnings.push({ code: 'fingerprint-inconclusive', message: `Pressure fingerprint inconclusive: ${reason}.` });
    return {
      ...base,
      volumeM3AtAtm: null,
      ci95: null,
      evidenceOfGas: false,
      statement: `Inconclusive: ${reason}.`,
      rigidComplianceM3PerPa: null,
      volumeStandardErrorM3: null,
      dof: Math.max(0, usable.length - 2),
      reducedChiSquare: Number.NaN,
      warnings,
    };
  }
  // Scale C to O(1) so the normal equations stay well inside double range.
  const scale = Math.max(...usable.map((p) => Math.abs(p.complianceM3PerPa))) || 1;
  const line = fitWeightedLine(
    usable.map((p) => ({
      x: (pAtm / p.pressureAbsPa) ** 2,
      y: p.complianceM3PerPa / scale,
      standardError: p.standardError !== undefined ? p.standardError / scale : undefined,
    })),
  );
  if (!line.weighted) {
    warnings.push({ code: 'fingerprint-unweighted', message: 'Some compliances had no standard error; the fingerprint was fitted unweighted.' });
  }
  const t = studentTQuantile(0.975, line.dof);
  // slope = V_atm/p_atm in units of C/scale: undo both.
  const vAtm = line.slope * scale * pAtm;
  const seV = Math.sqrt(line.covariance[1][1]) * scale * pAtm;
  const cRigid = line.intercept * scale;
  const seRigid = Math.sqrt(line.covariance[0][0]) * scale;
  const ci: [number, number] = [vAtm - t * seV, vAtm + t * seV];
  const evidence = ci[0] > 0;
  const fmt = (v: number): string => (v / MICROLITRE).toPrecision(3);
  let statement: string;
  if (evidence) {
    statement =
      `Trapped gas: compliance falls with pressure as a gas does (1/p²); about ${fmt(vAtm)} µL of air at atmosphere ` +
      `(95 % CI ${fmt(ci[0])} to ${fmt(ci[1])} µL).`;
  } else {
    statement = `No evidence of trapped gas: V_atm = ${fmt(vAtm)} µL (95 % CI ${fmt(ci[0])} to ${fmt(ci[1])} µL) is not significantly above zero.`;
    if (ci[1] < 0) {
      warnings.push({
        code: 'compliance-rises-with-pressure',
        message: 'Compliance rises with pressure, which no trapped gas explains (non-linear tubing or chip walls?).',
      });
    }
  }
  return {
    ...base,
    volumeM3AtAtm: vAtm,
    ci95: ci,
    evidenceOfGas: evidence,
    statement,
    rigidComplianceM3PerPa: { value: cRigid, standardError: seRigid, ci95: [cRigid - t * seRigid, cRigid + t * seRigid] },
    volumeStandardErrorM3: seV,
    dof: line.dof,
    reducedChiSquare: line.weighted && line.dof > 0 ? line.chiSquare / line.dof : Number.NaN,
    warnings,
  };
}
