/** QC sign-off core: spec, verdicts, lot statistics, control charts. Pure. */
export * from './types';
export * from './units';
export * from './format';
export { parseQcSpec, checkChipIdSource, KNOWN_FIT_FLAGS, type SpecIssue } from './spec';
export { parseJsonLocated, formatJsonPath, type JsonPath, type LocatedJson } from './json-locate';
export * from './verdict';
export * from './lot-stats';
export * from './control-chart';
export * from './lot-summary';
export { combineEstimates, fromCi } from './combine';
export { measurementFromAnalysis, readPhysicsQuantity, nominalComplianceParts } from './from-analysis';
export { stepCurves, modelCurve, type StepCurve } from './step-curves';
export { chipIdFor, fileStem } from './chip-id';
