/**
 * The JSON shape of a nominal prediction (SI, units in snake_case names), shared by
 * `lagbench predict --json` and any other output that embeds the nominal breakdown.
 */
import type { ValueRange } from './range';
import type { NominalPrediction } from './types';

export interface RangeJson {
  low: number;
  nominal: number;
  high: number;
}

const r = (x: ValueRange): RangeJson => ({ low: x.low, nominal: x.nominal, high: x.high });

/** Plain JSON object for a prediction (no class instances, no undefined values). */
export function nominalPredictionToJson(p: NominalPrediction): Record<string, unknown> {
  return {
    setup: p.setup,
    fluid: {
      name: p.fluid.name,
      temperature_K: p.fluid.temperatureK,
      viscosity_Pa_s: r(p.fluid.viscosityPaS),
      viscosity_tag: p.fluid.viscosityTag,
      compressibility_per_Pa: r(p.fluid.compressibilityPerPa),
      compressibility_tag: p.fluid.compressibilityTag,
      density_kg_per_m3: p.fluid.densityKgPerM3,
      surface_tension_N_per_m: p.fluid.surfaceTensionNPerM,
      vapour_pressure_Pa: p.fluid.vapourPressurePa,
      sources: p.fluid.sources,
    },
    ambient_pressure_Pa: p.ambientPressurePa,
    operating_pressure_Pa: p.operatingPressurePa,
    node_pressure_abs_Pa: p.nodeAbsolutePressurePa,
    resistance_Pa_s_per_m3: r(p.resistance.totalPaSPerM3),
    resistance_upstream_Pa_s_per_m3: r(p.resistance.upstreamPaSPerM3),
    resistance_chip_Pa_s_per_m3: r(p.resistance.chipPaSPerM3),
    resistance_downstream_Pa_s_per_m3: r(p.resistance.downstreamPaSPerM3),
    resistance_seen_by_node_Pa_s_per_m3: r(p.resistance.theveninPaSPerM3),
    resistance_elements: p.resistance.items.map((i) => ({
      element: i.element,
      json_path: i.jsonPath,
      section: i.section,
      method: i.method,
      resistance_Pa_s_per_m3: r(i.resistancePaSPerM3),
    })),
    compliance_m3_per_Pa: r(p.compliance.totalM3PerPa),
    breakdown: p.compliance.breakdown.map((c) => ({
      element: c.element,
      json_path: c.jsonPath,
      section: c.section,
      source: c.source,
      method: c.method,
      tag: c.tag,
      compliance_m3_per_Pa: r(c.complianceM3PerPa),
      counted: c.counted,
      note: c.note ?? null,
    })),
    tau_s: r(p.tauS),
    t95_s: r(p.t95S),
    warnings: p.warnings.map((w) => ({ code: w.code, message: w.message })),
    notes: p.notes,
  };
}
