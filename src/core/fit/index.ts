/**
 * Transient fitting (public API of src/core/fit). See DEVELOPERS.md, "Fitting".
 * - fitTransient / evaluateTransient: one step-response window (types in ./types).
 * - fitSharedTaus: several windows with common time constants.
 * - solveLeastSquares / solveSeparable / covarianceFromJacobian: the general engine.
 */
export * from './types';
export { fitTransient, evaluateTransient } from './transient';
export { fitSharedTaus } from './shared-taus';
export { solveLeastSquares, type LeastSquaresProblem, type LeastSquaresOptions, type LeastSquaresResult } from './least-squares';
export { solveSeparable, type SeparableProblem, type SeparableResult } from './separable';
export { covarianceFromJacobian, ci95, type CovarianceResult } from './covariance';
export { settlingTime } from './diagnostics';
