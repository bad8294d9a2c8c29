/**
 * Step windows with their fitted curves, for report plots: the measured response in each step's window
 * (thinned to at most `maxPoints` by keeping every k-th sample) and the model evaluated from the fitted
 * parameters of the analysis JSON (fit/types.ts model):
 *   y(t) = y∞ + Σ aᵢ·exp(−(t − t_d)/τᵢ) + b·t  for t ≥ t_d,  y∞ + Σ aᵢ + b·t before.
 */
import type { AnalysisJson, StepJson } from '../analyze/types';
import type { Recording } from '../recording/types';
import type { MeasuredValue } from './types';

/** Same shape as report/types.ts StepPlot. */
export interface StepCurve {
  title: string;
  tS: number[];
  y: number[];
  fitY: number[] | null;
  yUnit: string;
  displayScale: number;
  displayUnit: string;
  tauS: MeasuredValue | null;
}

/** The fitted model of a step at times t (s since onset); null when the step has no usable parameters. */
export function modelCurve(step: StepJson, tS: readonly number[]): number[] | null {
  if (!step.fit || step.y_inf === null || step.terms.some((t) => t.tau_s === null || t.amplitude === null)) return null;
  const yInf = step.y_inf;
  const td = step.dead_time_s ?? 0;
  const b = step.drift_per_s ?? 0;
  return tS.map((t) => {
    const tt = Math.max(0, t - td);
    let y = yInf + b * t;
    for (const term of step.terms) y += (term.amplitude as number) * Math.exp(-tt / (term.tau_s as number));
    return y;
  });
}

/** Plot data for every step of an analysed recording. */
export function stepCurves(recording: Recording, analysis: AnalysisJson, maxPoints = 400): StepCurve[] {
  const out: StepCurve[] = [];
  for (const step of analysis.steps) {
    const channel = recording.channels.find((c) => c.name === step.response.channel);
    if (!channel) continue;
    const idx: number[] = [];
    for (let i = 0; i < recording.timeS.length; i++) {
      const t = recording.timeS[i] as number;
      if (t >= step.start_s && t < step.end_s) idx.push(i);
    }
    const every = Math.max(1, Math.ceil(idx.length / maxPoints));
    const keep = idx.filter((_, k) => k % every === 0);
    const tS = keep.map((i) => (recording.timeS[i] as number) - step.start_s);
    const y = keep.map((i) => channel.values[i] as number);
    const isFlow = step.response.quantity === 'flow';
    const slow = step.terms[step.terms.length - 1];
    const tau: MeasuredValue | null =
      slow && slow.tau_s !== null
        ? { value: slow.tau_s, standardError: slow.tau_se_s, ci95: slow.tau_ci95_s[0] !== null && slow.tau_ci95_s[1] !== null ? [slow.tau_ci95_s[0], slow.tau_ci95_s[1]] : null }
        : null;
    const before = step.drive.before;
    const after = step.drive.after;
    const driveText =
      before !== null && after !== null
        ? step.drive.quantity.startsWith('flow')
          ? ` (${fmt(before / (1e-9 / 60))} → ${fmt(after / (1e-9 / 60))} µL/min)`
          : ` (${fmt(before / 100)} → ${fmt(after / 100)} mbar)`
        : '';
    out.push({
      title: `Step ${step.index + 1} at ${fmt(step.start_s)} s, ${step.direction}${driveText}${step.inconclusive ? ' — inconclusive' : ''}`,
      tS,
      y,
      fitY: modelCurve(step, tS),
      yUnit: step.response.unit,
      displayScale: isFlow ? 1e-9 / 60 : 100,
      displayUnit: isFlow ? `${step.response.channel} (µL/min)` : `${step.response.channel} (mbar)`,
      tauS: tau,
    });
  }
  return out;
}

function fmt(x: number): string {
  return String(Number(x.toPrecision(4)));
}
