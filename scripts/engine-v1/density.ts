/**
 * Optical density that eyewear (or any attenuator) must provide: OD = log₁₀(exposure/limit) when the
 * ratio exceeds 1, else 0 (common practice: OD = log₁₀(H/MPE)). Also rounded up to one decimal and to
 * a whole number (common practice: eyewear is specified by the next whole OD).
 */
import Decimal from 'decimal.js';
import { numbersOf } from './constants';
import { compare } from './digits';
import { log10 } from './fastmath';
import { fmt } from './format';
import type { OpticalDensity } from './types';

export interface OdValue {
	value: Decimal;
	roundedUpTenth: Decimal;
	roundedUpWhole: Decimal;
}

export function requiredOpticalDensity(ratio: Decimal): OdValue {
	const { ONE, ZERO } = numbersOf(ratio);
	if (compare(ratio, ONE) <= 0) return { value: ZERO, roundedUpTenth: ZERO, roundedUpWhole: ZERO };
	const value = log10(ratio);
	// Round away digits below 1e-12 before rounding up, so that arithmetic noise on an exact power of
	// ten cannot add a whole OD. Rounding up to a tenth: ⌈10·OD⌉/10, i.e. one decimal place, ceiling.
	const settled = value.toDecimalPlaces(12, Decimal.ROUND_HALF_EVEN);
	return {
		value,
		roundedUpTenth: settled.toDecimalPlaces(1, Decimal.ROUND_CEIL),
		roundedUpWhole: settled.toDecimalPlaces(0, Decimal.ROUND_CEIL)
	};
}

export function writeOd(od: OdValue): OpticalDensity {
	return { value: fmt(od.value), roundedUpTenth: fmt(od.roundedUpTenth), roundedUpWhole: fmt(od.roundedUpWhole) };
}
