import type { Warning } from '../errors';
import type { FluidProperties } from '../fluids/types';
import type { PathSection } from '../chip/types';
import type { ValueRange } from './range';

/** The lumped circuits we predict for (physics.md §4.2, §4.3). */
export type Setup = 'flow-driven' | 'pressure-driven';
export const SETUPS: readonly Setup[] = ['flow-driven', 'pressure-driven'];

/** Where a compliance comes from. */
export type ComplianceSource = 'liquid' | 'tubing-wall' | 'channel-wall' | 'syringe' | 'gas' | 'measured';

export interface ComplianceItem {
  /** Label of the element it belongs to. */
  element: string;
  /** JSON path of the element in the description. */
  jsonPath: string;
  section: PathSection;
  source: ComplianceSource;
  /** The formula used, with its source. */
  method: string;
  /** physics.md status tag of the weakest input (S, N, D, M, P) or U for user-given. */
  tag: string;
  complianceM3PerPa: ValueRange;
  /** Whether it is lumped into the compliant node (false: downstream of the chip, or part of the source). */
  counted: boolean;
  note?: string;
}

export interface ResistanceItem {
  element: string;
  jsonPath: string;
  section: PathSection;
  method: string;
  resistancePaSPerM3: ValueRange;
}

export interface NominalPrediction {
  setup: Setup;
  fluid: FluidProperties;
  ambientPressurePa: number;
  /** Gauge pressure at the compliant node, Pa. */
  operatingPressurePa: number;
  /** ambient + operating: the pressure gas pockets feel, Pa. */
  nodeAbsolutePressurePa: number;
  resistance: {
    /** Elements upstream of the compliant node (tubing, sensor…). */
    upstreamPaSPerM3: ValueRange;
    /** The chip section alone. */
    chipPaSPerM3: ValueRange;
    /** Chip + downstream: what the node drains through. */
    downstreamPaSPerM3: ValueRange;
    /** Whole path: Δp / Q at steady state. */
    totalPaSPerM3: ValueRange;
    /** Resistance seen by the node (flow-driven: R_down; pressure-driven: R_up ∥ R_down). */
    theveninPaSPerM3: ValueRange;
    items: ResistanceItem[];
  };
  compliance: {
    /** Sum of the counted items (bounds added bound by bound: a worst-case interval). */
    totalM3PerPa: ValueRange;
    breakdown: ComplianceItem[];
  };
  tauS: ValueRange;
  /** Time to 95 % of the final value: ln(20) τ = 2.9957 τ (physics.md §4.1). */
  t95S: ValueRange;
  warnings: Warning[];
  /** Standing caveats (lumping, [M] inputs). */
  notes: string[];
}
