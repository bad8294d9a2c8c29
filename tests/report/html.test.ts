import { describe, expect, it } from 'vitest';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import { renderChipReportHtml } from '../../src/report/chip-report';
import { escapeHtml } from '../../src/report/escape';
import { renderLotReportHtml } from '../../src/report/lot-report';
import { computeLotStatistics, controlCharts } from '../../src/core/qc/lot-summary';
import type { QcRecord } from '../../src/core/qc/types';
import { HOSTILE, reportInput } from './fixtures';

/**
 * Every way the page could reach the network or run code (a self-contained page has none). Only real
 * tags are inspected: escaped user text cannot contain '<', so it cannot open a tag.
 */
function externalReferences(html: string): string[] {
  const found: string[] = [];
  for (const tag of html.matchAll(/<[a-zA-Z][^>]*>/g)) {
    // Attribute values are quoted and escaped ('"' becomes &quot;), so drop them before looking for attributes.
    const t = tag[0].replace(/"[^"]*"/g, '""');
    if (/^<(script|link|iframe|img|object|embed)\b/i.test(t)) found.push(t);
    for (const m of t.matchAll(/\s(src|href|xlink:href|on\w+)\s*=/gi)) found.push(`${m[1]} in ${t}`);
  }
  for (const re of [/url\(/gi, /@import/gi]) for (const m of html.matchAll(re)) found.push(m[0]);
  // The SVG namespace URI is an identifier, never fetched (W3C Namespaces in XML); any other URL in a tag counts.
  for (const tag of html.matchAll(/<[a-zA-Z][^>]*>/g)) {
    for (const m of tag[0].matchAll(/https?:\/\/[^\s"'<>]+/g)) if (m[0] !== 'http://www.w3.org/2000/svg') found.push(m[0]);
  }
  return found;
}

describe('escapeHtml', () => {
  it('escapeHtml replaces the five HTML-special characters and keeps unicode (OWASP XSS cheat sheet)', () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
    expect(escapeHtml('Ω µ 漢字 😀')).toBe('Ω µ 漢字 😀');
  });
});

describe('renderChipReportHtml', () => {
  it('renderChipReportHtml contains verdict, reasons, rule, plots, breakdown, trapped air, traceability and the safety caution', () => {
    const input = reportInput();
    const html = renderChipReportHtml(input);
    for (const r of input.evaluation.results) expect(html).toContain(escapeHtml(r.reason));
    expect(html).toContain(escapeHtml(input.evaluation.rule));
    expect(html).toContain(escapeHtml(PRESSURE_SAFETY_CAUTION));
    expect(html).toContain('Residuals (measured − fit)');
    expect(html).toContain('<polyline');
    expect(html).toContain('Compliance breakdown');
    expect(html).toContain('Estimated trapped-air volume 8 nL'); // fixture 8e-12 m³ = 8 nL (1 nL = 1e-12 m³); wording ours
    expect(html).toContain('a'.repeat(64));
    expect(html).toContain('b'.repeat(64));
    expect(html).toContain('@media print');
    expect(html).toContain('page-break');
  });

  it('renderChipReportHtml is self-contained: no scripts, links, external URLs or event handlers', () => {
    expect(externalReferences(renderChipReportHtml(reportInput()))).toEqual([]);
  });

  it('renderChipReportHtml(hostile chip ID, operator, file name, warning, spec texts) escapes every one', () => {
    const input = reportInput(HOSTILE, HOSTILE);
    input.trace.inputs = [{ path: `${HOSTILE}.csv`, sha256: 'c'.repeat(64) }];
    input.trace.lot = HOSTILE;
    input.measurement.warnings = [HOSTILE];
    input.spec = { ...input.spec, design: { ...input.spec.design, name: HOSTILE }, test: { ...input.spec.test, setup: HOSTILE } };
    input.steps[0]!.title = HOSTILE;
    input.breakdown!.parts[0]!.label = HOSTILE;
    const html = renderChipReportHtml(input);
    expect(html).not.toContain('<script>');
    expect(html).not.toContain('<img');
    expect(html.match(/<\/style>/g)).toHaveLength(1); // only the page's own style element closes
    expect(externalReferences(html)).toEqual([]);
    expect(html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;&lt;/style&gt;&#39;&quot;&amp;&lt;img src=x onerror=alert(1)&gt;Ω µ 漢字 😀');
  });
});

describe('renderLotReportHtml', () => {
  it('renderLotReportHtml shows counts, capability, both control charts with limits, escaped chip IDs', () => {
    const base = reportInput();
    const records: QcRecord[] = [1.9e13, 2.0e13, 2.1e13, 2.05e13].map((r, k) => ({
      id: k + 1, chipId: k === 3 ? HOSTILE : `M2-00${k}`, lot: k < 2 ? 'L0' : 'L1', operator: 'op', recordedAt: `2026-12-01T10:0${k}:00.000Z`,
      specSha256: 'a'.repeat(64), specDesign: 'M2', softwareVersion: '0.1.0', settings: {}, inputs: [{ path: 'x.csv', sha256: 'b'.repeat(64) }],
      verdict: 'pass', disposition: 'pass', rule: base.evaluation.rule,
      results: base.evaluation.results.map((x) => (x.check === 'resistance' ? { ...x, value: r } : x)),
      quantities: { resistance: { value: r, standardError: 1e11, ci95: [r - 2e11, r + 2e11] }, compliance: { value: 1.3e-13 + k * 1e-15, standardError: null, ci95: null } },
    }));
    const html = renderLotReportHtml({
      lot: 'L1', records, statistics: computeLotStatistics('L1', records),
      charts: [controlCharts(records, 'resistance'), controlCharts(records, 'compliance'), controlCharts(records, 'tau')],
      generatedAt: '2026-12-01T12:00:00.000Z', softwareVersion: '0.1.0', storePath: 'records.sqlite',
    });
    // Headings are our own wording; 3σ limits are the Shewhart convention (Montgomery, SQC, ch. 6 — from memory).
    expect(html).toContain('UCL (+3σ)');
    expect(html).toContain('Hydraulic resistance R — individuals chart');
    expect(html).toContain('Compliance C — lot means across lots');
    expect(html).toContain('Cpk');
    expect(html).toContain('Time constant τ: no recorded values to chart.');
    expect(html).not.toContain('<script>');
    expect(externalReferences(html)).toEqual([]);
    expect(html).toContain(escapeHtml(PRESSURE_SAFETY_CAUTION));
  });
});

describe('chart ticks', () => {
  it('niceTicks uses 1-2-5 steps and tickDigits keeps neighbouring labels distinct (common practice, no source)', async () => {
    const { niceTicks, tickDigits } = await import('../../src/report/svg');
    const { formatNumber } = await import('../../src/core/qc/format');
    expect(niceTicks(0, 10)).toEqual([0, 2, 4, 6, 8, 10]);
    const t = niceTicks(2.9866e13, 2.9912e13);
    const labels = t.map((x) => formatNumber(x, tickDigits(t)));
    expect(new Set(labels).size).toBe(labels.length);
  });
});
