/** Worker messages and view model of the what-if view (src/ui/views/whatif-view.ts). SI throughout. */
import type { Setup } from '../../core/nominal/types';

export interface WhatIfRequest {
  chipText: string;
  chipName: string;
  setup: Setup;
  /** `<element>.<property>=<from>:<to>[:<steps>]` or a comma list (core parseVary). */
  vary: string;
  /** Pump flow ("10 uL/min") or regulator pressure ("200 mbar"); '' = default. */
  driveText: string;
  targetT95S: number | null;
}

export interface RangeView {
  low: number;
  nominal: number;
  high: number;
}

export interface WhatIfRowView {
  value: number | string;
  resistanceTotalPaSPerM3: number;
  complianceM3PerPa: RangeView;
  tauS: RangeView;
  t95S: RangeView;
  steadyFlowM3PerS: number;
  steadySourcePressurePa: number;
  meetsTarget: boolean | null;
}

export interface WhatIfView {
  setup: Setup;
  vary: { target: string; property: string; dimension: string; text: string };
  driveSI: number;
  targetT95S: number | null;
  rows: WhatIfRowView[];
  meetingRanges: Array<[number, number]>;
  /** Predicted step responses (fraction of the final value) per sweep value. */
  curves: Array<{ value: number | string; tS: number[]; fraction: number[] }>;
  notes: string[];
}
