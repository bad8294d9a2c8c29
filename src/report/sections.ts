/** Report fragments shared by the chip and lot reports. */
import type { QcSpec } from '../core/qc/types';
import { escapeHtml } from './escape';
import { displayUnit, isQuantity, type DisplayUnit } from './display';
import type { Traceability } from './types';

/** Display unit of a check: the quantity's unit, or plain numbers for fit checks. */
export function displayFor(check: string, spec: QcSpec | null): DisplayUnit {
  return isQuantity(check) ? displayUnit(check, spec) : { scale: 1, symbol: '' };
}

/** The traceability block: chip, lot, operator, time, spec hash, input files and hashes, version, settings. */
export function traceabilityTable(t: Traceability): string {
  const files = t.inputs.map((f) => `<tr><td class="mono">${escapeHtml(f.path)}</td><td class="mono">${escapeHtml(f.sha256)}</td></tr>`).join('');
  return `<table><tbody>
<tr><th>Chip ID</th><td>${escapeHtml(t.chipId)}</td></tr>
<tr><th>Lot</th><td>${escapeHtml(t.lot ?? '—')}</td></tr>
<tr><th>Operator</th><td>${escapeHtml(t.operator ?? '—')}</td></tr>
<tr><th>Time (UTC)</th><td>${escapeHtml(t.recordedAt)}</td></tr>
<tr><th>Spec</th><td>${escapeHtml(t.specDesign)}<br><span class="mono">SHA-256 ${escapeHtml(t.specSha256)}</span></td></tr>
<tr><th>Software</th><td>Lagbench ${escapeHtml(t.softwareVersion)}</td></tr>
<tr><th>Settings</th><td class="mono">${escapeHtml(JSON.stringify(t.settings))}</td></tr>
<tr><th>Record</th><td>${t.record ? `${escapeHtml(t.record.status === 'recorded' ? 'recorded' : 'already recorded')} as #${t.record.id} in <span class="mono">${escapeHtml(t.record.store)}</span>` : 'not recorded'}</td></tr>
</tbody></table>
<table><thead><tr><th>Input file</th><th>SHA-256</th></tr></thead><tbody>${files}</tbody></table>`;
}
