/** Public API of the circuit layer: R and C of the real set-up from fitted step responses. */
export type { CircuitEstimate, LevelEstimate, PhysicalEstimate, SetupKind } from './types';
export { estimateFlowDriven } from './flow-driven';
export type { FlowDrivenInput } from './flow-driven';
export { estimatePressureDriven } from './pressure-driven';
export type { PressureDrivenEstimate, PressureDrivenInput } from './pressure-driven';
export { complianceFromFlowBalance } from './flow-balance';
export type { FlowBalanceEstimate, FlowBalanceInput } from './flow-balance';
export { estimateLadder, ladderTimeConstants } from './ladder';
export type { LadderElements, LadderEstimate, LadderInput } from './ladder';
export { parameterSetFromFit, withIndependent } from './parameter-set';
export type { ParameterSet, ParameterReader } from './parameter-set';
export { estimateFrom, isInconclusivePositive, propagate } from './propagate';
export type { DerivedFunction } from './propagate';
export { monteCarloPropagate } from './monte-carlo';
export type { MonteCarloOptions, MonteCarloResult } from './monte-carlo';
export { parseResistance } from './parse-resistance';
export { SETUP_SCHEMATICS } from './schematics';
export type { SchematicName, SetupSchematic } from './schematics';
