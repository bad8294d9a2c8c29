/**
 * The chip description in SI, as produced by `parseChipDescription` and consumed by the nominal
 * prediction and the lumped-network simulator. Field meanings: docs/chip-description.md.
 */
import type { FluidSpec } from '../fluids/types';
import type { ValueRange } from '../nominal/range';
import type { TubeEnds } from '../nominal/compliance';
import type { PressureRatingsPa } from '../safety';

/** Where an element came from in the file, for messages. */
export interface ElementOrigin {
  /** JSON path such as `path.chip[2]`. */
  jsonPath: string;
  line: number;
  column: number;
}

/** An elastic material with a modulus range (Pa) and Poisson ratio. */
export interface ElasticMaterial {
  /** Table id (`ptfe`, `pdms`, …) or `custom`. */
  id: string;
  label: string;
  modulusPa: ValueRange;
  poisson: number;
  /** Status tag of the modulus (physics.md): S, M, P, or U for user-given. */
  tag: string;
  source: string;
}

/** The chip body: soft (elastomer, shallow-channel bulging) or rigid (thin-lid plate bound). */
export type ChipBody =
  | {
      kind: 'elastomer';
      material: ElasticMaterial;
      /** Gervais et al. (2006) deformation constant α: uncertain [M]; a fitted value narrows it. */
      deformationAlpha: ValueRange;
      alphaTag: string;
    }
  | {
      kind: 'rigid';
      material: ElasticMaterial;
      /** Thickness of the thinnest wall closing the channels (the lid), m. */
      lidThicknessM: number;
    };

interface ElementBase {
  /** The user's label, or one made from the position (`chip[0] rectangular-channel`). */
  label: string;
  origin: ElementOrigin;
}

/** Relative manufacturing tolerance of cross-section dimensions (0.05 = ±5 %); 0 when not given. */
interface Tolerance {
  dimensionTolerance: number;
}

export interface RectangularChannel extends ElementBase, Tolerance {
  type: 'rectangular-channel';
  widthM: number;
  heightM: number;
  lengthM: number;
}

/** A round bore inside the chip body (its walls are the chip material). */
export interface CircularChannel extends ElementBase, Tolerance {
  type: 'circular-channel';
  diameterM: number;
  lengthM: number;
}

export interface Tubing extends ElementBase, Tolerance {
  type: 'tubing';
  innerDiameterM: number;
  outerDiameterM: number;
  lengthM: number;
  material: ElasticMaterial;
  ends: TubeEnds;
}

/** A chamber in the chip: by volume, or by box dimensions (then it also has R and wall compliance). */
export interface Chamber extends ElementBase {
  type: 'chamber';
  liquidVolumeM3: number;
  gasVolumeM3: number;
  box?: { widthM: number; heightM: number; lengthM: number };
}

/** An off-chip reservoir (vial, well) with optional gas headspace. */
export interface Reservoir extends ElementBase {
  type: 'reservoir';
  liquidVolumeM3: number;
  gasVolumeM3: number;
  /** Headspace pressurised by the regulator itself: part of the source, not a compliance. */
  headspaceIsSource: boolean;
}

/** Fittings, connectors, valves, sensors: a volume and optionally a stated resistance. */
export interface DeadVolume extends ElementBase {
  type: 'dead-volume';
  volumeM3: number;
  resistancePaSPerM3?: ValueRange;
}

export interface Syringe extends ElementBase {
  type: 'syringe';
  liquidVolumeM3: number;
  /** Given by the user, or a preset range for the syringe kind. */
  compliance: { kind: 'glass' | 'plastic' | 'given'; complianceM3PerPa: ValueRange };
}

/** Values measured by the user (e.g. a sensor's datasheet R, a compliance from a previous fit). */
export interface MeasuredElement extends ElementBase {
  type: 'measured';
  resistancePaSPerM3?: ValueRange;
  complianceM3PerPa?: ValueRange;
}

export interface ParallelGroup extends ElementBase {
  type: 'parallel';
  /** Each branch is a series list of elements. */
  branches: PathElement[][];
}

export type PathElement =
  | RectangularChannel
  | CircularChannel
  | Tubing
  | Chamber
  | Reservoir
  | DeadVolume
  | Syringe
  | MeasuredElement
  | ParallelGroup;

/** Sections of the flow path; the compliant node sits between `upstream` and `chip`. */
export type PathSection = 'upstream' | 'chip' | 'downstream';

export interface ChipDescription {
  fileName: string;
  name: string;
  note: string;
  fluid: FluidSpec;
  ambientPressurePa: number;
  /** Gauge pressure at the compliant node during the measurement, Pa (sets gas compliance). */
  operatingPressurePa: number;
  body: ChipBody;
  path: Record<PathSection, PathElement[]>;
  /** Maximum gauge pressures stated by the user, Pa. */
  ratingsPa: PressureRatingsPa;
}
