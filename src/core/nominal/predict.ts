/**
 * Nominal prediction: from a chip description to R (with range), C broken down by source (with
 * ranges), and τ, t₉₅ for the chosen set-up. Formulas in resistance.ts / compliance.ts; physics.md §1–4.
 *
 * Lumping rule: all compliance of the `upstream` and `chip` sections sits at one node between the
 * upstream section and the chip (physics.md §3.1); compliance of the `downstream` section is listed
 * but not counted (it sees little pressure). This overstates the slowest time constant of a truly
 * distributed line (physics.md §3.7) — see docs/chip-description.md.
 */
import type { ChipDescription, PathElement, PathSection } from '../chip/types';
import type { Warning } from '../errors';
import { resolveFluid } from '../fluids/presets';
import type { FluidProperties } from '../fluids/types';
import {
  AIR_HEAT_CAPACITY_RATIO,
  boreInBlockCompliance,
  gasCompliance,
  lameTubeCompliance,
  lidPlateCompliance,
  liquidCompliance,
  shallowChannelWallCompliance,
} from './compliance';
import { sumRanges, type ValueRange } from './range';
import { circularResistancePaSPerM3, parallelResistance, rectangularResistancePaSPerM3 } from './resistance';
import type { ComplianceItem, NominalPrediction, ResistanceItem, Setup } from './types';

/** t₉₅ / τ for a first-order response: −ln(0.05) (physics.md §4.1: 2.9957). */
export const T95_PER_TAU = Math.log(20);

export interface PredictOptions {
  /** Overrides the description's operating (gauge) pressure at the node, Pa. */
  operatingPressurePa?: number;
}

interface Context {
  chip: ChipDescription;
  fluid: FluidProperties;
  nodeAbsolutePa: number;
  compliances: ComplianceItem[];
  resistances: ResistanceItem[];
  warnings: Warning[];
}

/** R over a range: low uses low viscosity and dimensions enlarged by the tolerance, high the reverse. */
function rangeR(ctx: Context, tol: number, r: (mu: number, scale: number) => number): ValueRange {
  const mu = ctx.fluid.viscosityPaS;
  return { low: r(mu.low, 1 + tol), nominal: r(mu.nominal, 1), high: r(mu.high, 1 - tol) };
}

function liquidItem(ctx: Context, e: PathElement, section: PathSection, volumeM3: number, counted: boolean): void {
  if (volumeM3 <= 0) return;
  const k = ctx.fluid.compressibilityPerPa;
  ctx.compliances.push({
    element: e.label, jsonPath: e.origin.jsonPath, section, source: 'liquid',
    method: `V·κ_T with V = ${(volumeM3 * 1e9).toPrecision(3)} µL`,
    tag: ctx.fluid.compressibilityTag,
    complianceM3PerPa: { low: liquidCompliance(volumeM3, k.low), nominal: liquidCompliance(volumeM3, k.nominal), high: liquidCompliance(volumeM3, k.high) },
    counted,
  });
}

function gasItem(ctx: Context, e: PathElement, section: PathSection, volumeM3: number, counted: boolean, note?: string): void {
  if (volumeM3 <= 0) return;
  const p = ctx.nodeAbsolutePa;
  const pv = ctx.fluid.vapourPressurePa ?? 0;
  ctx.compliances.push({
    element: e.label, jsonPath: e.origin.jsonPath, section, source: 'gas',
    method: `isothermal V/p_abs at ${(p / 1e5).toFixed(3)} bar abs; low: adiabatic V/(γp), γ = ${AIR_HEAT_CAPACITY_RATIO}; high: vapour-saturated V/(p − p_v)`,
    tag: 'D',
    // Vapour bound only where it is defined (p_abs above the vapour pressure); otherwise isothermal.
    complianceM3PerPa: { low: gasCompliance(volumeM3, p, 'adiabatic'), nominal: gasCompliance(volumeM3, p), high: p > pv ? volumeM3 / (p - pv) : gasCompliance(volumeM3, p) },
    counted,
    ...(note ? { note } : {}),
  });
}

/** Wall compliance of a rectangular channel or box chamber in the chip body. */
function channelWallItem(ctx: Context, e: PathElement, section: PathSection, widthM: number, heightM: number, lengthM: number, counted: boolean): void {
  const body = ctx.chip.body;
  const span = Math.max(widthM, heightM);
  const E = body.material.modulusPa;
  if (body.kind === 'elastomer') {
    const a = body.deformationAlpha;
    ctx.compliances.push({
      element: e.label, jsonPath: e.origin.jsonPath, section, source: 'channel-wall',
      method: `shallow-channel bulging α w² L / E, α ${a.low}–${a.high} (nominal ${a.nominal}), E ${(E.low / 1e6).toPrecision(3)}–${(E.high / 1e6).toPrecision(3)} MPa (Gervais et al., Lab Chip 6, 500 (2006))`,
      tag: body.alphaTag === 'U' ? body.material.tag : 'M',
      complianceM3PerPa: {
        low: shallowChannelWallCompliance(span, lengthM, E.high, a.low),
        nominal: shallowChannelWallCompliance(span, lengthM, E.nominal, a.nominal),
        high: shallowChannelWallCompliance(span, lengthM, E.low, a.high),
      },
      counted,
      ...(Math.min(widthM, heightM) / span > 0.5 ? { note: 'The bulging model is for shallow channels (h ≪ w); this one is not shallow, so treat the value as a rough bound.' } : {}),
    });
    return;
  }
  const t = body.lidThicknessM;
  const nu = body.material.poisson;
  ctx.compliances.push({
    element: e.label, jsonPath: e.origin.jsonPath, section, source: 'channel-wall',
    method: `thin-lid plate (1 − ν²) w⁵ L / (60 E t³), t = ${(t * 1e3).toPrecision(3)} mm, clamped (nominal) to simply supported (high); low 0`,
    tag: 'D',
    complianceM3PerPa: {
      low: 0,
      nominal: lidPlateCompliance(span, lengthM, t, E.nominal, nu, 'clamped'),
      high: lidPlateCompliance(span, lengthM, t, E.low, nu, 'simply-supported'),
    },
    counted,
    note: 'Rigid body: an upper-bound estimate; usually negligible next to tubing or gas.',
  });
}

function resistanceItem(ctx: Context, e: PathElement, section: PathSection, method: string, r: ValueRange): ValueRange {
  ctx.resistances.push({ element: e.label, jsonPath: e.origin.jsonPath, section, method, resistancePaSPerM3: r });
  return r;
}

/** Walks a series list; returns its resistance range and records compliances. */
function walkSeries(ctx: Context, elements: readonly PathElement[], section: PathSection, counted: boolean): ValueRange {
  const parts: ValueRange[] = [];
  for (const e of elements) {
    const r = walkElement(ctx, e, section, counted);
    if (r) parts.push(r);
  }
  return sumRanges(parts);
}

function walkElement(ctx: Context, e: PathElement, section: PathSection, counted: boolean): ValueRange | null {
  switch (e.type) {
    case 'rectangular-channel': {
      liquidItem(ctx, e, section, e.widthM * e.heightM * e.lengthM, counted);
      channelWallItem(ctx, e, section, e.widthM, e.heightM, e.lengthM, counted);
      return resistanceItem(ctx, e, section, 'exact rectangular Fourier series, 50 odd terms (Bruus 2008, ch. 2)',
        rangeR(ctx, e.dimensionTolerance, (mu, s) => rectangularResistancePaSPerM3(mu, e.widthM * s, e.heightM * s, e.lengthM)));
    }
    case 'circular-channel': {
      liquidItem(ctx, e, section, (Math.PI * e.diameterM ** 2 * e.lengthM) / 4, counted);
      const m = ctx.chip.body.material;
      ctx.compliances.push({
        element: e.label, jsonPath: e.origin.jsonPath, section, source: 'channel-wall',
        method: `bore in a block (2π a² L / E)(1 + ν), E of ${m.label} (Lamé, b → ∞)`,
        tag: m.tag,
        complianceM3PerPa: {
          low: boreInBlockCompliance(e.diameterM, e.lengthM, m.modulusPa.high, m.poisson),
          nominal: boreInBlockCompliance(e.diameterM, e.lengthM, m.modulusPa.nominal, m.poisson),
          high: boreInBlockCompliance(e.diameterM, e.lengthM, m.modulusPa.low, m.poisson),
        },
        counted,
      });
      return resistanceItem(ctx, e, section, 'Hagen–Poiseuille 8μL/(πa⁴)',
        rangeR(ctx, e.dimensionTolerance, (mu, s) => circularResistancePaSPerM3(mu, e.diameterM * s, e.lengthM)));
    }
    case 'tubing': {
      liquidItem(ctx, e, section, (Math.PI * e.innerDiameterM ** 2 * e.lengthM) / 4, counted);
      const m = e.material;
      const c = (E: number): number => lameTubeCompliance(e.innerDiameterM, e.outerDiameterM, e.lengthM, E, m.poisson, e.ends);
      ctx.compliances.push({
        element: e.label, jsonPath: e.origin.jsonPath, section, source: 'tubing-wall',
        method: `Lamé thick-walled cylinder, ${e.ends} ends, ${m.label}, E ${fmtModulus(m.modulusPa.low)}–${fmtModulus(m.modulusPa.high)} (Timoshenko & Goodier 1970, §33)`,
        tag: m.tag,
        complianceM3PerPa: { low: c(m.modulusPa.high), nominal: c(m.modulusPa.nominal), high: c(m.modulusPa.low) },
        counted,
        ...(m.modulusPa.nominal < 1e8 ? { note: 'Soft tubing is non-linear above ~10 % strain and creeps: its C depends on pressure level and time scale.' } : {}),
      });
      return resistanceItem(ctx, e, section, 'Hagen–Poiseuille 8μL/(πa⁴)',
        rangeR(ctx, e.dimensionTolerance, (mu, s) => circularResistancePaSPerM3(mu, e.innerDiameterM * s, e.lengthM)));
    }
    case 'chamber': {
      liquidItem(ctx, e, section, e.liquidVolumeM3, counted);
      gasItem(ctx, e, section, e.gasVolumeM3, counted);
      if (!e.box) return null;
      const b = e.box;
      channelWallItem(ctx, e, section, b.widthM, b.heightM, b.lengthM, counted);
      return resistanceItem(ctx, e, section, 'exact rectangular Fourier series (Bruus 2008, ch. 2)',
        rangeR(ctx, 0, (mu) => rectangularResistancePaSPerM3(mu, b.widthM, b.heightM, b.lengthM)));
    }
    case 'reservoir': {
      liquidItem(ctx, e, section, e.liquidVolumeM3, counted && !e.headspaceIsSource);
      gasItem(ctx, e, section, e.gasVolumeM3, counted && !e.headspaceIsSource,
        e.headspaceIsSource ? 'Headspace pressurised by the source: part of the source, not counted.' : undefined);
      return null;
    }
    case 'dead-volume': {
      liquidItem(ctx, e, section, e.volumeM3, counted);
      return e.resistancePaSPerM3 ? resistanceItem(ctx, e, section, 'stated by the user', e.resistancePaSPerM3) : null;
    }
    case 'syringe': {
      liquidItem(ctx, e, section, e.liquidVolumeM3, counted);
      ctx.compliances.push({
        element: e.label, jsonPath: e.origin.jsonPath, section, source: 'syringe',
        method: e.compliance.kind === 'given' ? 'stated by the user' : `preset range for a ${e.compliance.kind} syringe (order of magnitude only)`,
        tag: e.compliance.kind === 'given' ? 'U' : 'P',
        complianceM3PerPa: e.compliance.complianceM3PerPa,
        counted,
        ...(e.compliance.kind === 'given' ? {} : { note: 'Common practice, no source [P]: measure the syringe if it dominates.' }),
      });
      return null;
    }
    case 'measured': {
      if (e.complianceM3PerPa) {
        ctx.compliances.push({ element: e.label, jsonPath: e.origin.jsonPath, section, source: 'measured', method: 'stated by the user', tag: 'U', complianceM3PerPa: e.complianceM3PerPa, counted });
      }
      return e.resistancePaSPerM3 ? resistanceItem(ctx, e, section, 'stated by the user', e.resistancePaSPerM3) : null;
    }
    case 'parallel': {
      const branchR = e.branches.map((b) => walkSeries(ctx, b, section, counted));
      if (branchR.some((r) => r.nominal === 0)) {
        ctx.warnings.push({ code: 'parallel-branch-without-resistance', message: `${e.label}: a branch has no resistance and short-circuits the group.`, location: { line: e.origin.line, column: e.origin.column } });
      }
      return {
        low: parallelResistance(branchR.map((r) => r.low)),
        nominal: parallelResistance(branchR.map((r) => r.nominal)),
        high: parallelResistance(branchR.map((r) => r.high)),
      };
    }
  }
}

function fmtModulus(pa: number): string {
  return pa >= 1e9 ? `${(pa / 1e9).toPrecision(3)} GPa` : `${(pa / 1e6).toPrecision(3)} MPa`;
}

/** R_up ∥ R_down, with 0 when either is 0 (an ideal source or outlet holds the node). */
function parallelPair(a: number, b: number): number {
  return a === 0 || b === 0 ? 0 : (a * b) / (a + b);
}

/**
 * Predicts nominal R, C (by source) and τ, t₉₅ for a set-up.
 * Flow-driven: τ = R_down · C (physics.md §4.2). Pressure-driven: τ = C · R_up R_down/(R_up + R_down) (§4.3).
 */
export function predictNominal(chip: ChipDescription, setup: Setup, options: PredictOptions = {}): NominalPrediction {
  const fluid = resolveFluid(chip.fluid);
  const operatingPressurePa = options.operatingPressurePa ?? chip.operatingPressurePa;
  const ctx: Context = {
    chip, fluid, nodeAbsolutePa: chip.ambientPressurePa + operatingPressurePa,
    compliances: [], resistances: [], warnings: [],
  };
  if (!(ctx.nodeAbsolutePa > 0)) {
    ctx.warnings.push({ code: 'non-positive-absolute-pressure', message: 'The absolute pressure at the node is not positive; gas compliances are meaningless.' });
  }
  const up = walkSeries(ctx, chip.path.upstream, 'upstream', true);
  const chipR = walkSeries(ctx, chip.path.chip, 'chip', true);
  const downOnly = walkSeries(ctx, chip.path.downstream, 'downstream', false);
  const down = sumRanges([chipR, downOnly]);
  const total = sumRanges([up, down]);
  const thevenin: ValueRange =
    setup === 'flow-driven'
      ? down
      : { low: parallelPair(up.low, down.low), nominal: parallelPair(up.nominal, down.nominal), high: parallelPair(up.high, down.high) };
  if (setup === 'pressure-driven' && up.nominal === 0) {
    ctx.warnings.push({
      code: 'no-upstream-resistance',
      message: 'Pressure-driven set-up with no resistance upstream of the node: an ideal source holds the node, so τ = 0 here. Add the supply tubing or sensor to "upstream" (or a measured element).',
    });
  }
  const counted = ctx.compliances.filter((c) => c.counted);
  const totalC = sumRanges(counted.map((c) => c.complianceM3PerPa));
  const tau: ValueRange = { low: totalC.low * thevenin.low, nominal: totalC.nominal * thevenin.nominal, high: totalC.high * thevenin.high };
  const notes = [
    'All counted compliance is lumped at one node between the upstream section and the chip; for a long soft line the slowest true time constant is shorter (up to π²/4 = 2.47×; see docs/chip-description.md).',
    'Ranges are bounds from stated property uncertainty, added bound by bound (a worst-case interval, not a confidence interval).',
  ];
  if (ctx.compliances.some((c) => c.tag === 'M' || c.tag === 'P')) {
    notes.push('Some compliance inputs are from memory [M] or common practice [P] (e.g. the bulging constant α, syringe presets); their ranges are deliberately wide.');
  }
  if (ctx.compliances.some((c) => c.section === 'downstream')) {
    notes.push('Compliance of the downstream section is listed but not counted: downstream of the chip it sees little pressure.');
  }
  notes.push(...fluid.notes);
  return {
    setup,
    fluid,
    ambientPressurePa: chip.ambientPressurePa,
    operatingPressurePa,
    nodeAbsolutePressurePa: ctx.nodeAbsolutePa,
    resistance: { upstreamPaSPerM3: up, chipPaSPerM3: chipR, downstreamPaSPerM3: down, totalPaSPerM3: total, theveninPaSPerM3: thevenin, items: ctx.resistances },
    compliance: { totalM3PerPa: totalC, breakdown: ctx.compliances },
    tauS: tau,
    t95S: { low: tau.low * T95_PER_TAU, nominal: tau.nominal * T95_PER_TAU, high: tau.high * T95_PER_TAU },
    warnings: ctx.warnings,
    notes,
  };
}

