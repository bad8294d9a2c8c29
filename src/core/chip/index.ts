/** The chip description: located JSON parsing, units, validation, SI types. */
export * from './types';
export { parseChipDescription, ChipDescriptionError, CHIP_FORMAT, DEFAULT_DEFORMATION_ALPHA, DEFAULT_LID_THICKNESS_M, DEFAULT_TEMPERATURE_TOLERANCE_K } from './parse';
export { parseQuantity, type Dimension } from './quantity';
export { SYRINGE_COMPLIANCE_PRESETS, ELEMENT_TYPES } from './parse-elements';
export { parseLocatedJson, type LocatedJson, type JsonPosition } from '../json/located-json';
