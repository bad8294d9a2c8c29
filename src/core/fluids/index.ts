/** Working-fluid properties: water formulations, glycerol–water, presets. */
export * from './water';
export * from './glycerol-water';
export * from './types';
export { resolveFluid } from './presets';
