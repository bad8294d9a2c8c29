/** The fitter the pipeline uses outside tests: src/core/fit. */
import { fitSharedTaus, fitTransient } from '../fit/index';
import type { Fitter } from './types';

export const defaultFitter: Fitter = { fitTransient, fitSharedTaus };
