/** Public API of the trapped-air layer: gas volume from excess compliance, the pressure fingerprint, trends. */
export type { TrappedAirEstimate, TrappedAirMethod } from './types';
export {
  GAMMA_AIR,
  adiabaticGasCompliance,
  adiabaticVolumeFromCompliance,
  isothermalGasCompliance,
  isothermalVolumeFromCompliance,
  volumeAtPressure,
} from './gas-compliance';
export type { GasConditions } from './gas-compliance';
export { airVolumeFromExcess, excessCompliance } from './excess-compliance';
export type { AirVolumeConditions, AirVolumeFromExcess, ExcessCompliance, NominalCompliance } from './excess-compliance';
export { pressureFingerprint } from './pressure-fingerprint';
export type { CompliancePoint, FingerprintOptions, PressureFingerprint } from './pressure-fingerprint';
export { linearTrend } from './trend';
export type { Trend, TrendPoint } from './trend';
export { fitWeightedLine } from './weighted-line';
export type { LineFit, LinePoint } from './weighted-line';
