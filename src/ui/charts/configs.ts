/**
 * chart.js configurations for each plot, built from view models and a palette, so the same plot is
 * drawn on screen (page colours) and for the report (light palette, fixed size).
 */
import type { ChartConfiguration, ChartDataset, ScaleOptionsByType } from 'chart.js';
import type { ChannelInfo, SeriesSet, StepFitView, AnalysisView, FingerprintView } from '../worker/protocol';
import { COMPLIANCE_UNIT, displayUnitOf, isFlowQuantity, isPressureQuantity, QUANTITY_LABEL } from '../helpers/format';
import type { ChartColors } from './theme';
import { withAlpha } from './theme';

type XY = { x: number; y: number };

function axis(title: string, c: ChartColors, extra: Partial<ScaleOptionsByType<'linear'>> = {}): Partial<ScaleOptionsByType<'linear'>> {
  return {
    type: 'linear',
    title: { display: true, text: title, color: c.ink, font: { weight: 'bold' } },
    ticks: { color: c.muted, maxTicksLimit: 9 },
    grid: { color: withAlpha(c.grid.startsWith('#') ? c.grid : '#dfe5e2', 0.9) },
    border: { color: c.grid },
    ...extra,
  } as Partial<ScaleOptionsByType<'linear'>>;
}

function legend(c: ChartColors) {
  return { display: true, position: 'top' as const, align: 'end' as const, labels: { color: c.ink, boxWidth: 14, boxHeight: 2, padding: 10 } };
}

const CHANNEL_DASH: Record<string, number[]> = { pressure_setpoint: [6, 4], flow_setpoint: [6, 4] };

/** The whole recording: pressure channels on the left axis (mbar), flow channels on the right (µL/min). */
export function recordingConfig(series: SeriesSet, channels: ChannelInfo[], onsetsS: number[], selected: number | null, c: ChartColors, interactive: boolean): ChartConfiguration<'line', XY[]> {
  const palette = [c.data, c.data2, c.accent, c.warn];
  const datasets: Array<ChartDataset<'line', XY[]>> = [];
  let hasP = false;
  let hasQ = false;
  series.channels.forEach((s, i) => {
    const info = channels.find((ch) => ch.name === s.name);
    if (!info) return;
    const unit = displayUnitOf(info.quantity);
    const isP = isPressureQuantity(info.quantity);
    const isQ = isFlowQuantity(info.quantity);
    if (!isP && !isQ) return;
    hasP ||= isP;
    hasQ ||= isQ;
    const data: XY[] = new Array(series.tS.length);
    for (let k = 0; k < series.tS.length; k++) data[k] = { x: series.tS[k] as number, y: (s.y[k] as number) * unit.fromSi };
    datasets.push({
      label: `${QUANTITY_LABEL[info.quantity]} (${unit.label}) — ${info.originalHeader}`,
      data,
      yAxisID: isP ? 'yP' : 'yQ',
      borderColor: palette[i % palette.length],
      backgroundColor: palette[i % palette.length],
      borderWidth: 1.4,
      borderDash: CHANNEL_DASH[info.quantity] ?? [],
      pointRadius: 0,
      indexAxis: 'x',
    });
  });
  const zoom = interactive
    ? {
        zoom: { wheel: { enabled: true }, pinch: { enabled: true }, drag: { enabled: true, modifierKey: 'ctrl' as const, backgroundColor: withAlpha('#0d7466', 0.12) }, mode: 'x' as const },
        pan: { enabled: true, mode: 'x' as const, modifierKey: 'shift' as const },
        limits: { x: { min: 'original' as const, max: 'original' as const } },
      }
    : undefined;
  return {
    type: 'line',
    data: { datasets },
    options: {
      parsing: false,
      normalized: true,
      animation: false,
      responsive: interactive,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: axis('Time (s)', c),
        ...(hasP ? { yP: axis('Pressure (mbar)', c, { position: 'left' }) } : {}),
        ...(hasQ ? { yQ: axis('Flow (µL/min)', c, { position: 'right', grid: { drawOnChartArea: !hasP } }) } : {}),
      },
      plugins: {
        legend: legend(c),
        decimation: { enabled: true, algorithm: 'min-max' },
        tooltip: { enabled: interactive },
        lagbenchSteps: { onsetsS, selected, color: c.step },
        ...(zoom ? { zoom } : {}),
      },
    },
  };
}

/** One step: data and the fitted curve (time since onset). */
export function fitConfig(fv: StepFitView, c: ChartColors, interactive: boolean): ChartConfiguration<'line', XY[]> {
  const unit = displayUnitOf(fv.responseQuantity);
  const pts = (ys: Float64Array): XY[] => Array.from(fv.tS, (t, i) => ({ x: t, y: (ys[i] as number) * unit.fromSi }));
  const datasets: Array<ChartDataset<'line', XY[]>> = [
    { label: 'Data', data: pts(fv.y), borderColor: withAlpha(c.data, 0.9), backgroundColor: withAlpha(c.data, 0.5), borderWidth: 0, pointRadius: 1.6, showLine: false },
  ];
  if (fv.fitY.length) datasets.push({ label: `Fit (${fv.fit?.model.terms ?? 0}-term exponential)`, data: pts(fv.fitY), borderColor: c.fit, backgroundColor: c.fit, borderWidth: 2.2, pointRadius: 0 });
  return {
    type: 'line',
    data: { datasets },
    options: {
      parsing: false, animation: false, responsive: interactive, maintainAspectRatio: false,
      scales: { x: axis('Time since step onset (s)', c), y: axis(`${QUANTITY_LABEL[fv.responseQuantity]} (${unit.label})`, c) },
      plugins: { legend: legend(c), tooltip: { enabled: interactive }, decimation: { enabled: true, algorithm: 'min-max' } },
    },
  };
}

/** Residuals (data − fit) below the fit. */
export function residualConfig(fv: StepFitView, c: ChartColors, interactive: boolean): ChartConfiguration<'line', XY[]> {
  const unit = displayUnitOf(fv.responseQuantity);
  const data: XY[] = Array.from(fv.tS, (t, i) => ({ x: t, y: (fv.residual[i] as number) * unit.fromSi }));
  const zero: XY[] = fv.tS.length ? [{ x: fv.tS[0] as number, y: 0 }, { x: fv.tS[fv.tS.length - 1] as number, y: 0 }] : [];
  return {
    type: 'line',
    data: {
      datasets: [
        { label: 'Residual', data, borderColor: c.data2, backgroundColor: c.data2, borderWidth: 0, pointRadius: 1.4, showLine: false },
        { label: 'zero', data: zero, borderColor: c.muted, borderWidth: 1, pointRadius: 0, borderDash: [4, 4] },
      ],
    },
    options: {
      parsing: false, animation: false, responsive: interactive, maintainAspectRatio: false,
      scales: { x: axis('Time since step onset (s)', c), y: axis(`Residual (${unit.label})`, c) },
      plugins: { legend: { display: false }, tooltip: { enabled: interactive } },
    },
  };
}

/** Fitted vs nominal compliance: nominal broken down by source, the fitted value, each with its interval. */
export function breakdownConfig(a: AnalysisView, c: ChartColors, interactive: boolean): ChartConfiguration<'bar', Array<[number, number] | number>> | null {
  if (!a.nominal) return null;
  const f = COMPLIANCE_UNIT.fromSi;
  const labels: string[] = [];
  const values: number[] = [];
  const ranges: Array<[number, number]> = [];
  const colors: string[] = [];
  for (const s of a.nominal.breakdown) {
    labels.push(`Nominal: ${s.source}`);
    values.push(s.valueM3PerPa * f);
    ranges.push((s.rangeM3PerPa ?? [s.valueM3PerPa, s.valueM3PerPa]).map((v) => v * f) as [number, number]);
    colors.push(withAlpha(c.accent, 0.75));
  }
  labels.push('Nominal total');
  values.push(a.nominal.complianceM3PerPa * f);
  ranges.push((a.nominal.complianceRangeM3PerPa ?? [a.nominal.complianceM3PerPa, a.nominal.complianceM3PerPa]).map((v) => v * f) as [number, number]);
  colors.push(c.accent);
  if (a.fittedComplianceM3PerPa) {
    labels.push('Fitted (this run)');
    values.push(a.fittedComplianceM3PerPa.value * f);
    ranges.push(a.fittedComplianceM3PerPa.ci95.map((v) => v * f) as [number, number]);
    colors.push(c.fit);
  }
  return {
    type: 'bar',
    data: {
      labels,
      datasets: [
        { label: `Compliance (${COMPLIANCE_UNIT.label})`, data: values, backgroundColor: colors, borderColor: colors, borderWidth: 1, barPercentage: 0.7 },
        { label: 'Range / 95 % CI', data: ranges, backgroundColor: withAlpha(c.ink, 0.16), borderColor: c.ink, borderWidth: 1, barPercentage: 0.25 },
      ],
    },
    options: {
      indexAxis: 'y', animation: false, responsive: interactive, maintainAspectRatio: false,
      scales: {
        x: { ...axis(`Compliance (${COMPLIANCE_UNIT.label})`, c), beginAtZero: true },
        y: { type: 'category', stacked: true, ticks: { color: c.ink }, grid: { display: false } },
      },
      plugins: { legend: legend(c), tooltip: { enabled: interactive } },
    },
  };
}

/** C vs 1/p_abs² with the fitted line C = C_rigid + V_atm·p_atm/p_abs² (x in 1/bar², y in nL/mbar). */
export function fingerprintConfig(fp: FingerprintView, c: ChartColors, interactive: boolean): ChartConfiguration<'scatter', XY[]> {
  const f = COMPLIANCE_UNIT.fromSi;
  const xOf = (pAbs: number): number => 1 / (pAbs / 1e5) ** 2;
  const pts = fp.points.map((p) => ({ x: xOf(p.pressureAbsPa), y: p.complianceM3PerPa * f }));
  const xs = pts.map((p) => p.x);
  // Show the data's span (with margins) rather than down to 1/p² = 0, where only the intercept lives.
  const span = Math.max(...xs) - Math.min(...xs) || Math.max(...xs) * 0.1;
  const x0 = Math.max(0, Math.min(...xs) - 0.25 * span);
  const x1 = Math.max(...xs) + 0.25 * span;
  // C(x) with x = 1/p² in bar⁻²: C = C_rigid + V_atm·p_atm·x (p_atm in bar).
  const slope = fp.vAtmM3.value * (fp.ambientPa / 1e5);
  // Units: V_atm [m³]·p_atm [bar]·x [bar⁻²] = m³/bar = 1e-5 m³/Pa, so C [m³/Pa] = C_rigid + slope·x·1e-5.
  const line: XY[] = [x0, x1].map((x) => ({ x, y: (fp.cRigidM3PerPa.value + slope * x * 1e-5) * f }));
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: 'Fitted C per step (95 % CI)', data: pts, borderColor: c.data, backgroundColor: c.data, pointRadius: 4.5, errorBars: fp.points.map((p) => p.ci95.map((v) => v * f) as [number, number]) } as ChartDataset<'scatter', XY[]>,
        { label: 'C_rigid + V_atm·p_atm/p_abs²', data: line, borderColor: c.fit, backgroundColor: c.fit, showLine: true, pointRadius: 0, borderWidth: 2 },
      ],
    },
    options: {
      animation: false, responsive: interactive, maintainAspectRatio: false,
      scales: { x: axis('1 / p_abs² (1/bar²)', c, { min: x0, max: x1 }), y: axis(`Compliance (${COMPLIANCE_UNIT.label})`, c) },
      plugins: { legend: legend(c), tooltip: { enabled: interactive } },
    },
  };
}
