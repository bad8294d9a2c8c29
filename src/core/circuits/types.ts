/**
 * Result shapes of the circuit layer (src/core/circuits): hydraulic resistance R and
 * compliance C of the user's real set-up, estimated from fitted step responses.
 * SI everywhere: R in Pa·s/m³, C in m³/Pa, τ in s, pressures in Pa, flows in m³/s.
 */
import type { Warning } from '../errors';

/** A derived physical quantity with its uncertainty (SI, unit in the owning field's name). */
export interface PhysicalEstimate {
  value: number;
  /** Standard error (1σ) from the delta method with the fit's full covariance. */
  standardError: number;
  /** 95 % confidence interval [lo, hi]: value ± t(0.975, dof)·standardError. */
  ci95: [number, number];
  /**
   * True when the data do not determine the quantity: the 95 % CI includes 0 (or a
   * non-positive value) or spans more than a factor of 10 (hi/lo > 10).
   */
  inconclusive: boolean;
}

/** Which lumped circuit produced the log (docs/setups.md draws each one). */
export type SetupKind =
  | 'flow-driven'
  | 'pressure-driven-outlet-flow'
  | 'pressure-driven-inlet-flow'
  | 'ladder-flow-driven'
  | 'ladder-pressure-driven';

/**
 * The summary every setup returns, mapped one-to-one onto the analyze JSON
 * (`resistance_Pa_s_per_m3`, `resistance_ci95`, `compliance_m3_per_Pa`, `compliance_ci95`).
 * `null` when the setup cannot identify that element (e.g. C without R_up), with a warning saying why.
 */
export interface CircuitEstimate {
  setup: SetupKind;
  /** The resistance the step reveals (flow-driven: R; pressure-driven: R_total = R_up + R_down). */
  resistancePaSPerM3: PhysicalEstimate | null;
  /** The compliance of the compliant node (ladders: C₁ + C₂). */
  complianceM3PerPa: PhysicalEstimate | null;
  /** The time constant used for C (the slow term when the fit has several). */
  tauS: PhysicalEstimate;
  /** Which fitted term (1-based, τ ascending) was taken as the chip's time constant. */
  tauTermIndex: number;
  /** Plain-language notes on how the numbers were obtained (shown beside the result). */
  notes: string[];
  warnings: Warning[];
}

/** A level measured before the step (the baseline a fitted plateau is compared with), SI. */
export interface LevelEstimate {
  value: number;
  /** 1σ of the level (e.g. the standard error of the pre-step mean); 0 when exact. */
  standardError?: number;
}
