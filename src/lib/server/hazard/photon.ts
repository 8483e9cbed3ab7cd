/** Photon quantities from the exact SI 2019 constants. */
import { ELEMENTARY_CHARGE, PLANCK_CONSTANT, SPEED_OF_LIGHT } from './constants';

const HC = PLANCK_CONSTANT * SPEED_OF_LIGHT;

/** Photon energy E = ħω = h·c/λ, J (λ in m). */
export function photonEnergy(wavelength: number): number {
	return HC / wavelength;
}

/** An energy in J in eV: E[eV] = E[J] / e. */
export function joulesToElectronvolts(energy: number): number {
	return energy / ELEMENTARY_CHARGE;
}
