/**
 * `parseChipDescription(text, fileName)`: JSON text → validated {@link ChipDescription} in SI.
 * Every problem is located (JSON path and line:column); all problems found are reported together.
 */
import { InputError } from '../errors';
import { FLUID_PRESETS, type FluidPresetName, type FluidSpec } from '../fluids/types';
import { resolveFluid } from '../fluids/presets';
import type { PressureRatingsPa, RatedPart } from '../safety';
import { parseLocatedJson, type LocatedJson } from '../json/located-json';
import { readMaterial, readSeries } from './parse-elements';
import { DocumentReader, type ObjectReader } from './reader';
import type { ChipBody, ChipDescription, PathElement, PathSection } from './types';

/** The format tag every chip description carries. */
export const CHIP_FORMAT = 'lagbench-chip/1';

/** Several located problems at once; `message` lists them all, `location` is the first one's. */
export class ChipDescriptionError extends InputError {
  constructor(readonly problems: InputError[]) {
    const first = problems[0] as InputError;
    super(first.code, first.problem, first.hint, first.location);
    if (problems.length > 1) {
      this.message = `${problems.length} problems in the chip description:\n` + problems.map((p) => `  ${p.message}`).join('\n');
    }
  }
}

const TOP = ['format', 'name', 'note', 'fluid', 'ambientPressure', 'operatingPressure', 'chipBody', 'path', 'ratings'];

/** The parts of the body that count as elastomers (shallow-channel bulging model applies). */
const ELASTOMERS = ['pdms', 'silicone'];

/**
 * Gervais et al. (2006) deformation constant α, range used when the user gives none:
 * order 0.1–1, about 0.3, from memory [M] (physics.md §3.6).
 */
export const DEFAULT_DEFORMATION_ALPHA = { low: 0.1, nominal: 0.3, high: 1 } as const;

/** Lid thickness assumed for rigid chips when none is given, m (common practice, no source [P]). */
export const DEFAULT_LID_THICKNESS_M = 1e-3;

/** Temperature tolerance assumed when none is given, K (common practice, no source [P]). */
export const DEFAULT_TEMPERATURE_TOLERANCE_K = 1;

function readFluid(o: ObjectReader): FluidSpec {
  const preset = o.string('preset', true, [...FLUID_PRESETS, 'custom']);
  const temperatureK = o.quantity('temperature', 'temperature', { required: true, positive: true });
  const tolerance = o.quantity('temperatureTolerance', 'temperature-difference', { min: 0 }) ?? DEFAULT_TEMPERATURE_TOLERANCE_K;
  if (preset === 'custom') {
    const kappa = o.quantity('compressibility', 'compressibility', { positive: true });
    const density = o.quantity('density', 'density', { positive: true });
    return {
      kind: 'custom',
      name: o.string('name') ?? 'custom fluid',
      temperatureK,
      viscosityPaS: o.quantity('viscosity', 'viscosity', { required: true, positive: true }),
      viscosityRelativeUncertainty: o.number('viscosityUncertainty', 0, 0.9, 0.05),
      ...(kappa === undefined ? {} : { compressibilityPerPa: kappa }),
      compressibilityRelativeUncertainty: o.number('compressibilityUncertainty', 0, 0.9, 0.1),
      ...(density === undefined ? {} : { densityKgPerM3: density }),
    };
  }
  if (preset === 'glycerol-water' && !o.has('glycerolMassFraction')) {
    o.get('glycerolMassFraction', true, 'Add "glycerolMassFraction", e.g. 0.5 for 50 wt % glycerol');
  }
  return {
    kind: 'preset',
    preset: preset as FluidPresetName,
    temperatureK,
    temperatureToleranceK: tolerance,
    ...(preset === 'glycerol-water' ? { glycerolMassFraction: o.number('glycerolMassFraction', 0, 1) } : {}),
  };
}

function readBody(o: ObjectReader): ChipBody {
  const material = readMaterial(o);
  const custom = material.id === 'custom';
  const kind = custom ? (o.string('kind', true, ['elastomer', 'rigid']) as 'elastomer' | 'rigid') : ELASTOMERS.includes(material.id) ? 'elastomer' : 'rigid';
  if (kind === 'elastomer') {
    const given = o.range('deformationAlpha', 'dimensionless', { positive: true });
    return { kind, material, deformationAlpha: given ?? { ...DEFAULT_DEFORMATION_ALPHA }, alphaTag: given ? 'U' : 'M' };
  }
  return { kind, material, lidThicknessM: o.quantity('lidThickness', 'length', { positive: true }) ?? DEFAULT_LID_THICKNESS_M };
}

function countResistive(elements: PathElement[]): number {
  let n = 0;
  for (const e of elements) {
    if (e.type === 'parallel') n += e.branches.reduce((s, b) => s + countResistive(b), 0);
    else if (['rectangular-channel', 'circular-channel', 'tubing'].includes(e.type) || (e.type === 'chamber' && e.box) || ('resistancePaSPerM3' in e && e.resistancePaSPerM3)) n++;
  }
  return n;
}

/**
 * Parses and validates a chip description (docs/chip-description.md). Throws InputError for JSON
 * syntax errors and ChipDescriptionError (an InputError) listing every schema problem found.
 */
export function parseChipDescription(text: string, fileName: string): ChipDescription {
  const root: LocatedJson = parseLocatedJson(text, fileName);
  const doc = new DocumentReader(fileName);
  const errors: InputError[] = [];
  const attempt = <T>(f: () => T): T | undefined => {
    try {
      return f();
    } catch (e) {
      if (e instanceof InputError) {
        errors.push(e);
        return undefined;
      }
      throw e;
    }
  };
  const top = doc.object(root, '$', TOP);
  const format = top.string('format', true);
  if (format !== CHIP_FORMAT) {
    throw doc.error('unknown-format', '$.format', top.get('format', true).pos, `unknown format "${format}"`, `This version reads "${CHIP_FORMAT}"`);
  }
  const fluidNode = top.get('fluid', true, 'Add "fluid", e.g. { "preset": "water", "temperature": "22 C" }');
  const fluid = attempt(() => {
    const spec = readFluid(doc.object(fluidNode, '$.fluid', ['preset', 'name', 'temperature', 'temperatureTolerance', 'glycerolMassFraction', 'viscosity', 'viscosityUncertainty', 'compressibility', 'compressibilityUncertainty', 'density']));
    try {
      resolveFluid(spec);
    } catch (e) {
      if (e instanceof InputError) throw new InputError(e.code, `$.fluid: ${e.problem}`, e.hint, { file: fileName, ...fluidNode.pos });
      throw e;
    }
    return spec;
  });
  const ambientPressurePa = attempt(() => top.quantity('ambientPressure', 'pressure', { positive: true }) ?? 101325);
  const operatingPressurePa = attempt(() => top.quantity('operatingPressure', 'pressure', {}) ?? 0);
  const bodyNode = top.get('chipBody', true, 'Add "chipBody", e.g. { "material": "pdms" } or { "material": "glass" }');
  const body = attempt(() => readBody(doc.object(bodyNode, '$.chipBody', ['material', 'kind', 'modulus', 'poisson', 'deformationAlpha', 'lidThickness'])));
  const ratingsPa: PressureRatingsPa = {};
  const ratingsNode = top.get('ratings');
  if (ratingsNode) {
    attempt(() => {
      const r = doc.object(ratingsNode, '$.ratings', ['chip', 'bonding', 'tubing', 'fittings']);
      for (const part of ['chip', 'bonding', 'tubing', 'fittings'] as RatedPart[]) {
        const v = attempt(() => r.quantity(part, 'pressure', { positive: true }));
        if (v !== undefined) ratingsPa[part] = v;
      }
    });
  }
  const pathNode = top.get('path', true, 'Add "path": { "upstream": [ … ], "chip": [ … ], "downstream": [ … ] }');
  const path: Record<PathSection, PathElement[]> = { upstream: [], chip: [], downstream: [] };
  attempt(() => {
    const p = doc.object(pathNode, '$.path', ['upstream', 'chip', 'downstream']);
    for (const section of ['upstream', 'chip', 'downstream'] as PathSection[]) {
      const items = attempt(() => p.array(section, section === 'chip'));
      if (items) path[section] = readSeries(doc, items, errors);
    }
    if (errors.length === 0 && countResistive([...path.upstream, ...path.chip, ...path.downstream]) === 0) {
      throw doc.error('no-resistance', '$.path', pathNode.pos, 'no element in the path has a hydraulic resistance', 'Add at least one channel, tubing or element with a "resistance"');
    }
  });
  if (errors.length > 0) throw new ChipDescriptionError(errors);
  return {
    fileName,
    name: top.string('name') ?? fileName,
    note: top.string('note') ?? '',
    fluid: fluid as FluidSpec,
    ambientPressurePa: ambientPressurePa as number,
    operatingPressurePa: operatingPressurePa as number,
    body: body as ChipBody,
    path,
    ratingsPa,
  };
}
