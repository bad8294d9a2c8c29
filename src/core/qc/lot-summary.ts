/**
 * Lot statistics from stored records: verdict counts, and per quantity the mean, SD, n and
 * capability against the limits the records were judged by (lot-stats.ts, Montgomery §8.3).
 * Control-chart data of R and C across lots (control-chart.ts, Shewhart individuals chart).
 */
import { individualsChart, lotMeans, type IndividualsChart } from './control-chart';
import { capability, summarize, type Capability, type SummaryStats } from './lot-stats';
import { QC_QUANTITIES, type Disposition, type QcQuantity, type QcRecord } from './types';
import { QC_SI_UNIT } from './units';

export interface QuantityStatistics {
  quantity: QcQuantity;
  unit: string;
  stats: SummaryStats;
  /** Against the limits found in the records' results (null when no record had a limit). */
  capability: Capability | null;
}

export interface LotStatistics {
  lot: string | null;
  records: number;
  counts: Record<Disposition, number>;
  quantities: QuantityStatistics[];
}

/** Statistics of one lot's records (pass the records of that lot; for re-tests pass the latest per chip). */
export function computeLotStatistics(lot: string | null, records: readonly QcRecord[]): LotStatistics {
  const counts: Record<Disposition, number> = { pass: 0, fail: 0, retest: 0, inconclusive: 0 };
  for (const r of records) counts[r.disposition]++;
  const quantities: QuantityStatistics[] = [];
  for (const q of QC_QUANTITIES) {
    const values = records.map((r) => r.quantities[q]?.value).filter((v): v is number => v !== undefined && Number.isFinite(v));
    if (values.length === 0) continue;
    const stats = summarize(values);
    const limited = records.flatMap((r) => r.results.filter((x) => x.check === q));
    const lim = limited[0];
    quantities.push({ quantity: q, unit: QC_SI_UNIT[q], stats, capability: lim ? capability(stats, lim.lower, lim.upper) : null });
  }
  return { lot, records: records.length, counts, quantities };
}

/** Keeps the newest record per chip ID (a re-test supersedes earlier records for statistics). */
export function latestPerChip(records: readonly QcRecord[]): QcRecord[] {
  const byChip = new Map<string, QcRecord>();
  for (const r of records) {
    const prev = byChip.get(r.chipId);
    if (!prev || r.recordedAt > prev.recordedAt || (r.recordedAt === prev.recordedAt && r.id > prev.id)) byChip.set(r.chipId, r);
  }
  return [...byChip.values()].sort((a, b) => (a.recordedAt < b.recordedAt ? -1 : a.recordedAt > b.recordedAt ? 1 : a.id - b.id));
}

export interface ControlCharts {
  quantity: QcQuantity;
  unit: string;
  /** Chips in time order across lots (individuals chart). */
  individuals: IndividualsChart;
  /** Lot means across lots (X̄ values charted as individuals). */
  lotMeans: IndividualsChart;
}

/** Control-chart data of one quantity over records in time order (grouped by lot). */
export function controlCharts(records: readonly QcRecord[], quantity: QcQuantity): ControlCharts {
  const sorted = [...records].sort((a, b) => (a.recordedAt < b.recordedAt ? -1 : a.recordedAt > b.recordedAt ? 1 : a.id - b.id));
  const pts = sorted
    .map((r) => ({ label: r.chipId, group: r.lot ?? '(no lot)', value: r.quantities[quantity]?.value ?? Number.NaN }))
    .filter((p) => Number.isFinite(p.value));
  return { quantity, unit: QC_SI_UNIT[quantity], individuals: individualsChart(pts), lotMeans: individualsChart(lotMeans(pts)) };
}
