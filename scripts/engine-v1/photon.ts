/**
 * Photon quantities from the exact SI 2019 constants.
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';

/** Photon energy E = h·c/λ, J (λ in m). */
export function photonEnergy(wavelength: Decimal): Decimal {
	return numbersOf(wavelength).PLANCK_TIMES_C.div(wavelength);
}

/** Converts an energy in J to eV: E[eV] = E[J] / e. */
export function joulesToElectronvolts(energy: Decimal): Decimal {
	return energy.times(numbersOf(energy).INV_ELEMENTARY_CHARGE);
}

/** Photons per second carried by a power P (W): Φ = P/E. Also photons per pulse Q/E, photon flux density E_irr/E. */
export function photonCount(powerOrEnergy: Decimal, photonEnergyJ: Decimal): Decimal {
	return powerOrEnergy.div(photonEnergyJ);
}
