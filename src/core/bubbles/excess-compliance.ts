/**
 * Trapped air from excess compliance (physics.md §3.4):
 *   ΔC = C_fit − C_nominal,   V_gas ≈ ΔC·(p_abs − p_v)  (isothermal, large bubble)
 *
 * Uncertainty of C_nominal: the nominal prediction gives a range [lo, hi] from property
 * uncertainty (e.g. the PDMS modulus range), not a standard deviation. We treat it as a
 * rectangular (uniform) distribution over that range, standard uncertainty (hi − lo)/√12
 * (JCGM 100:2008 "GUM" §4.3.7), combined in quadrature with the fit's SE (GUM §5.1.2,
 * independent inputs), and use the fit's t-quantile for the 95 % interval.
 */
import type { Warning } from '../errors';
import { estimateFrom } from '../circuits/propagate';
import type { PhysicalEstimate } from '../circuits/types';
import {
  adiabaticVolumeFromCompliance,
  isothermalVolumeFromCompliance,
  volumeAtPressure,
} from './gas-compliance';
import type { GasConditions } from './gas-compliance';
import type { TrappedAirEstimate } from './types';

export interface NominalCompliance {
  /** Predicted compliance of fluid, tubing, chip walls, syringe, m³/Pa. */
  valueM3PerPa: number;
  /** Range from property uncertainty [lo, hi], m³/Pa. */
  rangeM3PerPa: [number, number];
}

export interface ExcessCompliance {
  /** ΔC with SE and 95 % CI, m³/Pa (`inconclusive` means the CI reaches ≤ 0 or spans > 10×). */
  excessM3PerPa: PhysicalEstimate;
  /** Standard uncertainty of the nominal value, (hi − lo)/√12, m³/Pa. */
  nominalStandardUncertaintyM3PerPa: number;
}

/** ΔC = C_fit − C_nominal with the combined uncertainty (header). `dof` = the fit's degrees of freedom. */
export function excessCompliance(fitted: PhysicalEstimate, nominal: NominalCompliance, dof: number): ExcessCompliance {
  const [lo, hi] = nominal.rangeM3PerPa;
  const uNominal = Math.abs(hi - lo) / Math.sqrt(12);
  const se = Math.hypot(fitted.standardError, uNominal);
  return { excessM3PerPa: estimateFrom(fitted.value - nominal.valueM3PerPa, se, dof), nominalStandardUncertaintyM3PerPa: uNominal };
}

export interface AirVolumeConditions extends GasConditions {
  /** Ambient pressure for "at atmosphere", Pa absolute (101325 Pa if unknown). */
  ambientPressurePa: number;
}

export interface AirVolumeFromExcess extends TrappedAirEstimate {
  method: 'excess-compliance';
  /** Isothermal gas volume at the working pressure, m³, with its CI. */
  volumeM3AtWorkingPressure: number;
  volumeCi95M3AtWorkingPressure: [number, number];
  /** Adiabatic upper bound (V = γ·ΔC·p, §3.3) converted to atmosphere, m³. */
  adiabaticUpperBoundM3AtAtm: number;
}

const MICROLITRE = 1e-9;

/**
 * Air volume at the working pressure and at atmosphere from an excess compliance. The volume
 * is monotone in ΔC, so the CI ends map through the same function (exact for a monotone map).
 */
export function airVolumeFromExcess(excess: ExcessCompliance, conditions: AirVolumeConditions): AirVolumeFromExcess {
  const dc = excess.excessM3PerPa;
  const atWork = (c: number): number => isothermalVolumeFromCompliance(c, conditions);
  const toAtm = (v: number): number => volumeAtPressure(v, conditions, conditions.ambientPressurePa);
  const vWork = atWork(dc.value);
  const ciWork: [number, number] = [atWork(dc.ci95[0]), atWork(dc.ci95[1])];
  const vAtm = toAtm(vWork);
  const ciAtm: [number, number] = [toAtm(ciWork[0]), toAtm(ciWork[1])];
  const adiabatic = toAtm(adiabaticVolumeFromCompliance(dc.value, conditions));
  const evidence = ciAtm[0] > 0;
  const warnings: Warning[] = [];
  const fmt = (v: number): string => (v / MICROLITRE).toPrecision(3);
  let statement: string;
  if (evidence) {
    statement =
      `Compliance exceeds the nominal prediction: about ${fmt(vAtm)} µL of air at atmosphere (95 % CI ${fmt(ciAtm[0])} to ` +
      `${fmt(ciAtm[1])} µL; adiabatic upper bound ${fmt(adiabatic)} µL), assuming the excess is all gas.`;
  } else {
    statement = `No evidence of trapped gas: the compliance is within the nominal prediction (air at atmosphere ${fmt(vAtm)} µL, 95 % CI ${fmt(ciAtm[0])} to ${fmt(ciAtm[1])} µL).`;
    if (dc.ci95[1] < 0) {
      warnings.push({
        code: 'compliance-below-nominal',
        message: 'The measured compliance is significantly below the nominal prediction: check the chip description (moduli, tubing lengths).',
      });
    }
  }
  return {
    method: 'excess-compliance',
    volumeM3AtAtm: vAtm,
    ci95: ciAtm,
    evidenceOfGas: evidence,
    statement,
    ambientPressurePa: conditions.ambientPressurePa,
    volumeM3AtWorkingPressure: vWork,
    volumeCi95M3AtWorkingPressure: ciWork,
    adiabaticUpperBoundM3AtAtm: adiabatic,
    warnings,
  };
}
