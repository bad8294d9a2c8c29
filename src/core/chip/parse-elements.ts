/** Reading the flow-path elements of a chip description (schema: docs/chip-description.md). */
import type { InputError } from '../errors';
import { findMaterial, MATERIAL_IDS, shoreAToModulusPa } from '../nominal/materials';
import type { ValueRange } from '../nominal/range';
import type { LocatedJson } from '../json/located-json';
import type { DocumentReader, ObjectReader } from './reader';
import type { ElasticMaterial, ElementOrigin, PathElement } from './types';

export const ELEMENT_TYPES = [
  'rectangular-channel',
  'circular-channel',
  'tubing',
  'chamber',
  'reservoir',
  'dead-volume',
  'syringe',
  'measured',
  'parallel',
] as const;

/**
 * Syringe compliance presets, m³/Pa [low, nominal, high]. Common practice, no source [P]: plastic
 * barrels with elastomer plungers are soft and poorly known, glass gas-tight syringes much stiffer
 * (physics.md §6). Order of magnitude only — measure your own syringe if it matters.
 */
export const SYRINGE_COMPLIANCE_PRESETS: Record<'glass' | 'plastic', ValueRange> = {
  plastic: { low: 1e-14, nominal: 1e-13, high: 1e-12 },
  glass: { low: 1e-16, nominal: 1e-15, high: 1e-14 },
};

const COMMON = ['type', 'label'];

/** Reads the material of a tube: a table id, or "custom" with a modulus. */
export function readMaterial(o: ObjectReader, defaultId?: string): ElasticMaterial {
  const choices = [...MATERIAL_IDS, 'custom'];
  const id = (defaultId === undefined ? o.string('material', true, choices) : (o.string('material', false, choices) ?? defaultId)) as string;
  const given = o.range('modulus', 'pressure', { positive: true });
  const poissonGiven = o.has('poisson') ? o.number('poisson', 0, 0.5) : undefined;
  if (o.has('shoreA')) {
    if (id !== 'custom' || given) {
      throw o.doc.error('shore-a-conflict', o.child('shoreA'), o.get('shoreA', true).pos, '"shoreA" is only for "material": "custom" without a "modulus"', 'Remove "shoreA", or set "material" to "custom" and drop "modulus"');
    }
    const e = shoreAToModulusPa(o.number('shoreA', 10, 90));
    // Gent (1958) relation, about ±50 % (physics.md §3.8 [M]).
    return { id, label: `elastomer, Shore A ${o.number('shoreA', 10, 90)}`, modulusPa: { low: e * 0.5, nominal: e, high: e * 1.5 }, poisson: poissonGiven ?? 0.49, tag: 'M', source: 'modulus from Shore A hardness, Gent (1958) [M], ±50 %' };
  }
  if (id === 'custom') {
    if (!given) throw o.doc.error('missing-member', o.path, o.pos, 'a custom material needs a "modulus" (or, for elastomer tubing, "shoreA")', 'Add "modulus", e.g. "5 MPa" or { "low": "3 MPa", "nominal": "5 MPa", "high": "8 MPa" }');
    return { id, label: 'custom material', modulusPa: given, poisson: poissonGiven ?? 0.45, tag: 'U', source: 'user-supplied modulus' + (poissonGiven === undefined ? '; Poisson ratio 0.45 assumed [P]' : '') };
  }
  const m = findMaterial(id);
  if (!m) throw o.doc.error('unknown-choice', o.child('material'), o.pos, `unknown material "${id}"`, `Use one of: ${choices.join(', ')}`);
  return {
    id,
    label: m.label,
    modulusPa: given ?? m.modulusPa,
    poisson: poissonGiven ?? m.poisson,
    tag: given ? 'U' : m.tag,
    source: given ? 'user-supplied modulus' : m.source,
  };
}

/** Reads a list of elements in series; problems are collected into `errors` element by element. */
export function readSeries(doc: DocumentReader, items: Array<{ node: LocatedJson; path: string }>, errors: InputError[]): PathElement[] {
  const out: PathElement[] = [];
  for (const { node, path } of items) {
    try {
      out.push(readElement(doc, node, path, errors));
    } catch (e) {
      if (e instanceof Error && e.name === 'InputError') errors.push(e as InputError);
      else throw e;
    }
  }
  return out;
}

function readElement(doc: DocumentReader, node: LocatedJson, path: string, errors: InputError[]): PathElement {
  const peek = doc.object(node, path, [...COMMON, 'width', 'height', 'length', 'diameter', 'innerDiameter', 'outerDiameter', 'material', 'modulus', 'poisson', 'shoreA', 'ends', 'tolerance', 'volume', 'gasVolume', 'liquidVolume', 'headspaceIsSource', 'resistance', 'compliance', 'kind', 'branches']);
  const type = peek.string('type', true, ELEMENT_TYPES) as (typeof ELEMENT_TYPES)[number];
  const origin: ElementOrigin = { jsonPath: path, line: node.pos.line, column: node.pos.column };
  const label = peek.string('label') ?? `${path.replace(/^\$\.path\./, '')} ${type}`;
  const allowed = (extra: string[]): ObjectReader => doc.object(node, path, [...COMMON, ...extra]);
  switch (type) {
    case 'rectangular-channel': {
      const o = allowed(['width', 'height', 'length', 'tolerance']);
      return {
        type, label, origin,
        widthM: o.quantity('width', 'length', { required: true, positive: true }),
        heightM: o.quantity('height', 'length', { required: true, positive: true }),
        lengthM: o.quantity('length', 'length', { required: true, positive: true }),
        dimensionTolerance: o.number('tolerance', 0, 0.5, 0),
      };
    }
    case 'circular-channel': {
      const o = allowed(['diameter', 'length', 'tolerance']);
      return {
        type, label, origin,
        diameterM: o.quantity('diameter', 'length', { required: true, positive: true }),
        lengthM: o.quantity('length', 'length', { required: true, positive: true }),
        dimensionTolerance: o.number('tolerance', 0, 0.5, 0),
      };
    }
    case 'tubing': {
      const o = allowed(['innerDiameter', 'outerDiameter', 'length', 'material', 'modulus', 'poisson', 'shoreA', 'ends', 'tolerance']);
      const innerDiameterM = o.quantity('innerDiameter', 'length', { required: true, positive: true });
      const outerDiameterM = o.quantity('outerDiameter', 'length', { required: true, positive: true });
      if (!(outerDiameterM > innerDiameterM)) {
        const n = o.get('outerDiameter', true);
        throw doc.error('bad-geometry', `${path}.outerDiameter`, n.pos, 'the outer diameter must be larger than the inner diameter', 'Check the two diameters (ID is the bore, OD the outside)');
      }
      return {
        type, label, origin, innerDiameterM, outerDiameterM,
        lengthM: o.quantity('length', 'length', { required: true, positive: true }),
        material: readMaterial(o),
        ends: (o.string('ends', false, ['open', 'capped', 'plane-strain']) ?? 'open') as 'open' | 'capped' | 'plane-strain',
        dimensionTolerance: o.number('tolerance', 0, 0.5, 0),
      };
    }
    case 'chamber': {
      const o = allowed(['volume', 'width', 'height', 'length', 'gasVolume']);
      const gasVolumeM3 = o.quantity('gasVolume', 'volume', { min: 0 }) ?? 0;
      const hasBox = o.has('width') || o.has('height') || o.has('length');
      if (hasBox === o.has('volume')) {
        throw doc.error('chamber-size', path, node.pos, hasBox ? 'give either "volume" or "width"/"height"/"length", not both' : 'a chamber needs a "volume" or its "width", "height" and "length"', 'Box dimensions also give the chamber’s resistance and wall compliance');
      }
      if (hasBox) {
        const box = {
          widthM: o.quantity('width', 'length', { required: true, positive: true }),
          heightM: o.quantity('height', 'length', { required: true, positive: true }),
          lengthM: o.quantity('length', 'length', { required: true, positive: true }),
        };
        return { type, label, origin, liquidVolumeM3: box.widthM * box.heightM * box.lengthM, gasVolumeM3, box };
      }
      return { type, label, origin, liquidVolumeM3: o.quantity('volume', 'volume', { required: true, min: 0 }), gasVolumeM3 };
    }
    case 'reservoir': {
      const o = allowed(['liquidVolume', 'gasVolume', 'headspaceIsSource']);
      return {
        type, label, origin,
        liquidVolumeM3: o.quantity('liquidVolume', 'volume', { required: true, min: 0 }),
        gasVolumeM3: o.quantity('gasVolume', 'volume', { min: 0 }) ?? 0,
        headspaceIsSource: o.boolean('headspaceIsSource', false),
      };
    }
    case 'dead-volume': {
      const o = allowed(['volume', 'resistance']);
      const resistance = o.range('resistance', 'resistance', { positive: false });
      return { type, label, origin, volumeM3: o.quantity('volume', 'volume', { required: true, min: 0 }), ...(resistance ? { resistancePaSPerM3: resistance } : {}) };
    }
    case 'syringe': {
      const o = allowed(['liquidVolume', 'kind', 'compliance']);
      const given = o.range('compliance', 'compliance', { positive: true });
      const kind = (given ? o.string('kind', false, ['glass', 'plastic']) : o.string('kind', true, ['glass', 'plastic'])) as 'glass' | 'plastic' | undefined;
      return {
        type, label, origin,
        liquidVolumeM3: o.quantity('liquidVolume', 'volume', { required: true, min: 0 }),
        compliance: given ? { kind: 'given', complianceM3PerPa: given } : { kind: kind as 'glass' | 'plastic', complianceM3PerPa: SYRINGE_COMPLIANCE_PRESETS[kind as 'glass' | 'plastic'] },
      };
    }
    case 'measured': {
      const o = allowed(['resistance', 'compliance']);
      const r = o.range('resistance', 'resistance', {});
      const c = o.range('compliance', 'compliance', {});
      if (!r && !c) throw doc.error('measured-empty', path, node.pos, 'a measured element needs a "resistance", a "compliance" or both', 'Add the measured value(s), e.g. "resistance": "0.5 mbar/(uL/min)"');
      return { type, label, origin, ...(r ? { resistancePaSPerM3: r } : {}), ...(c ? { complianceM3PerPa: c } : {}) };
    }
    case 'parallel': {
      const o = allowed(['branches']);
      const branchesNode = o.array('branches', true) ?? [];
      if (branchesNode.length < 2) throw doc.error('parallel-branches', `${path}.branches`, o.get('branches', true).pos, 'a parallel group needs at least two branches', 'Give each branch as a list of elements: "branches": [[…], […]]');
      const branches = branchesNode.map(({ node: b, path: bp }) => {
        if (b.kind !== 'array') throw doc.error('expected-list', bp, b.pos, 'each branch must be a list of elements in series', 'Wrap the branch in square brackets: [ { … }, { … } ]');
        if (b.items.length === 0) throw doc.error('empty-branch', bp, b.pos, 'a branch without elements', 'Add at least one element to the branch, or remove it');
        return readSeries(doc, b.items.map((item, i) => ({ node: item, path: `${bp}[${i}]` })), errors);
      });
      return { type, label, origin, branches };
    }
  }
}
