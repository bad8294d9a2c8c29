/** Nominal hydraulic resistance and compliance from geometry and materials, and the predicted τ. */
export * from './range';
export * from './resistance';
export * from './compliance';
export * from './materials';
export * from './types';
export { predictNominal, T95_PER_TAU, type PredictOptions } from './predict';
export { nominalPredictionToJson, type RangeJson } from './json';
