/** Display units for QC quantities in reports: the spec's unit when it has a limit, else a readable default. */
import { formatNumber } from '../core/qc/format';
import { QC_QUANTITIES, type MeasuredValue, type QcQuantity, type QcSpec } from '../core/qc/types';
import { QC_UNITS, QC_UNIT_SYMBOL } from '../core/qc/units';

const DEFAULT_UNIT: Record<QcQuantity, string> = {
  resistance: 'Pa_s_per_m3',
  compliance: 'nL_per_kPa',
  excess_compliance: 'nL_per_kPa',
  trapped_air: 'nL',
  tau: 's',
  t95: 's',
};

export interface DisplayUnit {
  /** Value shown = SI value / scale. */
  scale: number;
  symbol: string;
}

export function isQuantity(check: string): check is QcQuantity {
  return (QC_QUANTITIES as readonly string[]).includes(check);
}

export function displayUnit(q: QcQuantity, spec: QcSpec | null): DisplayUnit {
  const limit = spec?.limits.find((l) => l.quantity === q);
  const unit = limit?.unit ?? DEFAULT_UNIT[q];
  return { scale: QC_UNITS[q][unit] ?? 1, symbol: QC_UNIT_SYMBOL[unit] ?? unit };
}

/** `12.3 [11.1, 13.5]` in the display unit (no unit text). */
export function showValue(x: number | null | undefined, d: DisplayUnit): string {
  return x === null || x === undefined ? '—' : formatNumber(x / d.scale);
}

export function showCi(ci: [number, number] | null | undefined, d: DisplayUnit): string {
  return ci ? `[${formatNumber(ci[0] / d.scale)}, ${formatNumber(ci[1] / d.scale)}]` : '—';
}

export function showMeasured(mv: MeasuredValue | undefined | null, d: DisplayUnit): string {
  return mv ? `${showValue(mv.value, d)} ${d.symbol}` : '—';
}
