/**
 * A chip report input with known values and hostile user strings (test helper). All numbers are invented
 * test inputs (no reference values); 111325 Pa = 101325 Pa (standard atmosphere) + 100 mbar gauge.
 */
import { parseQcSpec } from '../../src/core/qc/spec';
import type { ChipMeasurement } from '../../src/core/qc/types';
import { evaluateChip } from '../../src/core/qc/verdict';
import type { ChipReportInput } from '../../src/report/types';

export const HOSTILE = `<script>alert("x")</script></style>'"&<img src=x onerror=alert(1)>Ω µ 漢字 😀`;

export function reportInput(chipId = 'M2-001', operator = 'A. Tester'): ChipReportInput {
  const spec = parseQcSpec(`{
    "lagbench_qc_spec": 1,
    "design": { "name": "PDMS mixer M2", "revision": "B" },
    "test": { "setup": "bench 1", "program": "0-100-0 mbar" },
    "limits": {
      "resistance": { "unit": "Pa_s_per_m3", "nominal": 2.0e13, "tolerance_percent": 10 },
      "trapped_air": { "unit": "nL", "max": 50 }
    }
  }`);
  const m: ChipMeasurement = {
    chipId,
    quantities: {
      resistance: { value: 2.0e13, standardError: 1e11, ci95: [1.98e13, 2.02e13] },
      compliance: { value: 1.3e-13, standardError: 1e-15, ci95: [1.28e-13, 1.32e-13] },
      trapped_air: { value: 8e-12, standardError: 1e-12, ci95: [6e-12, 10e-12] },
    },
    fit: { converged: true, r2: 0.999, flags: [] },
    inconclusive: [],
    warnings: [],
  };
  const tS = Array.from({ length: 50 }, (_, k) => k * 0.2);
  const fitY = tS.map((t) => 1e-9 * (1 - Math.exp(-t / 2)));
  return {
    spec,
    measurement: m,
    evaluation: evaluateChip(spec, m),
    trace: {
      chipId, lot: 'L1', operator, recordedAt: '2026-12-01T10:00:00.000Z', specDesign: spec.design.name,
      specSha256: 'a'.repeat(64), inputs: [{ path: `logs/${chipId}.csv`, sha256: 'b'.repeat(64) }], softwareVersion: '0.1.0',
      settings: { chipIdFrom: 'filename' }, record: { status: 'recorded', id: 1, store: 'records.sqlite' },
    },
    steps: [{ title: 'Step 1: 0 → 100 mbar', tS, y: fitY.map((v, k) => v + (k % 2 ? 2e-12 : -2e-12)), fitY, yUnit: 'm3_per_s', displayScale: 1e-9 / 60, displayUnit: 'µL/min', tauS: { value: 2, standardError: 0.01, ci95: [1.98, 2.02] } }],
    breakdown: { parts: [{ label: 'tubing', complianceM3PerPa: 1e-13 }, { label: 'chip walls', complianceM3PerPa: 2e-14 }], nominalTotalM3PerPa: 1.2e-13, fitted: m.quantities.compliance ?? null },
    trappedAir: { volumeM3: m.quantities.trapped_air!, absolutePressurePa: 111325, note: null },
  };
}
