/**
 * whatIf: predicted τ, t₉₅, R, C and the steady state for a drive, across a sweep of one design
 * variable, and the values that meet a target settling time. Each sweep value is a modified chip
 * description run through parseChipDescription → predictNominal (physics.md §1–4); τ is the
 * nominal one (gas linearised at the operating pressure), t₉₅ = ln(20)·τ (physics.md §4.1).
 */
import { parseChipDescription } from '../chip/parse';
import type { ChipDescription } from '../chip/types';
import { InputError } from '../errors';
import { T95_PER_TAU } from '../nominal/predict';
import type { NominalPrediction, Setup } from '../nominal/types';
import type { ValueRange } from '../nominal/range';
import { buildNetwork, type BuildOptions } from '../simulate/build-network';
import { timeConstantsAt } from '../simulate/truth';
import { applyValue } from './apply';
import type { VarySpec } from './vary';

export interface WhatIfOptions {
  setup: Setup;
  /** The drive for the steady state: pump flow (m³/s, flow-driven) or regulator pressure (Pa, pressure-driven). */
  driveSI: number;
  /** Target t₉₅, s: values with t₉₅ ≤ target meet it. */
  targetT95S?: number;
  /** Extra options for the network (source lag, outlet head). */
  build?: Omit<BuildOptions, 'extraGasAtAtmM3'>;
}

export interface WhatIfRow {
  value: number | string;
  resistanceTotalPaSPerM3: number;
  resistanceTheveninPaSPerM3: number;
  complianceM3PerPa: ValueRange;
  tauS: ValueRange;
  t95S: ValueRange;
  /** Slowest time constant of the simulated network (includes a source lag, gas at the operating pressure). */
  networkTauS: number[];
  /** Steady flow through the chip at the drive, m³/s (physics.md §1.1: Q = Δp/R_total). */
  steadyFlowM3PerS: number;
  /** Steady gauge pressure the source must deliver, Pa (flow-driven: Q·R_total). */
  steadySourcePressurePa: number;
  /** Null when no target was given. */
  meetsTarget: boolean | null;
}

export interface WhatIfResult {
  setup: Setup;
  vary: VarySpec;
  driveSI: number;
  targetT95S: number | null;
  rows: WhatIfRow[];
  /** For numeric sweeps: intervals of the variable where t₉₅ ≤ target, ends interpolated linearly between sweep points. */
  meetingRanges: Array<[number, number]>;
  baseline: NominalPrediction;
}

/** The chip description text with one sweep value applied, as a parsed description. */
function describe(chipText: string, file: string, spec: VarySpec, value: number | string): { chip: ChipDescription; extraGas: number } {
  if (spec.target === 'bubble') return { chip: parseChipDescription(chipText, file), extraGas: value as number };
  const plain = JSON.parse(chipText) as Record<string, unknown>;
  const modified = applyValue(plain, spec, value);
  try {
    return { chip: parseChipDescription(JSON.stringify(modified, null, 2), file), extraGas: 0 };
  } catch (e) {
    if (e instanceof InputError) {
      throw new InputError('bad-vary-value', `with ${spec.target}.${spec.property} = ${value}: ${e.problem}`, e.hint, { file });
    }
    throw e;
  }
}

export function whatIf(chipText: string, file: string, spec: VarySpec, options: WhatIfOptions): WhatIfResult {
  if (!Number.isFinite(options.driveSI)) throw new InputError('bad-drive', 'the drive is not a number', 'give a flow such as 5 uL/min or a pressure such as 200 mbar');
  const target = options.targetT95S ?? null;
  // The unmodified description first: its problems are reported with their own lines and columns.
  const baseline = buildNetwork(parseChipDescription(chipText, file), options.setup, options.build ?? {}).nominal;
  const rows = spec.values.map((value): WhatIfRow => {
    const { chip, extraGas } = describe(chipText, file, spec, value);
    const built = buildNetwork(chip, options.setup, { ...(options.build ?? {}), extraGasAtAtmM3: extraGas });
    const p = built.nominal;
    const rTot = p.resistance.totalPaSPerM3.nominal;
    const pOp = p.operatingPressurePa;
    const taus = timeConstantsAt(built.network, [built.drive], { node: pOp });
    // Gas added as a "bubble" is not in predictNominal: fold its compliance at the operating pressure in.
    const gasC = (extraGas * p.ambientPressurePa) / (p.nodeAbsolutePressurePa * p.nodeAbsolutePressurePa);
    const c: ValueRange = { low: p.compliance.totalM3PerPa.low + gasC, nominal: p.compliance.totalM3PerPa.nominal + gasC, high: p.compliance.totalM3PerPa.high + gasC };
    const rth = p.resistance.theveninPaSPerM3;
    const tau: ValueRange = { low: c.low * rth.low, nominal: c.nominal * rth.nominal, high: c.high * rth.high };
    const t95: ValueRange = { low: tau.low * T95_PER_TAU, nominal: tau.nominal * T95_PER_TAU, high: tau.high * T95_PER_TAU };
    const flow = options.setup === 'flow-driven' ? options.driveSI : options.driveSI / rTot;
    return {
      value,
      resistanceTotalPaSPerM3: rTot,
      resistanceTheveninPaSPerM3: rth.nominal,
      complianceM3PerPa: c,
      tauS: tau,
      t95S: t95,
      networkTauS: taus,
      steadyFlowM3PerS: flow,
      steadySourcePressurePa: options.setup === 'flow-driven' ? options.driveSI * rTot : options.driveSI,
      meetsTarget: target === null ? null : t95.nominal <= target,
    };
  });
  return { setup: options.setup, vary: spec, driveSI: options.driveSI, targetT95S: target, rows, meetingRanges: target === null ? [] : meetingRanges(rows, target), baseline };
}

/** Intervals of a numeric sweep where t₉₅ ≤ target, with the crossing points interpolated linearly. */
export function meetingRanges(rows: WhatIfRow[], targetS: number): Array<[number, number]> {
  if (rows.some((r) => typeof r.value !== 'number')) return [];
  const x = rows.map((r) => r.value as number);
  const y = rows.map((r) => r.t95S.nominal - targetS);
  const out: Array<[number, number]> = [];
  let start: number | null = null;
  const cross = (i: number): number => {
    const x0 = x[i - 1] as number;
    const x1 = x[i] as number;
    const y0 = y[i - 1] as number;
    const y1 = y[i] as number;
    return y1 === y0 ? x1 : x0 + ((x1 - x0) * (0 - y0)) / (y1 - y0);
  };
  for (let i = 0; i < x.length; i++) {
    const ok = (y[i] as number) <= 0;
    if (ok && start === null) start = i === 0 ? (x[0] as number) : cross(i);
    if (!ok && start !== null) {
      out.push([start, cross(i)]);
      start = null;
    }
  }
  if (start !== null) out.push([start, x[x.length - 1] as number]);
  return out;
}
