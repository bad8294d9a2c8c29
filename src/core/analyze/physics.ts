/**
 * The physics stage of the analysis: from each step's fit to R and C of the real circuit
 * (src/core/circuits, docs/setups.md), the nominal prediction when a chip description is given
 * (src/core/nominal), and trapped air (src/core/bubbles): the pressure fingerprint across steps,
 * or the excess over the nominal compliance, and the trend of C over time.
 *
 * It runs on the analysis JSON plus the recording, so it is one clearly separated step after
 * `analyzeRecording` (pure, no I/O). It adds per step `resistance_Pa_s_per_m3`,
 * `resistance_ci95`, `compliance_m3_per_Pa`, `compliance_ci95`, `pressure_abs_Pa` and a `physics`
 * detail object, and at top level `nominal`, `trapped_air` and `compliance_trend`.
 */
import type { Warning } from '../errors';
import type { ChipDescription } from '../chip/types';
import { predictNominal, nominalPredictionToJson } from '../nominal';
import type { NominalPrediction } from '../nominal';
import type { Recording } from '../recording/types';
import {
  complianceFromFlowBalance,
  estimateFlowDriven,
  estimateLadder,
  estimatePressureDriven,
} from '../circuits';
import type { CircuitEstimate, FlowBalanceEstimate, LevelEstimate, PhysicalEstimate, PressureDrivenEstimate } from '../circuits';
import { airVolumeFromExcess, excessCompliance, linearTrend, pressureFingerprint } from '../bubbles';
import type { AirVolumeFromExcess, PressureFingerprint, Trend } from '../bubbles';
import { InputError } from '../errors';
import { stepFitFromJson } from './physics-fit';
import { ci, num, warningJson } from './to-json';
import type { AnalysisJson, Ci95, StepJson, WarningJson } from './types';

/** Standard atmosphere, Pa (ISO 2533), used when no ambient pressure is known. */
export const STANDARD_ATMOSPHERE_PA = 101325;

export interface PhysicsOptions {
  /** Chip description: nominal R and C, R_up, ambient pressure, excess compliance. */
  chip?: ChipDescription;
  /** Known upstream resistance R_up, Pa·s/m³ (overrides the chip description's). */
  upstreamResistancePaSPerM3?: number;
  /** Ambient pressure, Pa absolute; default the chip's, else 101325 Pa (with a warning). */
  ambientPressurePa?: number;
  /** Pressure-driven: where the flow sensor sits; default 'auto' (from the response shape). */
  flowSensor?: 'inlet' | 'outlet' | 'auto';
  /**
   * How to read a step: 'single' (one compliant node, default) or 'ladder' (two compliant nodes, §4.4:
   * R = R_a + R_b and C = C1 + C2 from a 2-term fit of the node-1 pressure; flow-driven steps only).
   */
  circuit?: 'single' | 'ladder';
  /**
   * Ladder: which node the logged pressure was sensed at. 'inlet' (default): node 1, the pump side, where the
   * full inverse applies. 'chip': node 2, from which only R_b and the τ's are identifiable (docs/setups.md §4).
   */
  pressureAt?: 'inlet' | 'chip';
  /**
   * Trapped air from excess compliance (needs a chip): include the Laplace pressure of a small spherical
   * bubble, C = V/(p − p_v + 4σ/(3r)) (physics.md §3.3 [D]), with the fluid's surface tension σ.
   */
  laplace?: boolean;
}

/** Surface tension for the Laplace term when the option is on and the fluid has one (else nothing). */
function laplaceConditions(options: PhysicsOptions, nominal: NominalPrediction): { surfaceTensionNPerM?: number } {
  const sigma = nominal.fluid.surfaceTensionNPerM;
  return options.laplace && sigma !== null && sigma > 0 ? { surfaceTensionNPerM: sigma } : {};
}

export interface TrappedAirJson {
  volume_m3_at_atm: number | null;
  ci95: Ci95;
  method: 'pressure-fingerprint' | 'excess-compliance';
  evidence_of_gas: boolean;
  statement: string;
  ambient_pressure_Pa: number;
  /** Fingerprint only: the pressure-independent compliance (liquid + walls). */
  rigid_compliance_m3_per_Pa?: number | null;
  rigid_compliance_ci95?: Ci95;
  steps_used?: number;
  pressure_levels?: number;
  /** Excess compliance only: whether the small-bubble Laplace term was included (--laplace). */
  laplace?: boolean;
}

export interface TrendJson {
  slope_m3_per_Pa_per_s: number | null;
  slope_ci95: Ci95;
  relative_slope_per_h: number | null;
  direction: Trend['direction'];
  statement: string;
  points: number;
  /** Mean absolute pressure of the steps used (all at one level, within 2 %), Pa. */
  pressure_abs_Pa: number | null;
}

export interface StepPhysicsFields {
  resistance_Pa_s_per_m3: number | null;
  resistance_ci95: Ci95;
  compliance_m3_per_Pa: number | null;
  compliance_ci95: Ci95;
  /** Mean absolute pressure at the compliant node during the step (ambient + gauge), Pa. */
  pressure_abs_Pa: number | null;
  physics: Record<string, unknown>;
}

export type StepWithPhysicsJson = StepJson & StepPhysicsFields;

export interface AnalysisWithPhysicsJson extends Omit<AnalysisJson, 'steps'> {
  steps: StepWithPhysicsJson[];
  /** The nominal prediction (R, C and its breakdown) when a chip description was given. */
  nominal: Record<string, unknown> | null;
  trapped_air: TrappedAirJson | null;
  compliance_trend: TrendJson | null;
}

const estJson = (e: PhysicalEstimate | null) => ({ value: num(e?.value), se: num(e?.standardError), ci95: ci(e?.ci95), inconclusive: e ? e.inconclusive : true });

/** Mean and standard error of the finite samples of `values` with fromS ≤ t < toS. */
function windowMean(timeS: Float64Array, values: Float64Array, fromS: number, toS: number): LevelEstimate & { n: number } {
  let n = 0;
  let sum = 0;
  let sum2 = 0;
  for (let i = 0; i < timeS.length; i++) {
    const t = timeS[i] as number;
    if (t < fromS || t >= toS) continue;
    const v = values[i] as number;
    if (!Number.isFinite(v)) continue;
    n++;
    sum += v;
    sum2 += v * v;
  }
  const mean = n > 0 ? sum / n : Number.NaN;
  const variance = n > 1 ? Math.max(0, (sum2 - n * mean * mean) / (n - 1)) : Number.NaN;
  return { value: mean, standardError: n > 1 ? Math.sqrt(variance / n) : Number.NaN, n };
}

/**
 * The settled level before a step: the last 20 % of the time since the previous onset (the end of
 * the previous plateau; common practice, no source), at least 5 samples when available.
 */
function preStepLevel(recording: Recording, values: Float64Array, previousOnsetS: number, onsetS: number): LevelEstimate | undefined {
  const span = onsetS - previousOnsetS;
  if (!(span > 0)) return undefined;
  let level = windowMean(recording.timeS, values, onsetS - 0.2 * span, onsetS);
  if (level.n < 5) level = windowMean(recording.timeS, values, previousOnsetS, onsetS);
  if (level.n < 2) return undefined;
  return { value: level.value, standardError: level.standardError };
}

/**
 * Which side of the compliant node a flow sensor sits on, from the sign of the slow amplitude (§4.3):
 * an inlet sensor jumps past the plateau and decays (a has the sign of Δp), an outlet sensor rises
 * (opposite sign). Null when the amplitude is not significant (|a| < 2 SE): the shape cannot tell.
 */
function sensorFromShape(step: StepJson): 'inlet' | 'outlet' | null {
  const slow = step.terms[step.terms.length - 1];
  const dp = (step.drive.after ?? 0) - (step.drive.before ?? 0);
  const a = slow?.amplitude ?? null;
  const se = slow?.amplitude_se ?? null;
  if (a === null || se === null || !(Math.abs(a) > 2 * se) || dp === 0) return null;
  return a * dp > 0 ? 'inlet' : 'outlet';
}

/** Whether a step's fit can carry physics across steps (trapped air, trends): converged and resolved. */
function usableAcrossSteps(step: StepJson): boolean {
  const flags = step.fit?.flags.map((f) => f.code) ?? [];
  return !step.inconclusive && step.fit?.converged === true && !flags.includes('tau-below-resolution');
}

interface StepContext {
  recording: Recording;
  options: PhysicsOptions;
  ambientPa: number;
  nominal: NominalPrediction | null;
  previousOnsetS: number;
}

interface StepOutcome {
  fields: StepPhysicsFields;
  estimate: CircuitEstimate | null;
  warnings: Warning[];
}

function upstreamFromOptions(ctx: StepContext): { level: LevelEstimate; source: string } | undefined {
  if (ctx.options.upstreamResistancePaSPerM3 !== undefined) {
    return { level: { value: ctx.options.upstreamResistancePaSPerM3 }, source: 'upstream resistance given by the user' };
  }
  const r = ctx.nominal?.resistance.upstreamPaSPerM3;
  if (r && r.nominal > 0) {
    // the nominal range is a plausible range: rectangular distribution, u = (high − low)/√12 (GUM §4.3.7)
    return { level: { value: r.nominal, standardError: Math.abs(r.high - r.low) / Math.sqrt(12) }, source: 'upstream resistance from the chip description' };
  }
  return undefined;
}

function flowBalanceFor(ctx: StepContext, step: StepJson, response: Float64Array): FlowBalanceEstimate | null {
  const flow = ctx.recording.channels.find((c) => c.quantity === 'flow' && c.name !== step.response.channel);
  const qIn = step.drive.after;
  if (!flow || qIn === null) return null;
  const { timeS } = ctx.recording;
  const idx: number[] = [];
  for (let i = 0; i < timeS.length; i++) if ((timeS[i] as number) >= step.start_s && (timeS[i] as number) < step.end_s) idx.push(i);
  if (idx.length < 10) return null;
  // An outlet sensor lags the pump; one that follows the setpoint at once is at the inlet: skip it.
  const head = idx.slice(0, Math.max(2, Math.floor(idx.length / 20)));
  const headMean = head.reduce((a, i) => a + (flow.values[i] as number), 0) / head.length;
  const before = step.drive.before ?? 0;
  if (Math.abs(headMean - qIn) < Math.abs(headMean - before)) return null;
  try {
    return complianceFromFlowBalance({
      tS: Float64Array.from(idx, (i) => (timeS[i] as number) - step.start_s),
      pressurePa: Float64Array.from(idx, (i) => response[i] as number),
      flowInM3PerS: qIn,
      flowOutM3PerS: Float64Array.from(idx, (i) => flow.values[i] as number),
    });
  } catch (err) {
    if (err instanceof InputError) return null;
    throw err;
  }
}

/**
 * Pressure-driven volume balance (node pressure and one flow logged): the flow the sensor does not see
 * follows from the node pressure through the resistance on its side, both in differences from the
 * settled pre-step state (so sensor offsets and a hydrostatic back-pressure cancel):
 * - inlet sensor: Q_out(t) = Q₀ + (p(t) − p₀)/R_down, R_down = Δp_node∞/ΔQ∞;
 * - outlet sensor: Q_in(t) = Q₀ + (ΔP_drive − (p(t) − p₀))/R_up, R_up = (ΔP_drive − Δp_node∞)/ΔQ∞
 * (Kirchhoff at the node, physics.md §4.3; derived here). The settled levels are the means of the last
 * 20 % of the previous level and of the window; the uncertainty of that R is added to the SE of C in
 * quadrature (C evaluated at R ± SE(R), SE(R) by first-order propagation of the level means' SEs).
 */
function pressureDrivenFlowBalance(ctx: StepContext, step: StepJson, flow: Float64Array, nodePa: Float64Array, sensor: 'inlet' | 'outlet'): FlowBalanceEstimate | null {
  const { timeS } = ctx.recording;
  const pBefore = preStepLevel(ctx.recording, nodePa, ctx.previousOnsetS, step.start_s);
  const qBefore = preStepLevel(ctx.recording, flow, ctx.previousOnsetS, step.start_s);
  const tail = step.end_s - 0.2 * (step.end_s - step.start_s);
  const pAfter = windowMean(timeS, nodePa, tail, step.end_s);
  const qAfter = windowMean(timeS, flow, tail, step.end_s);
  const drive = (step.drive.after ?? Number.NaN) - (step.drive.before ?? Number.NaN);
  if (!pBefore || !qBefore || pAfter.n < 5 || qAfter.n < 5 || !Number.isFinite(drive)) return null;
  const dp = pAfter.value - pBefore.value;
  const dq = qAfter.value - qBefore.value;
  // A "node" pressure that follows the drive is the source's own pressure, not the compliant node's.
  if (!(Math.abs(dp) < 0.98 * Math.abs(drive))) return null;
  const across = sensor === 'inlet' ? dp : drive - dp;
  const r = across / dq;
  if (!(r > 0) || !Number.isFinite(r)) return null;
  const se2 = (e: { standardError?: number }): number => (Number.isFinite(e.standardError) ? (e.standardError as number) ** 2 : 0);
  const seAcross = Math.sqrt(se2(pAfter) + se2(pBefore));
  const seDq = Math.sqrt(se2(qAfter) + se2(qBefore));
  const seR = Math.abs(r) * Math.hypot(seAcross / across, seDq / dq);
  const idx: number[] = [];
  for (let i = 0; i < timeS.length; i++) if ((timeS[i] as number) >= step.start_s && (timeS[i] as number) < step.end_s) idx.push(i);
  if (idx.length < 10) return null;
  const tS = Float64Array.from(idx, (i) => (timeS[i] as number) - step.start_s);
  const p = Float64Array.from(idx, (i) => nodePa[i] as number);
  const q = Float64Array.from(idx, (i) => flow[i] as number);
  const other = (res: number): Float64Array =>
    Float64Array.from(idx, (i) => {
      const rise = (nodePa[i] as number) - pBefore.value;
      return sensor === 'inlet' ? qBefore.value + rise / res : qBefore.value + (drive - rise) / res;
    });
  const balance = (res: number): FlowBalanceEstimate =>
    sensor === 'inlet'
      ? complianceFromFlowBalance({ tS, pressurePa: p, flowInM3PerS: q, flowOutM3PerS: other(res) })
      : complianceFromFlowBalance({ tS, pressurePa: p, flowInM3PerS: other(res), flowOutM3PerS: q });
  try {
    const mid = balance(r);
    if (!(seR > 0)) return mid;
    const spread = Math.abs(balance(r + seR).complianceM3PerPa.value - balance(Math.max(r - seR, r / 2)).complianceM3PerPa.value) / 2;
    const c = mid.complianceM3PerPa;
    const se = Math.hypot(c.standardError, spread);
    const scale = c.standardError > 0 ? se / c.standardError : 1;
    const half = [(c.value - c.ci95[0]) * scale, (c.ci95[1] - c.value) * scale];
    const ci95: [number, number] = [c.value - (half[0] as number), c.value + (half[1] as number)];
    return { ...mid, complianceM3PerPa: { ...c, standardError: se, ci95, inconclusive: !(ci95[0] > 0) || !(ci95[1] / ci95[0] <= 10) } };
  } catch (err) {
    if (err instanceof InputError) return null;
    throw err;
  }
}

function emptyFields(reason: string): StepPhysicsFields {
  return {
    resistance_Pa_s_per_m3: null,
    resistance_ci95: [null, null],
    compliance_m3_per_Pa: null,
    compliance_ci95: [null, null],
    pressure_abs_Pa: null,
    physics: { circuit: null, reason },
  };
}

function stepPhysics(step: StepJson, setup: AnalysisJson['setup'], ctx: StepContext): StepOutcome {
  const fit = stepFitFromJson(step);
  if (!fit || fit.terms.length === 0) return { fields: emptyFields('no fit for this step'), estimate: null, warnings: [] };
  const { before, after, quantity } = step.drive;
  const responseChannel = ctx.recording.channels.find((c) => c.name === step.response.channel);
  const response = responseChannel?.values;
  const warnings: Warning[] = [];
  const driveIsFlow = quantity === 'flow' || quantity === 'flow_setpoint';
  const driveIsPressure = quantity === 'pressure' || quantity === 'pressure_setpoint' || quantity === 'hydrostatic_head';
  if (before === null || after === null || (setup === 'flow-driven' ? !driveIsFlow : !driveIsPressure)) {
    const reason = `the drive levels of this step are not known as ${setup === 'flow-driven' ? 'flows' : 'pressures'} (steps found on ${quantity})`;
    return { fields: emptyFields(reason), estimate: null, warnings: [{ code: 'no-drive-levels', message: `R and C need ${reason}.` }] };
  }
  // The pipeline falls back to fitting the measured drive quantity when the log lacks the response
  // quantity (e.g. a controller log with pressure setpoint and measured pressure only): τ is known, R is not.
  const expectedResponse = setup === 'flow-driven' ? 'pressure' : 'flow';
  if (step.response.quantity !== expectedResponse) {
    const reason = `the fitted response is a ${step.response.quantity}, not the ${expectedResponse} a ${setup} set-up needs for R`;
    return { fields: emptyFields(reason), estimate: null, warnings: [{ code: 'no-response-quantity', message: `R and C need ${reason}.` }] };
  }
  let estimate: CircuitEstimate;
  let gaugePa = Number.NaN;
  // Node gauge pressure settled before and after the step (for the secant pressure of the fingerprint).
  let nodeBeforePa = Number.NaN;
  let nodeAfterPa = Number.NaN;
  let flowBalance: FlowBalanceEstimate | null = null;
  const extra: Record<string, unknown> = {};
  try {
    if (setup === 'flow-driven') {
      // Δp∞ = y∞ − the measured pre-step level (model-free); the fit's start level only as a fallback.
      const pressureBefore = response ? preStepLevel(ctx.recording, response, ctx.previousOnsetS, step.start_s) : undefined;
      estimate = estimateFlowDriven({ pressureFit: fit, flowBeforeM3PerS: before, flowAfterM3PerS: after, ...(pressureBefore ? { pressureBefore } : {}) });
      extra.baseline = pressureBefore ? 'mean pressure at the end of the previous level' : "the fit's start level y∞ + Σaᵢ";
      if (ctx.options.circuit === 'ladder' && fit.terms.length !== 2) {
        warnings.push({
          code: 'ladder-needs-two-terms',
          message: `the two-node (ladder) reading needs a 2-term fit, this step has ${fit.terms.length} term(s); the one-node result is shown (fit with --terms 2).`,
        });
      }
      if (fit.terms.length === 2) {
        // Two τ's at the pump's node: also read them as a two-node ladder (§4.4), beside the 1-node result
        // (or instead of it, when the user says the set-up is a ladder).
        const sensedNode = ctx.options.pressureAt ?? 'inlet';
        const ladder = estimateLadder({ pressureFit: fit, drive: { kind: 'flow', flowBeforeM3PerS: before, flowAfterM3PerS: after }, sensedNode, ...(pressureBefore ? { pressureBefore } : {}) });
        if (ctx.options.circuit === 'ladder') estimate = ladder;
        extra.ladder = {
          node1_compliance_m3_per_Pa: estJson(ladder.node1ComplianceM3PerPa),
          node2_compliance_m3_per_Pa: estJson(ladder.node2ComplianceM3PerPa),
          resistance_between_nodes_Pa_s_per_m3: estJson(ladder.resistanceBetweenNodesPaSPerM3),
          outlet_resistance_Pa_s_per_m3: estJson(ladder.outletResistancePaSPerM3),
          consistent: !ladder.warnings.some((w) => w.code === 'ladder-inconsistent'),
          pressure_at: sensedNode,
          note: 'The 2-term fit read as pump → C1 → R_a → C2 → R_b → outlet (docs/setups.md §4); meaningful only if the set-up has two compliant nodes.',
        };
      }
      nodeBeforePa = pressureBefore?.value ?? fit.yInf.value + fit.terms.reduce((a, t) => a + t.amplitude.value, 0);
      nodeAfterPa = fit.yInf.value;
      if (response) {
        gaugePa = windowMean(ctx.recording.timeS, response, step.start_s, step.end_s).value;
        flowBalance = flowBalanceFor(ctx, step, response);
      }
    } else {
      if (ctx.options.circuit === 'ladder') {
        warnings.push({
          code: 'ladder-not-applicable',
          message: 'the two-node (ladder) reading needs the pressure at the first node of a flow-driven set-up; this pressure-driven step is read as one compliant node.',
        });
      }
      const given = ctx.options.flowSensor && ctx.options.flowSensor !== 'auto' ? ctx.options.flowSensor : null;
      const fromShape = given ? null : sensorFromShape(step);
      const sensor = given ?? fromShape ?? 'outlet';
      const flowBefore = response ? preStepLevel(ctx.recording, response, ctx.previousOnsetS, step.start_s) : undefined;
      const up = sensor === 'outlet' ? upstreamFromOptions(ctx) : undefined;
      extra.baseline = flowBefore ? 'mean flow at the end of the previous level' : "the fit's start level y∞ + Σaᵢ";
      const pd: PressureDrivenEstimate = estimatePressureDriven({
        flowFit: fit,
        sensor: sensor === 'inlet' && !flowBefore ? 'outlet' : sensor,
        pressureBeforePa: before,
        pressureAfterPa: after,
        ...(flowBefore ? { flowBefore } : {}),
        ...(up ? { upstreamResistance: up.level } : {}),
      });
      estimate = pd;
      extra.flow_sensor = sensor;
      extra.flow_sensor_from = given
        ? 'given'
        : fromShape
          ? 'response shape (inlet jumps and decays, outlet rises)'
          : 'assumed outlet (the response shape is not significant enough to tell)';
      extra.upstream_resistance_Pa_s_per_m3 = estJson(pd.upstreamResistancePaSPerM3);
      extra.upstream_resistance_source = up ? up.source : pd.upstreamResistanceSource;
      extra.downstream_resistance_Pa_s_per_m3 = estJson(pd.downstreamResistancePaSPerM3);
      extra.compliance_lower_bound_m3_per_Pa = num(pd.complianceLowerBoundM3PerPa);
      const pressure = ctx.recording.channels.find((c) => c.quantity === 'pressure');
      if (pressure && response) {
        flowBalance = pressureDrivenFlowBalance(ctx, step, response, pressure.values, sensor);
        if (flowBalance) extra.flow_balance_resistance_from = sensor === 'inlet' ? 'R_down from the settled node pressure and flow' : 'R_up from the settled drive, node pressure and flow';
      }
      if (pressure) {
        gaugePa = windowMean(ctx.recording.timeS, pressure.values, step.start_s, step.end_s).value;
        nodeBeforePa = preStepLevel(ctx.recording, pressure.values, ctx.previousOnsetS, step.start_s)?.value ?? Number.NaN;
        nodeAfterPa = windowMean(ctx.recording.timeS, pressure.values, step.end_s - 0.2 * (step.end_s - step.start_s), step.end_s).value;
        extra.pressure_from = `mean of ${pressure.name} during the step`;
      } else {
        const rd = pd.downstreamResistancePaSPerM3?.value;
        const rt = pd.resistancePaSPerM3?.value;
        const share = rd !== undefined && rt !== undefined && rd > 0 && rt > 0 ? rd / rt : 1;
        gaugePa = after * share;
        nodeBeforePa = before * share;
        nodeAfterPa = after * share;
        extra.pressure_from = share === 1 ? 'drive level after the step (node pressure not logged; an upper bound)' : 'drive level × R_down/R_total (steady-state divider, §4.3)';
      }
    }
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    return { fields: emptyFields(err.problem), estimate: null, warnings: [{ code: err.code, message: err.problem }] };
  }
  warnings.push(...estimate.warnings);
  if (estimate.setup.startsWith('ladder')) extra.circuit_choice = 'ladder (two compliant nodes, given by the user)';
  const pAbs = ctx.ambientPa + gaugePa;
  // Secant pressure √(p_a·p_b) (absolute, before and after): a gas pocket stores ΔV = V_atm·p_atm·(1/p_a − 1/p_b),
  // so its step compliance ΔV/Δp is exactly V_atm·p_atm/(p_a·p_b) (Boyle, §3.3; derived here).
  const pa = ctx.ambientPa + nodeBeforePa;
  const pb = ctx.ambientPa + nodeAfterPa;
  const secantPAbs = pa > 0 && pb > 0 ? Math.sqrt(pa * pb) : pAbs;
  const r = estimate.resistancePaSPerM3;
  const c = estimate.complianceM3PerPa;
  const physics: Record<string, unknown> = {
    circuit: estimate.setup,
    tau_term: estimate.tauTermIndex,
    tau_s: num(estimate.tauS.value),
    resistance_se: num(r?.standardError),
    resistance_inconclusive: r ? r.inconclusive : true,
    compliance_se: num(c?.standardError),
    compliance_inconclusive: c ? c.inconclusive : true,
    // R or C ≤ 0: physically impossible, the model does not fit this step (warning code 'non-physical').
    non_physical: warnings.some((w) => w.code === 'non-physical'),
    secant_pressure_abs_Pa: num(secantPAbs),
    ...extra,
    flow_balance: flowBalance
      ? {
          compliance_m3_per_Pa: num(flowBalance.complianceM3PerPa.value),
          compliance_ci95: ci(flowBalance.complianceM3PerPa.ci95),
          n: flowBalance.n,
          effective_n: num(flowBalance.effectiveN),
          method: 'volume balance ∫(Q_in − Q_out)dt = C·(p − p₀), a cross-check of the fitted C',
        }
      : null,
    notes: estimate.notes,
  };
  if (ctx.nominal && c && Number.isFinite(pAbs)) {
    const nominalC = ctx.nominal.compliance.totalM3PerPa;
    const excess = excessCompliance(c, { valueM3PerPa: nominalC.nominal, rangeM3PerPa: [nominalC.low, nominalC.high] }, fit.dof);
    const air = airVolumeFromExcess(excess, {
      pressureAbsPa: pAbs,
      ambientPressurePa: ctx.ambientPa,
      vapourPressurePa: ctx.nominal.fluid.vapourPressurePa ?? 0,
      ...laplaceConditions(ctx.options, ctx.nominal),
    });
    physics.air_volume_laplace = laplaceConditions(ctx.options, ctx.nominal).surfaceTensionNPerM !== undefined;
    physics.excess_compliance_m3_per_Pa = num(excess.excessM3PerPa.value);
    physics.excess_compliance_ci95 = ci(excess.excessM3PerPa.ci95);
    physics.air_volume_m3_at_atm = num(air.volumeM3AtAtm);
    physics.air_volume_ci95 = ci(air.ci95);
    physics.air_volume_m3_at_working_pressure = num(air.volumeM3AtWorkingPressure);
    physics.air_volume_adiabatic_bound_m3_at_atm = num(air.adiabaticUpperBoundM3AtAtm);
    physics.air_statement = air.statement;
  }
  return {
    fields: {
      resistance_Pa_s_per_m3: num(r?.value),
      resistance_ci95: ci(r?.ci95),
      compliance_m3_per_Pa: num(c?.value),
      compliance_ci95: ci(c?.ci95),
      pressure_abs_Pa: num(pAbs),
      physics,
    },
    estimate,
    warnings,
  };
}

function fingerprintJson(f: PressureFingerprint): TrappedAirJson {
  return {
    volume_m3_at_atm: num(f.volumeM3AtAtm),
    ci95: ci(f.ci95),
    method: 'pressure-fingerprint',
    evidence_of_gas: f.evidenceOfGas,
    statement: f.statement,
    ambient_pressure_Pa: f.ambientPressurePa,
    rigid_compliance_m3_per_Pa: num(f.rigidComplianceM3PerPa?.value),
    rigid_compliance_ci95: ci(f.rigidComplianceM3PerPa?.ci95),
    steps_used: f.steps,
    pressure_levels: f.pressureLevels,
  };
}

function excessJson(a: AirVolumeFromExcess, steps: number): TrappedAirJson {
  return {
    volume_m3_at_atm: num(a.volumeM3AtAtm),
    ci95: ci(a.ci95),
    method: 'excess-compliance',
    evidence_of_gas: a.evidenceOfGas,
    statement: a.statement,
    ambient_pressure_Pa: a.ambientPressurePa,
    steps_used: steps,
  };
}

/** The largest set of items whose level lies within `fraction` of the set's lowest level. */
function largestSameLevelGroup<T>(items: T[], level: (x: T) => number, fraction: number): T[] {
  const sorted = [...items].sort((a, b) => level(a) - level(b));
  let best: T[] = [];
  for (let i = 0; i < sorted.length; i++) {
    const base = level(sorted[i] as T);
    const group = sorted.filter((x) => level(x) >= base && level(x) <= base * (1 + fraction));
    if (group.length > best.length) best = group;
  }
  // back in time order
  return items.filter((x) => best.includes(x));
}

/** Adds R, C, pressures, the nominal prediction and trapped air to an analysis (header). */
export function addPhysics(analysis: AnalysisJson, recording: Recording, options: PhysicsOptions = {}): AnalysisWithPhysicsJson {
  const topWarnings: WarningJson[] = [...analysis.warnings];
  const ambientGiven = options.ambientPressurePa ?? options.chip?.ambientPressurePa;
  const ambientPa = ambientGiven ?? STANDARD_ATMOSPHERE_PA;
  if (ambientGiven === undefined) {
    topWarnings.push({ code: 'ambient-assumed', message: 'Ambient pressure not given: 101325 Pa (standard atmosphere) assumed for absolute pressures.' });
  }
  let nominal: NominalPrediction | null = null;
  if (options.chip) {
    nominal = predictNominal(options.chip, analysis.setup);
    topWarnings.push(...nominal.warnings.map(warningJson));
  }
  if (options.laplace && !nominal) {
    topWarnings.push({ code: 'laplace-needs-chip', message: 'The Laplace correction applies to the air volume from excess compliance, which needs a chip description (--chip); not applied.' });
  } else if (options.laplace && nominal && !(nominal.fluid.surfaceTensionNPerM && nominal.fluid.surfaceTensionNPerM > 0)) {
    topWarnings.push({ code: 'laplace-no-surface-tension', message: `The fluid (${nominal.fluid.name}) has no known surface tension; the Laplace correction was not applied.` });
  }
  const steps: StepWithPhysicsJson[] = [];
  const estimates: (CircuitEstimate | null)[] = [];
  let previousOnsetS = 0;
  for (const step of analysis.steps) {
    const out = stepPhysics(step, analysis.setup, { recording, options, ambientPa, nominal, previousOnsetS });
    previousOnsetS = step.start_s;
    estimates.push(out.estimate);
    steps.push({
      ...step,
      ...out.fields,
      warnings: [...step.warnings, ...out.warnings.map((w) => ({ ...warningJson(w), message: `Step ${step.index}: ${w.message}` }))],
    });
  }

  // Trapped air across steps, two methods: the pressure fingerprint (no chip needed) and the excess
  // over the nominal compliance of the inverse-variance weighted mean C (with a chip). When both can
  // be made, the one with the narrower 95 % CI is reported (it is the more informative one).
  const withC = steps
    .map((s, i) => ({ s, c: estimates[i]?.complianceM3PerPa ?? null }))
    .filter((x): x is { s: StepWithPhysicsJson; c: PhysicalEstimate } => x.c !== null && Number.isFinite(x.c.value) && x.s.pressure_abs_Pa !== null && usableAcrossSteps(x.s));
  const fingerprint = pressureFingerprint(
    withC.map((x) => ({
      complianceM3PerPa: x.c.value,
      standardError: x.c.standardError,
      pressureAbsPa: typeof x.s.physics.secant_pressure_abs_Pa === 'number' ? x.s.physics.secant_pressure_abs_Pa : (x.s.pressure_abs_Pa as number),
    })),
    { ambientPressurePa: ambientPa },
  );
  const candidates: { json: TrappedAirJson; warnings: Warning[] }[] = [];
  if (fingerprint.volumeM3AtAtm !== null) {
    candidates.push({ json: fingerprintJson(fingerprint), warnings: fingerprint.warnings });
  }
  if (nominal && withC.length > 0) {
    const weights = withC.map((x) => (x.c.standardError > 0 ? 1 / x.c.standardError ** 2 : 0));
    const sw = weights.reduce((a, b) => a + b, 0);
    if (sw > 0) {
      const mean = withC.reduce((a, x, i) => a + (weights[i] as number) * x.c.value, 0) / sw;
      const pMean = withC.reduce((a, x, i) => a + (weights[i] as number) * (x.s.pressure_abs_Pa as number), 0) / sw;
      const dof = Math.min(...withC.map((x) => x.s.fit?.dof ?? 1));
      const pooled: PhysicalEstimate = { value: mean, standardError: 1 / Math.sqrt(sw), ci95: [Number.NaN, Number.NaN], inconclusive: false };
      const cNom = nominal.compliance.totalM3PerPa;
      const excess = excessCompliance(pooled, { valueM3PerPa: cNom.nominal, rangeM3PerPa: [cNom.low, cNom.high] }, dof);
      const lap = laplaceConditions(options, nominal);
      const air = airVolumeFromExcess(excess, { pressureAbsPa: pMean, ambientPressurePa: ambientPa, vapourPressurePa: nominal.fluid.vapourPressurePa ?? 0, ...lap });
      candidates.push({ json: { ...excessJson(air, withC.length), laplace: lap.surfaceTensionNPerM !== undefined }, warnings: air.warnings });
    }
  }
  const width = (j: TrappedAirJson): number => (j.ci95[0] !== null && j.ci95[1] !== null ? j.ci95[1] - j.ci95[0] : Infinity);
  candidates.sort((a, b) => width(a.json) - width(b.json));
  const chosen = candidates[0];
  const trapped: TrappedAirJson | null = chosen ? chosen.json : null;
  if (chosen) topWarnings.push(...chosen.warnings.map(warningJson));
  if (trapped === null) {
    topWarnings.push({
      code: 'trapped-air-not-assessed',
      message:
        withC.length === 0
          ? 'Trapped air not assessed: no step gives a usable compliance (fits inconclusive, not converged or τ below the time resolution).'
          : `Trapped air not assessed: ${fingerprint.statement.replace(/^Inconclusive: /, '')}${nominal ? '' : ' Give a chip description (--chip) to compare with the nominal compliance.'}`,
    });
  }

  // Trend over time only among steps at the same pressure level (within 2 %): gas compliance also
  // changes with pressure (1/p², §3.3), so mixing levels would read a pressure change as dissolution.
  const sameLevel = largestSameLevelGroup(withC, (x) => x.s.pressure_abs_Pa as number, 0.02);
  const trend = sameLevel.length >= 3 ? linearTrend(sameLevel.map((x) => ({ timeS: x.s.start_s, value: x.c.value, standardError: x.c.standardError }))) : null;
  return {
    ...analysis,
    steps,
    warnings: topWarnings,
    nominal: nominal ? nominalPredictionToJson(nominal) : null,
    trapped_air: trapped,
    compliance_trend: trend
      ? {
          slope_m3_per_Pa_per_s: num(trend.slopePerS?.value),
          slope_ci95: ci(trend.slopePerS?.ci95),
          relative_slope_per_h: num(trend.relativeSlopePerHour),
          direction: trend.direction,
          statement: trend.statement,
          points: trend.points,
          pressure_abs_Pa: num(sameLevel.reduce((a, x) => a + (x.s.pressure_abs_Pa as number), 0) / sameLevel.length),
        }
      : null,
  };
}
