/**
 * chart.js plugin drawing the step onsets as vertical lines labelled S1, S2 …; the selected step is
 * drawn thicker. Options under `plugins.lagbenchSteps`.
 */
import type { Chart, Plugin } from 'chart.js';

export interface StepMarkerOptions {
  onsetsS: number[];
  selected: number | null;
  color: string;
  /** Label colour (text on top of the chart). */
  labelColor?: string;
}

declare module 'chart.js' {
  interface PluginOptionsByType<TType> {
    lagbenchSteps?: Partial<StepMarkerOptions> & { _type?: TType };
  }
}

export const stepMarkersPlugin: Plugin = {
  id: 'lagbenchSteps',
  afterDatasetsDraw(chart: Chart, _args, opts: Partial<StepMarkerOptions>) {
    const onsets = opts.onsetsS ?? [];
    const x = chart.scales.x;
    if (!x || onsets.length === 0) return;
    const { ctx, chartArea } = chart;
    ctx.save();
    ctx.font = `600 11px ${getComputedStyle(document.body).fontFamily}`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'top';
    // Dense step lists (hundreds of steps on a long log): thin faint lines, and labels only where they fit.
    const visible = onsets.filter((t) => {
      const px = x.getPixelForValue(t);
      return px >= chartArea.left - 1 && px <= chartArea.right + 1;
    }).length;
    const width = chartArea.right - chartArea.left;
    const dense = visible > width / 12;
    const crowded = visible > width / 3;
    let lastLabelRight = -Infinity;
    onsets.forEach((t, i) => {
      const px = x.getPixelForValue(t);
      if (px < chartArea.left - 1 || px > chartArea.right + 1) return;
      const sel = opts.selected === i;
      ctx.strokeStyle = opts.color ?? '#c06a00';
      ctx.globalAlpha = sel ? 1 : crowded ? 0.12 : dense ? 0.35 : 1;
      ctx.lineWidth = sel ? 3 : dense ? 0.8 : 1.3;
      ctx.setLineDash(sel || dense ? [] : [5, 4]);
      ctx.beginPath();
      ctx.moveTo(px, chartArea.top + 14);
      ctx.lineTo(px, chartArea.bottom);
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.globalAlpha = 1;
      const label = `S${i + 1}`;
      const w = ctx.measureText(label).width + 8;
      if (!sel && px - w / 2 < lastLabelRight + 2) return;
      lastLabelRight = px + w / 2;
      ctx.fillStyle = opts.color ?? '#c06a00';
      ctx.globalAlpha = sel ? 1 : 0.85;
      ctx.fillRect(px - w / 2, chartArea.top, w, 14);
      ctx.globalAlpha = 1;
      ctx.fillStyle = '#ffffff';
      ctx.fillText(label, px, chartArea.top + 1.5);
    });
    ctx.restore();
  },
};

/** Index of the marker within `tolerancePx` of a pixel x, or null. */
export function markerNear(chart: Chart, onsetsS: number[], px: number, tolerancePx = 7): number | null {
  const x = chart.scales.x;
  if (!x) return null;
  let best: number | null = null;
  let bestD = tolerancePx;
  onsetsS.forEach((t, i) => {
    const d = Math.abs(x.getPixelForValue(t) - px);
    if (d <= bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}
