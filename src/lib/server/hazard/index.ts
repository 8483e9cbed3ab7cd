/**
 * Beamwarden hazard engine — public API. Pure TypeScript on float64 (see constants.ts for why that
 * is enough): no database, no environment, no framework imports, so it runs the same in the server,
 * in tests and in scripts. Inputs are the one beam-path shape of `$lib/schemas/assessment`; results
 * are the plain data of `$lib/assessmentResult`.
 */
export { evaluate, type EvaluateOptions } from './evaluate';
export { ENGINE_VERSION, PLANCK_CONSTANT, SPEED_OF_LIGHT, ELEMENTARY_CHARGE, RATIO_TOLERANCE, AVERSION_DURATION, INVISIBLE_DEFAULT_DURATION } from './constants';
export { lineProblems, limitProblems } from './validate';
export { photonEnergy, joulesToElectronvolts } from './photon';
export { toOneOverE, fromOneOverE, propagatedDiameter } from './beam';
export { focalSpotDiameter, lensDivergence } from './walk';
export { requiredOpticalDensity } from './density';
export type * from '$lib/assessmentResult';
