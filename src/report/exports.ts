/** CSV and JSON exports of QC results (chip checks, batch summaries, history). */
import type { QcRecord } from '../core/qc/types';
import { toCsv, type CsvValue } from './csv';
import type { ChipReportInput } from './types';

const CHECK_HEADER = ['chip_id', 'lot', 'check', 'label', 'value', 'ci95_lo', 'ci95_hi', 'lower_limit', 'upper_limit', 'unit', 'verdict', 'reason'];

/** One row per check of one chip (values SI). */
export function chipChecksCsv(input: ChipReportInput): string {
  return toCsv(
    CHECK_HEADER,
    input.evaluation.results.map((r) => [input.trace.chipId, input.trace.lot, r.check, r.label, r.value, r.ci95?.[0], r.ci95?.[1], r.lower, r.upper, r.unit, r.verdict, r.reason]),
  );
}

/** The chip result as JSON (SI units, names with units). */
export function chipReportJson(input: ChipReportInput): string {
  return `${JSON.stringify(
    {
      chip_id: input.trace.chipId,
      verdict: input.evaluation.verdict,
      disposition: input.evaluation.disposition,
      rule: input.evaluation.rule,
      checks: input.evaluation.results,
      quantities_si: input.measurement.quantities,
      fit: input.measurement.fit,
      inconclusive: input.measurement.inconclusive,
      warnings: input.measurement.warnings,
      traceability: input.trace,
      spec: { design: input.spec.design, test: input.spec.test, inconclusive_counts_as: input.spec.inconclusiveCountsAs },
    },
    null,
    2,
  )}\n`;
}

const HISTORY_HEADER = [
  'record_id', 'chip_id', 'lot', 'operator', 'recorded_at_utc', 'verdict', 'disposition',
  'resistance_Pa_s_per_m3', 'resistance_ci95_lo', 'resistance_ci95_hi',
  'compliance_m3_per_Pa', 'compliance_ci95_lo', 'compliance_ci95_hi',
  'trapped_air_m3', 'trapped_air_ci95_lo', 'trapped_air_ci95_hi',
  'tau_s', 't95_s', 'spec_design', 'spec_sha256', 'software_version', 'input_files', 'input_sha256', 'reasons',
];

/** One row per record (values SI). */
export function historyCsv(records: readonly QcRecord[]): string {
  return toCsv(
    HISTORY_HEADER,
    records.map((r): CsvValue[] => {
      const q = r.quantities;
      return [
        r.id, r.chipId, r.lot, r.operator, r.recordedAt, r.verdict, r.disposition,
        q.resistance?.value, q.resistance?.ci95?.[0], q.resistance?.ci95?.[1],
        q.compliance?.value, q.compliance?.ci95?.[0], q.compliance?.ci95?.[1],
        q.trapped_air?.value, q.trapped_air?.ci95?.[0], q.trapped_air?.ci95?.[1],
        q.tau?.value, q.t95?.value, r.specDesign, r.specSha256, r.softwareVersion,
        r.inputs.map((f) => f.path).join(' | '), r.inputs.map((f) => f.sha256).join(' | '),
        r.results.filter((x) => x.verdict !== 'pass').map((x) => x.reason).join(' | '),
      ];
    }),
  );
}
