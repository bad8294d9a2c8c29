/**
 * Small inline-SVG charts drawn from data (no chart library, no external resources):
 * an x–y chart with points, lines and horizontal reference lines, and a horizontal bar chart.
 * All text passes through escapeHtml.
 */
import { formatNumber } from '../core/qc/format';
import { escapeHtml } from './escape';

export interface Series {
  name: string;
  x: readonly number[];
  y: readonly number[];
  kind: 'points' | 'line';
  /** CSS colour. */
  colour: string;
  /** Indices to mark specially (e.g. out-of-control points). */
  highlight?: readonly number[];
}

export interface RefLine {
  y: number;
  label: string;
  colour: string;
  dashed?: boolean;
}

export interface XyChart {
  title: string;
  xLabel: string;
  yLabel: string;
  series: Series[];
  refLines?: RefLine[];
  /** Category labels for integer x positions (control charts). */
  xCategories?: readonly string[];
  width?: number;
  height?: number;
}

/** "Nice" tick values covering [lo, hi] (1-2-5 steps, common practice, no source). */
export function niceTicks(lo: number, hi: number, target = 5): number[] {
  if (!(Number.isFinite(lo) && Number.isFinite(hi))) return [];
  if (lo === hi) {
    const d = Math.abs(lo) * 0.1 || 1;
    lo -= d;
    hi += d;
  }
  const raw = (hi - lo) / target;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = ([1, 2, 5, 10].map((f) => f * mag).find((s) => s >= raw) ?? 10 * mag);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

const n2 = (x: number): string => x.toFixed(1);

/** Significant digits that keep neighbouring tick labels distinct (at least 3). */
export function tickDigits(ticks: readonly number[]): number {
  if (ticks.length < 2) return 3;
  const step = Math.abs((ticks[1] as number) - (ticks[0] as number));
  const big = Math.max(...ticks.map((t) => Math.abs(t)));
  if (!(step > 0) || !(big > 0)) return 3;
  return Math.min(12, Math.max(3, Math.floor(Math.log10(big)) - Math.floor(Math.log10(step)) + 1));
}

/** Renders an x–y chart as an inline `<svg>` element. */
export function renderXyChart(c: XyChart): string {
  const W = c.width ?? 640;
  const H = c.height ?? 300;
  const m = { l: 72, r: 16, t: 28, b: 46 };
  const xs = c.series.flatMap((s) => s.x.filter(Number.isFinite));
  const ys = [...c.series.flatMap((s) => s.y.filter(Number.isFinite)), ...(c.refLines ?? []).map((r) => r.y).filter(Number.isFinite)];
  const head = `<svg xmlns="http://www.w3.org/2000/svg" class="chart" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${escapeHtml(c.title)}">`;
  const title = `<text x="${W / 2}" y="16" text-anchor="middle" class="chart-title">${escapeHtml(c.title)}</text>`;
  if (xs.length === 0 || ys.length === 0) {
    return `${head}${title}<text x="${W / 2}" y="${H / 2}" text-anchor="middle">no data</text></svg>`;
  }
  let [x0, x1] = [Math.min(...xs), Math.max(...xs)];
  // Categories sit at integer positions: half a slot of room on each side keeps the end points visible.
  if (c.xCategories) [x0, x1] = [-0.5, Math.max(x1, c.xCategories.length - 1) + 0.5];
  let [y0, y1] = [Math.min(...ys), Math.max(...ys)];
  if (x0 === x1) [x0, x1] = [x0 - 1, x1 + 1];
  if (y0 === y1) [y0, y1] = [y0 - (Math.abs(y0) * 0.1 || 1), y1 + (Math.abs(y1) * 0.1 || 1)];
  const pad = (y1 - y0) * 0.05;
  y0 -= pad;
  y1 += pad;
  const px = (x: number): number => m.l + ((x - x0) / (x1 - x0)) * (W - m.l - m.r);
  const py = (y: number): number => H - m.b - ((y - y0) / (y1 - y0)) * (H - m.t - m.b);
  const parts: string[] = [head, title];
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${W - m.l - m.r}" height="${H - m.t - m.b}" class="plot-area"/>`);
  const yTicks = niceTicks(y0, y1);
  const yDigits = tickDigits(yTicks);
  for (const t of yTicks) {
    parts.push(`<line x1="${m.l}" x2="${W - m.r}" y1="${n2(py(t))}" y2="${n2(py(t))}" class="grid"/>`);
    parts.push(`<text x="${m.l - 4}" y="${n2(py(t) + 4)}" text-anchor="end" class="tick">${escapeHtml(formatNumber(t, yDigits))}</text>`);
  }
  if (c.xCategories) {
    const every = Math.max(1, Math.ceil(c.xCategories.length / 12));
    c.xCategories.forEach((label, k) => {
      if (k % every !== 0) return;
      parts.push(`<text x="${n2(px(k))}" y="${H - m.b + 14}" text-anchor="middle" class="tick">${escapeHtml(label)}</text>`);
    });
  } else {
    for (const t of niceTicks(x0, x1)) {
      parts.push(`<line x1="${n2(px(t))}" x2="${n2(px(t))}" y1="${m.t}" y2="${H - m.b}" class="grid"/>`);
      parts.push(`<text x="${n2(px(t))}" y="${H - m.b + 14}" text-anchor="middle" class="tick">${escapeHtml(formatNumber(t, 3))}</text>`);
    }
  }
  parts.push(`<text x="${(m.l + W - m.r) / 2}" y="${H - 8}" text-anchor="middle" class="axis-label">${escapeHtml(c.xLabel)}</text>`);
  parts.push(`<text transform="translate(14 ${(m.t + H - m.b) / 2}) rotate(-90)" text-anchor="middle" class="axis-label">${escapeHtml(c.yLabel)}</text>`);
  for (const r of c.refLines ?? []) {
    if (!Number.isFinite(r.y)) continue;
    parts.push(`<line x1="${m.l}" x2="${W - m.r}" y1="${n2(py(r.y))}" y2="${n2(py(r.y))}" stroke="${escapeHtml(r.colour)}" stroke-width="1.2"${r.dashed ? ' stroke-dasharray="6 4"' : ''}/>`);
    parts.push(`<text x="${W - m.r - 2}" y="${n2(py(r.y) - 3)}" text-anchor="end" class="ref-label" fill="${escapeHtml(r.colour)}">${escapeHtml(r.label)}</text>`);
  }
  for (const s of c.series) {
    const pts: [number, number][] = [];
    for (let k = 0; k < Math.min(s.x.length, s.y.length); k++) {
      const x = s.x[k] as number;
      const y = s.y[k] as number;
      if (Number.isFinite(x) && Number.isFinite(y)) pts.push([px(x), py(y)]);
    }
    if (s.kind === 'line' && pts.length > 1) {
      parts.push(`<polyline fill="none" stroke="${escapeHtml(s.colour)}" stroke-width="1.6" points="${pts.map(([a, b]) => `${n2(a)},${n2(b)}`).join(' ')}"/>`);
    } else {
      const r = pts.length > 400 ? 1.2 : pts.length > 60 ? 2.2 : 3.5;
      parts.push(`<g fill="${escapeHtml(s.colour)}">${pts.map(([a, b]) => `<circle cx="${n2(a)}" cy="${n2(b)}" r="${r}"/>`).join('')}</g>`);
    }
    for (const k of s.highlight ?? []) {
      const x = s.x[k];
      const y = s.y[k];
      if (x === undefined || y === undefined || !Number.isFinite(x) || !Number.isFinite(y)) continue;
      parts.push(`<circle cx="${n2(px(x))}" cy="${n2(py(y))}" r="5" fill="none" stroke="#b00020" stroke-width="2" class="highlight"/>`);
    }
  }
  // Legend.
  let lx = m.l + 4;
  for (const s of c.series) {
    parts.push(`<rect x="${lx}" y="${m.t + 4}" width="10" height="10" fill="${escapeHtml(s.colour)}"/><text x="${lx + 14}" y="${m.t + 13}" class="legend">${escapeHtml(s.name)}</text>`);
    lx += 24 + s.name.length * 6.5;
  }
  parts.push('</svg>');
  return parts.join('');
}

/** A horizontal bar chart of non-negative values with readable labels. */
export function renderBarChart(title: string, bars: readonly { label: string; value: number; colour: string }[], unitLabel: string, scale = 1): string {
  const W = 640;
  const rowH = 24;
  const H = 36 + rowH * bars.length + 10;
  const left = 230;
  const max = Math.max(...bars.map((b) => (Number.isFinite(b.value) ? Math.abs(b.value) : 0)), 0) || 1;
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="chart" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${escapeHtml(title)}">`,
    `<text x="${W / 2}" y="16" text-anchor="middle" class="chart-title">${escapeHtml(title)}</text>`,
  ];
  bars.forEach((b, k) => {
    const y = 30 + k * rowH;
    const w = Number.isFinite(b.value) ? (Math.abs(b.value) / max) * (W - left - 110) : 0;
    parts.push(`<text x="${left - 6}" y="${y + 15}" text-anchor="end" class="tick">${escapeHtml(b.label)}</text>`);
    parts.push(`<rect x="${left}" y="${y + 3}" width="${n2(w)}" height="${rowH - 8}" fill="${escapeHtml(b.colour)}"/>`);
    parts.push(`<text x="${n2(left + w + 6)}" y="${y + 15}" class="tick">${escapeHtml(formatNumber(b.value / scale, 3))} ${escapeHtml(unitLabel)}</text>`);
  });
  parts.push('</svg>');
  return parts.join('');
}
