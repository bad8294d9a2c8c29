/** Step detection on drive or response channels, and user step lists. */
export type { Step, StepDetection, StepDetectionOptions, StepShape, Ramp, Setup } from './types';
export { detectSteps, DEFAULT_DWELL_S } from './detect';
export { chooseSetup, driveChannel, responseChannel, SETUP_QUANTITIES, type SetupChoice } from './choose-channel';
export { findLevelChanges, SETTLING_SHAPE_RATIO, type LevelChanges, type LevelStep } from './level-changes';
export { parseStepList, type StepList, type ProgramEntry } from './step-list';
export { stepsFromProgram, rampsFromProgram } from './program';
export { noiseSigmaFromDifferences, medianOfSlice } from './robust';
