/**
 * Predicted step responses for every value of a what-if sweep, for overlaying in a chart: the
 * network of each design (buildNetwork) simulated from rest for a step of the drive to its value
 * at t = 0 (exact solver; the trapped-gas integrator when a bubble is present).
 */
import { parseChipDescription } from '../chip/parse';
import type { ChipDescription } from '../chip/types';
import { buildNetwork } from '../simulate/build-network';
import { simulate } from '../simulate/simulate';
import { applyValue } from './apply';
import type { WhatIfOptions } from './sweep';
import type { VarySpec } from './vary';

export interface StepResponse {
  value: number | string;
  timeS: Float64Array;
  /** Pressure at the compliant node, Pa gauge. */
  nodePressurePa: Float64Array;
  /** Flow out through the chip, m³/s. */
  outletFlowM3PerS: Float64Array;
  /** The sensed response as a fraction of its final value (pressure flow-driven, outlet flow pressure-driven). */
  fraction: Float64Array;
}

export interface ResponseOptions {
  /** Length of each response, s (same for all, so they overlay). */
  durationS: number;
  /** Points per response (default 400). */
  points?: number;
}

/** One step response per sweep value. */
export function whatIfStepResponses(chipText: string, file: string, spec: VarySpec, options: WhatIfOptions, resp: ResponseOptions): StepResponse[] {
  const base = parseChipDescription(chipText, file);
  const points = Math.max(2, Math.floor(resp.points ?? 400));
  const timesS = Float64Array.from({ length: points }, (_, k) => (resp.durationS * k) / (points - 1));
  return spec.values.map((value) => {
    let chip: ChipDescription = base;
    let extraGas = 0;
    if (spec.target === 'bubble') extraGas = value as number;
    else chip = parseChipDescription(JSON.stringify(applyValue(JSON.parse(chipText) as Record<string, unknown>, spec, value)), file);
    const built = buildNetwork(chip, options.setup, { ...(options.build ?? {}), extraGasAtAtmM3: extraGas });
    const program = { channels: [{ name: built.drive, quantity: built.drive, points: [{ timeS: 0, valueSI: options.driveSI, rampS: 0 }] }] };
    const res = simulate(built.network, program, { timesS, initial: 'rest' });
    const p = res.nodePressurePa.node as Float64Array;
    const q = res.resistorFlowM3PerS.downstream as Float64Array;
    const sensed = options.setup === 'flow-driven' ? p : q;
    const steady = simulate(built.network, program, { timesS: Float64Array.of(0), initial: 'steady' });
    const final = ((options.setup === 'flow-driven' ? steady.nodePressurePa.node : steady.resistorFlowM3PerS.downstream) as Float64Array)[0] as number;
    return { value, timeS: timesS, nodePressurePa: p, outletFlowM3PerS: q, fraction: sensed.map((v) => v / final) };
  });
}
