/** Registers the chart.js parts we use (tree-shaken), the decimation plugin and zoom/pan. */
import {
  BarController, BarElement, CategoryScale, Chart, Decimation, Filler, Legend, LinearScale, LineController, LineElement,
  LogarithmicScale, PointElement, ScatterController, Title, Tooltip,
} from 'chart.js';
import zoomPlugin from 'chartjs-plugin-zoom';
import { stepMarkersPlugin } from './step-markers';
import { errorBarsPlugin } from './error-bars';

let done = false;

export function setupCharts(): void {
  if (done) return;
  Chart.register(
    LineController, LineElement, PointElement, LinearScale, LogarithmicScale, CategoryScale, BarController, BarElement,
    ScatterController, Tooltip, Legend, Title, Filler, Decimation, zoomPlugin, stepMarkersPlugin, errorBarsPlugin,
  );
  Chart.defaults.font.family = getComputedStyle(document.body).fontFamily;
  Chart.defaults.font.size = 12;
  Chart.defaults.animation = false;
  done = true;
}

export { Chart };
