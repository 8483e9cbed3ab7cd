/**
 * Beamwarden hazard engine — public API. Pure TypeScript on decimal.js: no database, no
 * environment, no framework imports, so it runs the same in the server, in tests and in scripts.
 */
export { assess } from './assess';
export { ENGINE_VERSION, PLANCK_CONSTANT, SPEED_OF_LIGHT, ELEMENTARY_CHARGE, Dec, WORKING_PRECISION, OUTPUT_SIGNIFICANT_DIGITS } from './constants';
export { photonEnergy, joulesToElectronvolts } from './photon';
export { toOneOverE, fromOneOverE, propagatedDiameter } from './beam';
export { focalSpotDiameter } from './elements';
export { criticalDiameter } from './distances';
export { suggestedNohdExposureDuration } from './suggest';
export type { HazardInputError } from './errors';
export type * from './types';
