/**
 * Two compliant nodes in a ladder (physics.md §4.4):
 *
 *   source → R1 → node 1 (C1) → R2 → node 2 (C2) → R3 → outlet (p = 0)
 *
 * Forward: A = [[−(G1+G2)/C1, G2/C1], [G2/C2, −(G2+G3)/C2]] (Gᵢ = 1/Rᵢ; a flow source is G1 = 0),
 * τᵢ = −1/λᵢ of A; τ₁τ₂ = 1/det A, τ₁ + τ₂ = −tr A/det A.
 *
 * Inverse from the pressure at node 1 (the algebra, derived here from Kirchhoff's laws and
 * documented in docs/setups.md): with the impedance Z₂ = R3/(1 + sR3C2) of node 2,
 *
 *   flow source ΔQ:      P₁(s)/ΔQ = (R2 + R3)(1 + s·τz) / (1 + s·b₁ + s²·b₂)
 *       τz = R2R3C2/(R2 + R3),  b₁ = C1(R2 + R3) + R3C2,  b₂ = C1C2R2R3
 *   pressure source ΔP:  P₁(s)/ΔP = G·(1 + s·τz) / (1 + s·b₁ + s²·b₂)
 *       G = (R2 + R3)/R_s,  R_s = R1 + R2 + R3,
 *       b₁ = [R1C1(R2 + R3) + R3C2(R1 + R2)]/R_s,  b₂ = R1R2R3C1C2/R_s
 *
 * with b₁ = τ₁ + τ₂ and b₂ = τ₁τ₂. The step response is y∞ + a₁e^(−t/τ₁) + a₂e^(−t/τ₂) with
 * aᵢ = −Δy∞·(τᵢ − τz)/(τᵢ − τⱼ), so the zero follows from the amplitude ratio:
 * τz = (τ₁a₂ + τ₂a₁)/(a₁ + a₂). Four observables (Δy∞ gain, τz, b₁, b₂):
 * - flow source: 4 unknowns (R2, R3, C1, C2), identified without any known element:
 *   K = R2 + R3 = Δp∞/ΔQ, M = R2R3C2 = τz·K, C1 = b₂/M, R3C2 = b₁ − C1·K,
 *   R2 = M/(R3C2), R3 = K − R2, C2 = R3C2/R3;
 * - pressure source: 5 unknowns, so one known element is needed; with R1 known:
 *   S = R2 + R3 = G·R1/(1 − G), R_s = R1 + S, M = τz·S, C1 = b₂R_s/(R1M),
 *   R3C2 = (b₁R_s − R1C1S − M)/R1, then R2, R3, C2 as above.
 * All uncertainties by the delta method with the fit's covariance (2-term fit required).
 *
 * Pressure sensed at node 2 (the chip node) instead, flow source (derived here the same way): from
 * node 2, P₁ = P₂(R2 + R3 + sR2R3C2)/R3 and the flow through R2 is P₂(1 + sR3C2)/R3; Kirchhoff at
 * node 1, ΔQ = sC1P₁ + P₂(1 + sR3C2)/R3, gives
 *
 *   P₂(s)/ΔQ = R3 / (1 + s·b₁ + s²·b₂)        (same b₁, b₂ as above; no zero)
 *
 * so the step response has aᵢ = −Δy∞·τᵢ/(τᵢ − τⱼ): p₂ starts with zero value and zero slope,
 * a₁/τ₁ + a₂/τ₂ = 0 (physics.md §4.4). The amplitudes therefore carry no information beyond the
 * τ's, and the observables are three — R3 = Δp∞/ΔQ, b₁ = τ₁ + τ₂, b₂ = τ₁τ₂ — for four unknowns
 * (R2, R3, C1, C2): C1, C2 and R2 are not identifiable from the chip-node pressure alone (one known
 * R2 or C1 still leaves a quadratic with two positive roots). `estimateLadder` with
 * `sensedNode: 'chip'` reports R_b = R3 and the τ's, C1, C2, R_a as not determined, and the
 * zero-slope residual (a₁/τ₁ + a₂/τ₂)/(|a₁|/τ₁ + |a₂|/τ₂) as a check that node 2 is what is sensed.
 */
import { InputError } from '../errors';
import type { TransientFit } from '../fit/types';
import { amplitudeName, parameterSetFromFit, tauName, withIndependent } from './parameter-set';
import type { ParameterReader } from './parameter-set';
import { propagate } from './propagate';
import { fitQualityWarnings, inconclusiveWarning, withBaseline } from './setup-common';
import type { CircuitEstimate, LevelEstimate, PhysicalEstimate } from './types';

/** Element values of a two-node ladder (SI). `r1PaSPerM3` is Infinity for a flow source. */
export interface LadderElements {
  r1PaSPerM3: number;
  r2PaSPerM3: number;
  r3PaSPerM3: number;
  c1M3PerPa: number;
  c2M3PerPa: number;
}

/** The two time constants of the ladder, slow first (eigenvalues of A, §4.4). */
export function ladderTimeConstants(e: LadderElements): { slowS: number; fastS: number } {
  const g1 = Number.isFinite(e.r1PaSPerM3) ? 1 / e.r1PaSPerM3 : 0;
  const g2 = 1 / e.r2PaSPerM3;
  const g3 = 1 / e.r3PaSPerM3;
  const a11 = -(g1 + g2) / e.c1M3PerPa;
  const a22 = -(g2 + g3) / e.c2M3PerPa;
  const trace = a11 + a22;
  const det = a11 * a22 - (g2 / e.c1M3PerPa) * (g2 / e.c2M3PerPa);
  // Discriminant in the cancellation-free form of §4.4: (a11 − a22)² + 4·G2²/(C1C2) > 0.
  const disc = Math.sqrt((a11 - a22) ** 2 + (4 * g2 * g2) / (e.c1M3PerPa * e.c2M3PerPa));
  const lambdaSlow = (trace + disc) / 2;
  // λ_fast from the product λ₁λ₂ = det avoids subtracting nearly equal numbers.
  const lambdaFast = det / lambdaSlow;
  return { slowS: -1 / lambdaSlow, fastS: -1 / lambdaFast };
}

export interface LadderInput {
  /** Two-term fit of the pressure at node 1 (Pa). */
  pressureFit: TransientFit;
  /** Drive: a flow source (pump) or a pressure source with known upstream resistance R1. */
  drive:
    | { kind: 'flow'; flowBeforeM3PerS: number; flowAfterM3PerS: number }
    | { kind: 'pressure'; pressureBeforePa: number; pressureAfterPa: number; upstreamResistance: LevelEstimate };
  /** Pressure at node 1 before the step; default: the fit's start level y∞ + a₁ + a₂ (p₁ is continuous). */
  pressureBefore?: LevelEstimate;
  /**
   * Which node the pressure was sensed at: 'inlet' (node 1, the pump side; default) or 'chip' (node 2).
   * From node 2 only R_b and the τ's are identifiable (header); flow source only.
   */
  sensedNode?: 'inlet' | 'chip';
}

export interface LadderEstimate extends CircuitEstimate {
  setup: 'ladder-flow-driven' | 'ladder-pressure-driven';
  /** C1 (node 1, the sensed node) and C2 (node 2). */
  node1ComplianceM3PerPa: PhysicalEstimate;
  node2ComplianceM3PerPa: PhysicalEstimate;
  /** R_a = R2 between the nodes, R_b = R3 from node 2 to the outlet. */
  resistanceBetweenNodesPaSPerM3: PhysicalEstimate;
  outletResistancePaSPerM3: PhysicalEstimate;
  /** The fast time constant (the slow one is `tauS`). */
  fastTauS: PhysicalEstimate;
  /** τz, the zero of the node-1 response, from the amplitude ratio. */
  zeroTauS: PhysicalEstimate;
}

type Unknowns = { c1: number; c2: number; r2: number; r3: number };

/** The inverse map of the header, as a function of the fitted parameters. */
function solveLadder(
  p: ParameterReader,
  baseline: (p: ParameterReader) => number,
  drive: LadderInput['drive'],
): Unknowns & { tauZ: number } {
  const t1 = p(tauName(1));
  const t2 = p(tauName(2));
  const a1 = p(amplitudeName(1));
  const a2 = p(amplitudeName(2));
  const tauZ = (t1 * a2 + t2 * a1) / (a1 + a2);
  const b1 = t1 + t2;
  const b2 = t1 * t2;
  const rise = p('yInf') - baseline(p);
  let s23: number;
  let c1: number;
  let r3c2: number;
  if (drive.kind === 'flow') {
    s23 = rise / (drive.flowAfterM3PerS - drive.flowBeforeM3PerS);
    const m = tauZ * s23;
    c1 = b2 / m;
    r3c2 = b1 - c1 * s23;
  } else {
    const r1 = p('r1');
    const g = rise / (drive.pressureAfterPa - drive.pressureBeforePa);
    s23 = (g * r1) / (1 - g);
    const rs = r1 + s23;
    const m = tauZ * s23;
    c1 = (b2 * rs) / (r1 * m);
    r3c2 = (b1 * rs - r1 * c1 * s23 - m) / r1;
  }
  const r2 = (tauZ * s23) / r3c2;
  const r3 = s23 - r2;
  return { c1, c2: r3c2 / r3, r2, r3, tauZ };
}

const NOT_DETERMINED: PhysicalEstimate = { value: Number.NaN, standardError: Number.NaN, ci95: [Number.NaN, Number.NaN], inconclusive: true };

/** The node-2 reading (header): R_b = Δp∞/ΔQ and the τ's only; C1, C2, R_a not identifiable. */
function estimateFromChipNode(input: LadderInput, fit: TransientFit): LadderEstimate {
  const drive = input.drive;
  if (drive.kind !== 'flow') {
    throw new InputError(
      'ladder-chip-node-pressure-driven',
      'The ladder reading from the chip-node pressure is derived for a flow source only',
      'Log the pressure at the inlet (pump-side) node, or read the step as one compliant node',
    );
  }
  const fromFit = parameterSetFromFit(fit);
  const based = withBaseline(fromFit.set, fit, input.pressureBefore);
  const dof = fit.dof;
  const dq = drive.flowAfterM3PerS - drive.flowBeforeM3PerS;
  const r3 = propagate(based.set, (p) => (p('yInf') - based.baseline(p)) / dq, dof);
  const slow = propagate(based.set, (p) => p(tauName(2)), dof);
  const fast = propagate(based.set, (p) => p(tauName(1)), dof);
  const a1 = fit.terms[0]?.amplitude.value ?? Number.NaN;
  const a2 = fit.terms[1]?.amplitude.value ?? Number.NaN;
  const t1 = fit.terms[0]?.tauS.value ?? Number.NaN;
  const t2 = fit.terms[1]?.tauS.value ?? Number.NaN;
  const slopeResidual = (a1 / t1 + a2 / t2) / (Math.abs(a1) / t1 + Math.abs(a2) / t2);
  const warnings = [...fromFit.warnings, ...fitQualityWarnings(fit)];
  warnings.push({
    code: 'ladder-needs-inlet-pressure',
    message:
      'The pressure was sensed at the chip node (node 2): its response R_b/(1 + s(τ₁+τ₂) + s²τ₁τ₂) gives only R_b (node 2 to the outlet) and the two τ\'s; C1, C2 and R_a cannot be separated (3 observables, 4 unknowns; docs/setups.md §4). Log the pressure at the pump-side node for C1, C2, R_a.',
  });
  if (!(Math.abs(slopeResidual) < 0.5)) {
    warnings.push({
      code: 'ladder-inconsistent',
      message: `A chip-node response starts with zero slope (a₁/τ₁ + a₂/τ₂ = 0), but this fit's relative initial slope is ${slopeResidual.toFixed(2)}: the pressure may not be sensed at node 2.`,
    });
  }
  warnings.push(...inconclusiveWarning('R_b (node 2 to the outlet)', r3));
  return {
    setup: 'ladder-flow-driven',
    resistancePaSPerM3: r3,
    complianceM3PerPa: null,
    tauS: slow,
    tauTermIndex: 2,
    node1ComplianceM3PerPa: NOT_DETERMINED,
    node2ComplianceM3PerPa: NOT_DETERMINED,
    resistanceBetweenNodesPaSPerM3: NOT_DETERMINED,
    outletResistancePaSPerM3: r3,
    fastTauS: fast,
    zeroTauS: NOT_DETERMINED,
    notes: [
      'Pressure sensed at the chip node (node 2): R = R_b = Δp∞/ΔQ only (not R_a + R_b); C is not identifiable from this node.',
      `Zero-slope check a₁/τ₁ + a₂/τ₂ relative to its terms: ${Number.isFinite(slopeResidual) ? slopeResidual.toFixed(3) : 'n/a'} (0 for a node-2 response).`,
    ],
    warnings,
  };
}

/**
 * C1, C2, R2 and R3 of a two-node ladder from a two-term fit of the node-1 pressure (§4.4);
 * from the node-2 (chip) pressure only R3 and the τ's (`sensedNode: 'chip'`, header).
 */
export function estimateLadder(input: LadderInput): LadderEstimate {
  const fit = input.pressureFit;
  if (fit.terms.length !== 2) {
    throw new InputError(
      'ladder-needs-two-terms',
      `The ladder setup needs a 2-term fit (two compliant nodes), but the fit has ${fit.terms.length} term(s)`,
      'Fit this step with terms = 2',
    );
  }
  if (input.sensedNode === 'chip') return estimateFromChipNode(input, fit);
  const fromFit = parameterSetFromFit(fit);
  const based = withBaseline(fromFit.set, fit, input.pressureBefore);
  let set = based.set;
  if (input.drive.kind === 'pressure') {
    set = withIndependent(set, 'r1', input.drive.upstreamResistance.value, input.drive.upstreamResistance.standardError ?? 0);
  }
  const drive = input.drive;
  const solve = (p: ParameterReader): Unknowns & { tauZ: number } => solveLadder(p, based.baseline, drive);
  const dof = fit.dof;
  const c1 = propagate(set, (p) => solve(p).c1, dof);
  const c2 = propagate(set, (p) => solve(p).c2, dof);
  const r2 = propagate(set, (p) => solve(p).r2, dof);
  const r3 = propagate(set, (p) => solve(p).r3, dof);
  const total = propagate(set, (p) => solve(p).r2 + solve(p).r3, dof);
  const cTotal = propagate(set, (p) => solve(p).c1 + solve(p).c2, dof);
  const tauZ = propagate(set, (p) => solve(p).tauZ, dof);
  const slow = propagate(set, (p) => p(tauName(2)), dof);
  const fast = propagate(set, (p) => p(tauName(1)), dof);

  const warnings = [...fromFit.warnings, ...fitQualityWarnings(fit)];
  const physical = [c1, c2, r2, r3].every((e) => e.value > 0 && Number.isFinite(e.value));
  if (!physical) {
    warnings.push({
      code: 'ladder-inconsistent',
      message: 'The two time constants and amplitudes do not fit a two-node ladder with positive elements; the step may come from another circuit (e.g. source lag).',
    });
  }
  warnings.push(
    ...inconclusiveWarning('C1 (node 1)', c1),
    ...inconclusiveWarning('C2 (node 2)', c2),
    ...inconclusiveWarning('R_a (between the nodes)', r2),
    ...inconclusiveWarning('R_b (node 2 to the outlet)', r3),
  );
  return {
    setup: drive.kind === 'flow' ? 'ladder-flow-driven' : 'ladder-pressure-driven',
    resistancePaSPerM3: total,
    complianceM3PerPa: cTotal,
    tauS: slow,
    tauTermIndex: 2,
    node1ComplianceM3PerPa: c1,
    node2ComplianceM3PerPa: c2,
    resistanceBetweenNodesPaSPerM3: r2,
    outletResistancePaSPerM3: r3,
    fastTauS: fast,
    zeroTauS: tauZ,
    notes: [
      'Two compliant nodes: τ₁τ₂ and τ₁ + τ₂ from the fit, the zero τz from the amplitude ratio, the gain from the plateau.',
      drive.kind === 'flow'
        ? 'Flow source: R_a + R_b = Δp∞/ΔQ; no known element needed.'
        : 'Pressure source: the upstream resistance R1 was given (one known element).',
      'resistance = R_a + R_b and compliance = C1 + C2 in the summary.',
    ],
    warnings,
  };
}
