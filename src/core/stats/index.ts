/** Statistics for the core: distributions, seeded random numbers, robust scale estimates. */
export { lnGamma, incompleteGamma, incompleteBeta } from './special';
export { normalCdf, normalPdf, normalQuantile } from './normal';
export { studentTCdf, studentTPdf, studentTQuantile } from './student-t';
export { fCdf, fSurvival, chiSquareCdf } from './f-dist';
export { createRng, type Rng } from './rng';
export { median, mad, madSigma, noiseSigmaFromDifferences, medianInPlace, MAD_TO_SIGMA } from './robust';
