/**
 * The per-lot QC report: disposition counts, a table of chips, lot statistics with capability
 * (Montgomery §8.3) and Shewhart individuals charts of R and C across lots, as inline SVG.
 */
import { formatNumber } from '../core/qc/format';
import type { ControlCharts } from '../core/qc/lot-summary';
import { QC_QUANTITY_LABEL } from '../core/qc/units';
import { VERDICT_RULE } from '../core/qc/verdict';
import { displayUnit, showValue } from './display';
import { escapeHtml } from './escape';
import { badge, htmlPage } from './html-shell';
import { renderXyChart } from './svg';
import type { LotReportInput } from './types';

function chartSvg(c: ControlCharts, which: 'individuals' | 'lotMeans', lot: string): string {
  const ch = c[which];
  const d = displayUnit(c.quantity, null);
  const y = ch.points.map((p) => p.value / d.scale);
  const highlight = ch.points.flatMap((p, k) => (p.outOfControl ? [k] : []));
  const thisLot = ch.points.flatMap((p, k) => (p.group === lot ? [k] : []));
  const refs = [
    { y: (ch.centre ?? Number.NaN) / d.scale, label: 'centre line', colour: '#1b7f3b' },
    { y: (ch.ucl ?? Number.NaN) / d.scale, label: 'UCL (+3σ)', colour: '#b00020', dashed: true },
    { y: (ch.lcl ?? Number.NaN) / d.scale, label: 'LCL (−3σ)', colour: '#b00020', dashed: true },
  ];
  const title = `${QC_QUANTITY_LABEL[c.quantity]} — ${which === 'individuals' ? 'individuals chart (chips in time order)' : 'lot means across lots'}`;
  return renderXyChart({
    title,
    xLabel: which === 'individuals' ? 'chip (time order)' : 'lot',
    yLabel: d.symbol,
    xCategories: ch.points.map((p) => p.label),
    series: [
      { name: 'all lots', x: ch.points.map((_, k) => k), y, kind: 'points', colour: '#7a9cc6', highlight },
      { name: 'this lot', x: thisLot, y: thisLot.map((k) => y[k] ?? Number.NaN), kind: 'points', colour: '#3b6ea8' },
    ],
    refLines: refs,
  });
}

export function renderLotReportHtml(input: LotReportInput): string {
  const s = input.statistics;
  const body: string[] = [];
  body.push(`<h1>QC lot report — lot ${escapeHtml(input.lot)}</h1>`);
  body.push(`<p class="sub">${escapeHtml(String(input.records.length))} chip(s) (newest record per chip) · generated ${escapeHtml(input.generatedAt)} · Lagbench ${escapeHtml(input.softwareVersion)}</p>`);
  body.push(`<section><p>${(['pass', 'fail', 'retest', 'inconclusive'] as const).map((k) => `${badge(k)} ${s.counts[k]}`).join(' &nbsp; ')}</p></section>`);
  body.push('<h2>Chips</h2>');
  const rDisp = displayUnit('resistance', null);
  const cDisp = displayUnit('compliance', null);
  const aDisp = displayUnit('trapped_air', null);
  const tDisp = displayUnit('tau', null);
  body.push(`<table><thead><tr><th>Chip</th><th>Verdict</th><th>Disposition</th><th>R (${escapeHtml(rDisp.symbol)})</th><th>C (${escapeHtml(cDisp.symbol)})</th><th>Trapped air (${escapeHtml(aDisp.symbol)})</th><th>τ (s)</th><th>t₉₅ (s)</th><th>Operator</th><th>Time (UTC)</th><th>Failed or inconclusive checks</th></tr></thead><tbody>${input.records
    .map((r) => {
      const bad = r.results.filter((x) => x.verdict !== 'pass').map((x) => x.reason);
      return `<tr><td>${escapeHtml(r.chipId)}</td><td>${badge(r.verdict)}</td><td>${badge(r.disposition)}</td><td class="num">${escapeHtml(showValue(r.quantities.resistance?.value, rDisp))}</td><td class="num">${escapeHtml(showValue(r.quantities.compliance?.value, cDisp))}</td><td class="num">${escapeHtml(showValue(r.quantities.trapped_air?.value, aDisp))}</td><td class="num">${escapeHtml(showValue(r.quantities.tau?.value, tDisp))}</td><td class="num">${escapeHtml(showValue(r.quantities.t95?.value, tDisp))}</td><td>${escapeHtml(r.operator ?? '—')}</td><td>${escapeHtml(r.recordedAt)}</td><td>${bad.map((b) => escapeHtml(b)).join('<br>') || '—'}</td></tr>`;
    })
    .join('')}</tbody></table>`);
  body.push(`<p class="rule"><strong>Decision rule.</strong> ${escapeHtml(input.records[0]?.rule ?? VERDICT_RULE)}</p>`);
  body.push('<h2>Lot statistics and capability</h2>');
  body.push(`<table><thead><tr><th>Quantity</th><th>Unit</th><th>n</th><th>Mean</th><th>SD</th><th>Min</th><th>Max</th><th>LSL</th><th>USL</th><th>Cp</th><th>Cpk</th></tr></thead><tbody>${s.quantities
    .map((q) => {
      const d = displayUnit(q.quantity, null);
      const c = q.capability;
      return `<tr><td>${escapeHtml(QC_QUANTITY_LABEL[q.quantity])}</td><td>${escapeHtml(d.symbol)}</td><td class="num">${q.stats.n}</td><td class="num">${escapeHtml(showValue(q.stats.mean, d))}</td><td class="num">${escapeHtml(showValue(q.stats.sd, d))}</td><td class="num">${escapeHtml(showValue(q.stats.min, d))}</td><td class="num">${escapeHtml(showValue(q.stats.max, d))}</td><td class="num">${escapeHtml(showValue(c?.lsl, d))}</td><td class="num">${escapeHtml(showValue(c?.usl, d))}</td><td class="num">${escapeHtml(formatNumber(c?.cp, 3))}</td><td class="num">${escapeHtml(formatNumber(c?.cpk, 3))}</td></tr>`;
    })
    .join('')}</tbody></table>`);
  body.push('<p class="sub">Cp = (USL − LSL)/(6σ), Cpk = min(USL − μ, μ − LSL)/(3σ) with μ, σ the sample mean and SD (Montgomery, <em>Introduction to Statistical Quality Control</em>, 6th ed., §8.3). With few chips these are rough estimates.</p>');
  body.push('<h2 class="page-break">Control charts of R, C and τ across lots</h2>');
  body.push('<p class="sub">Shewhart individuals charts: centre line = mean, limits = mean ± 3σ̂ with σ̂ = average moving range / d₂ (d₂ = 1.128); Shewhart (1931), Montgomery §6.4. Circled points lie outside the limits.</p>');
  for (const c of input.charts) {
    if (c.individuals.points.length === 0) {
      body.push(`<p>${escapeHtml(QC_QUANTITY_LABEL[c.quantity])}: no recorded values to chart.</p>`);
      continue;
    }
    body.push(`<section>${chartSvg(c, 'individuals', input.lot)}${c.lotMeans.points.length > 1 ? chartSvg(c, 'lotMeans', input.lot) : '<p class="sub">One lot only: no chart of lot means yet.</p>'}</section>`);
  }
  body.push('<h2>Traceability</h2>');
  body.push(`<table><thead><tr><th>Chip</th><th>Record</th><th>Spec SHA-256</th><th>Input files (SHA-256)</th><th>Software</th></tr></thead><tbody>${input.records
    .map((r) => `<tr><td>${escapeHtml(r.chipId)}</td><td class="num">#${r.id}</td><td class="mono">${escapeHtml(r.specSha256)}</td><td class="mono">${r.inputs.map((f) => `${escapeHtml(f.path)}<br>${escapeHtml(f.sha256)}`).join('<br>')}</td><td>${escapeHtml(r.softwareVersion)}</td></tr>`)
    .join('')}</tbody></table>`);
  body.push(`<p class="sub">Record store: <span class="mono">${escapeHtml(input.storePath)}</span></p>`);
  return htmlPage(`QC lot ${input.lot}`, body.join('\n'));
}
