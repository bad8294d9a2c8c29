/**
 * Human output of `lagbench analyze`: a table per log in the trade's units (mbar, µL/min, s),
 * τ with its 95 % confidence interval, then warnings and, when pressures are shown, the safety caution.
 */
import type { AnalysisJson, StepJson } from '../../core/analyze/types';
import type { Quantity } from '../../core/recording/types';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { TRADE_UNITS, formatNumber, type DisplayUnit } from '../../core/units/display';

/** Display unit of a quantity in the trade's units (flow µL/min, pressure mbar). */
export function tradeUnitOf(quantity: Quantity): DisplayUnit | null {
  if (quantity === 'flow' || quantity === 'flow_setpoint') return TRADE_UNITS.flow;
  if (quantity === 'pressure' || quantity === 'pressure_setpoint' || quantity === 'hydrostatic_head') return TRADE_UNITS.pressure;
  return null;
}

function show(valueSi: number | null, unit: DisplayUnit | null, digits = 4): string {
  if (valueSi === null) return '—';
  return formatNumber(unit ? valueSi * unit.perSi : valueSi, digits);
}

function tauText(step: StepJson): string {
  if (step.terms.length === 0) return '—';
  return step.terms
    .map((t) => `${show(t.tau_s, null)} (${show(t.tau_ci95_s[0], null)}–${show(t.tau_ci95_s[1], null)})`)
    .join('; ');
}

function pad(cells: string[][]): string {
  const widths = cells[0]?.map((_, c) => Math.max(...cells.map((r) => (r[c] ?? '').length))) ?? [];
  return cells.map((r) => r.map((cell, c) => cell.padEnd(widths[c] ?? 0)).join('  ').trimEnd()).join('\n');
}

/** The readable report of one analysis. */
export function renderAnalysisTable(a: AnalysisJson): string {
  const driveUnit = tradeUnitOf(a.detection.quantity);
  const first = a.steps[0];
  const responseQuantity: Quantity = first?.response.quantity ?? (a.setup === 'flow-driven' ? 'pressure' : 'flow');
  const responseUnit = tradeUnitOf(responseQuantity);
  const lines: string[] = [];
  lines.push(`Log: ${a.files.join(', ')}`);
  lines.push(`Setup: ${a.setup} (${a.setup_reason})`);
  const where = a.detection.origin === 'user' ? 'from the step list' : `on ${a.detection.channel} (${a.detection.origin})`;
  lines.push(`Steps: ${a.steps.length} ${where}${a.ramps.length > 0 ? `; ${a.ramps.length} ramp(s) not analysed` : ''}`);
  if (first) {
    lines.push(
      `Response: ${first.response.channel} (${first.response.quantity}), noise σ ${show(a.noise_sigma.response, responseUnit, 3)} ${responseUnit?.symbol ?? a.noise_sigma.response_unit}`,
    );
  }
  if (a.steps.length > 0) {
    const dUnit = driveUnit?.symbol ?? a.detection.unit;
    const rUnit = responseUnit?.symbol ?? '';
    const rows: string[][] = [
      ['#', 'start [s]', `drive [${dUnit}]`, 'dir', 'τ [s] (95 % CI)', 'y∞ [' + rUnit + ']', 'settled', 'R²', 'fit'],
    ];
    for (const s of a.steps) {
      const fitState = !s.fit ? 'no fit' : s.inconclusive ? 'INCONCLUSIVE' : s.fit.flags.length > 0 ? s.fit.flags.map((f) => f.code).join(',') : 'ok';
      rows.push([
        String(s.index),
        formatNumber(s.start_s, 6),
        `${show(s.drive.before, driveUnit)} → ${show(s.drive.after, driveUnit)}`,
        s.direction,
        tauText(s),
        show(s.y_inf, responseUnit),
        s.settled === null ? '—' : s.settled ? 'yes' : 'no',
        s.fit?.r2 === null || s.fit?.r2 === undefined ? '—' : s.fit.r2.toFixed(4),
        fitState,
      ]);
    }
    lines.push('', pad(rows));
  }
  if (a.shared_fits.length > 0) {
    lines.push('', 'Shared-τ fits (steps with the same direction and levels):');
    for (const g of a.shared_fits) {
      const taus = g.terms.map((t) => `${show(t.tau_s, null)} s (${show(t.tau_ci95_s[0], null)}–${show(t.tau_ci95_s[1], null)})`).join('; ');
      lines.push(`  steps ${g.step_indices.join(', ')} (${g.direction}): τ ${taus}${g.converged ? '' : ' — not converged'}`);
    }
  }
  if (a.warnings.length > 0 || a.steps.some((s) => s.warnings.length > 0)) {
    lines.push('', 'Warnings:');
    for (const w of a.warnings) lines.push(`  - ${w.message}`);
    for (const s of a.steps) for (const w of s.warnings) lines.push(`  - ${w.message}`);
  }
  const showsPressure = tradeUnitOf(a.detection.quantity) === TRADE_UNITS.pressure || responseUnit === TRADE_UNITS.pressure;
  if (showsPressure) lines.push('', PRESSURE_SAFETY_CAUTION);
  return `${lines.join('\n')}\n`;
}
