/**
 * chart.js plugin drawing vertical 95 % CI bars for scatter points. A dataset opts in with
 * `errorBars: Array<[lo, hi] | null>` (same order as its data).
 */
import type { Chart, Plugin } from 'chart.js';

export const errorBarsPlugin: Plugin = {
  id: 'lagbenchErrorBars',
  afterDatasetsDraw(chart: Chart) {
    const { ctx } = chart;
    const y = chart.scales.y;
    if (!y) return;
    chart.data.datasets.forEach((ds, di) => {
      const bars = (ds as unknown as { errorBars?: Array<[number, number] | null> }).errorBars;
      if (!bars) return;
      const meta = chart.getDatasetMeta(di);
      if (meta.hidden) return;
      ctx.save();
      ctx.strokeStyle = String(ds.borderColor ?? '#333');
      ctx.lineWidth = 1.5;
      meta.data.forEach((pt, i) => {
        const b = bars[i];
        if (!b) return;
        const top = y.getPixelForValue(b[1]);
        const bottom = y.getPixelForValue(b[0]);
        ctx.beginPath();
        ctx.moveTo(pt.x, top);
        ctx.lineTo(pt.x, bottom);
        ctx.moveTo(pt.x - 4, top);
        ctx.lineTo(pt.x + 4, top);
        ctx.moveTo(pt.x - 4, bottom);
        ctx.lineTo(pt.x + 4, bottom);
        ctx.stroke();
      });
      ctx.restore();
    });
  },
};
