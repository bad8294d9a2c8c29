/**
 * Builders of QC store inputs with known values (test helpers, not a test file). Numbers are invented test
 * inputs; the compliance adds the isothermal gas term V/p_atm (physics.md §3.3, p_atm = 101325 Pa).
 */
import { parseQcSpec } from '../../src/core/qc/spec';
import type { ChipMeasurement } from '../../src/core/qc/types';
import { evaluateChip } from '../../src/core/qc/verdict';
import type { RecordChipInput } from '../../src/io/qc-store';
import { sha256Hex } from '../../src/io/sha256';

export const SPEC_TEXT = `{
  "lagbench_qc_spec": 1,
  "design": { "name": "PDMS mixer M2 (test)" },
  "test": { "setup": "bench 1", "program": "steps 0-100-0 mbar" },
  "limits": {
    "resistance": { "unit": "Pa_s_per_m3", "nominal": 2.0e13, "tolerance_percent": 10 },
    "trapped_air": { "unit": "nL", "max": 50 }
  },
  "inconclusive_counts_as": "retest"
}`;
export const SPEC = parseQcSpec(SPEC_TEXT);

/** A chip with R (Pa·s/m³) and trapped air (m³), CI ± 1 % / ± 5 nL. */
export function chip(chipId: string, r: number, airM3: number, extra: Partial<ChipMeasurement> = {}): ChipMeasurement {
  return {
    chipId,
    quantities: {
      resistance: { value: r, standardError: r * 0.005, ci95: [r * 0.99, r * 1.01] },
      compliance: { value: 3e-14 + airM3 / 101325, standardError: 1e-16, ci95: [2.99e-14 + airM3 / 101325, 3.01e-14 + airM3 / 101325] },
      trapped_air: { value: airM3, standardError: 2.5e-12, ci95: [airM3 - 5e-12, airM3 + 5e-12] },
    },
    fit: { converged: true, r2: 0.999, flags: [] },
    inconclusive: [],
    warnings: ['a <b>warning</b>'],
    ...extra,
  };
}

export function recordInput(m: ChipMeasurement, over: Partial<RecordChipInput> = {}): RecordChipInput {
  return {
    chipId: m.chipId,
    lot: 'L-2026-01',
    operator: 'A. Tester',
    recordedAt: '2026-12-01T10:00:00.000Z',
    specText: SPEC_TEXT,
    specSha256: sha256Hex(SPEC_TEXT),
    specDesign: SPEC.design.name,
    inputs: [{ path: `logs/${m.chipId}.csv`, sha256: sha256Hex(`log of ${m.chipId}`) }],
    softwareVersion: '0.1.0',
    settings: { chipIdFrom: 'filename', analysis: { terms: 'auto' } },
    measurement: m,
    evaluation: evaluateChip(SPEC, m),
    ...over,
  };
}
