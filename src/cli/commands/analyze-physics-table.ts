/**
 * Human output of the physics stage of `lagbench analyze`: R and C per step with 95 % CIs in the
 * trade's units, the node pressure, the nominal comparison and the trapped-air verdict. It is
 * inserted into the analyze table just before the pressure-safety caution (added if missing).
 */
import type { AnalysisWithPhysicsJson } from '../../core/analyze/physics';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { TRADE_UNITS, formatNumber, type DisplayUnit } from '../../core/units/display';

function show(valueSi: number | null | undefined, unit: DisplayUnit, digits = 3): string {
  return typeof valueSi === 'number' ? formatNumber(valueSi * unit.perSi, digits) : '—';
}

function withCi(value: number | null, ci95: [number | null, number | null], unit: DisplayUnit): string {
  if (value === null) return '—';
  return `${show(value, unit)} (${show(ci95[0], unit)}–${show(ci95[1], unit)})`;
}

function pad(rows: string[][]): string {
  const widths = rows[0]?.map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length))) ?? [];
  return rows.map((r) => r.map((cell, c) => cell.padEnd(widths[c] ?? 0)).join('  ').trimEnd()).join('\n');
}

/** The physics section (without the caution). */
export function renderPhysicsSection(a: AnalysisWithPhysicsJson): string {
  const u = TRADE_UNITS;
  const rows: string[][] = [
    ['step', `R [${u.resistance.symbol}] (95 % CI)`, `C [${u.compliance.symbol}] (95 % CI)`, `p_abs [${u.pressure.symbol}]`, 'circuit'],
  ];
  for (const s of a.steps) {
    const inconclusive =
      s.physics.non_physical === true
        ? ' (non-physical: model does not fit)'
        : s.physics.compliance_inconclusive === true || s.physics.resistance_inconclusive === true
          ? ' (inconclusive)'
          : '';
    rows.push([
      String(s.index),
      withCi(s.resistance_Pa_s_per_m3, s.resistance_ci95, u.resistance),
      withCi(s.compliance_m3_per_Pa, s.compliance_ci95, u.compliance),
      show(s.pressure_abs_Pa, u.pressure, 4),
      `${String(s.physics.circuit ?? '—')}${inconclusive}`,
    ]);
  }
  const lines = ['', 'Circuit (R = resistance, C = compliance; docs/setups.md):', pad(rows)];
  if (a.nominal) {
    type Range = { nominal?: number } | undefined;
    const n = a.nominal as Record<string, Range>;
    // what the step measures: flow-driven R = chip + downstream; pressure-driven R_total (docs/setups.md)
    const r = (a.setup === 'flow-driven' ? n.resistance_downstream_Pa_s_per_m3 : n.resistance_Pa_s_per_m3)?.nominal;
    const c = n.compliance_m3_per_Pa?.nominal;
    lines.push(`Nominal from the chip description: R ${show(r, u.resistance)} ${u.resistance.symbol}, C ${show(c, u.compliance)} ${u.compliance.symbol}.`);
  }
  if (a.trapped_air) {
    lines.push(`Trapped air (${a.trapped_air.method}): ${a.trapped_air.statement}`);
  }
  if (a.compliance_trend) lines.push(a.compliance_trend.statement);
  return lines.join('\n');
}

/** Inserts the physics section before the trailing safety caution of the analyze table. */
export function withPhysicsSection(table: string, a: AnalysisWithPhysicsJson): string {
  const section = renderPhysicsSection(a);
  const at = table.lastIndexOf(PRESSURE_SAFETY_CAUTION);
  if (at >= 0) return `${table.slice(0, at).replace(/\n+$/, '')}\n${section}\n\n${table.slice(at)}`;
  return `${table.replace(/\n+$/, '')}\n${section}\n\n${PRESSURE_SAFETY_CAUTION}\n`;
}
