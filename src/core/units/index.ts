/** Units: tables with their published sources, lookup of spellings, conversion to SI. */
export { STANDARD_GRAVITY_M_PER_S2, WATER_DENSITY_20C_KG_PER_M3 } from './constants';
export { PRESSURE_UNITS, type UnitDefinition } from './pressure-units';
export { FLOW_UNITS, HEAD_UNITS, TIME_UNITS } from './flow-units';
export { lookupUnit, normaliseUnitText, knownUnitSymbols, knownUnitsSentence, type FoundUnit, type UnitKind } from './lookup';
export { factorToSi } from './convert';
