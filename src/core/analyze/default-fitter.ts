/** The fitter the pipeline uses outside tests: src/core/fit. */
import { fitTransient } from '../fit/transient';
import type { Fitter } from './types';

export const defaultFitter: Fitter = { fitTransient };
