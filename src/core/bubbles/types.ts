/**
 * Result shapes of the trapped-air layer (src/core/bubbles). SI: volumes m³, C in m³/Pa,
 * pressures Pa absolute. `TrappedAirEstimate` maps directly onto the analyze JSON
 * `trapped_air` {volume_m3_at_atm, ci95, method}.
 */
import type { Warning } from '../errors';

export type TrappedAirMethod = 'pressure-fingerprint' | 'excess-compliance';

export interface TrappedAirEstimate {
  method: TrappedAirMethod;
  /** Isothermal air volume at the ambient (atmospheric) pressure, m³; null when inconclusive. */
  volumeM3AtAtm: number | null;
  /** Its 95 % confidence interval, m³ (the lower end may be ≤ 0: then no evidence of gas). */
  ci95: [number, number] | null;
  /** True only when the lower CI end is above zero. */
  evidenceOfGas: boolean;
  /** Plain-language verdict, e.g. "no evidence of trapped gas". */
  statement: string;
  /** Ambient pressure used for "at atmosphere", Pa. */
  ambientPressurePa: number;
  warnings: Warning[];
}
