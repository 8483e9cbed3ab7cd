/**
 * Suggested exposure duration for the NOHD when the officer has not chosen one. A default for the
 * form only: the engine itself never assumes a duration.
 *   400–700 nm: 0.25 s, the aversion response (common practice);
 *   700 nm – 1 mm: 10 s, a deliberate-viewing time used for infrared (common practice, from memory);
 *   180–400 nm: 30 000 s, a full working day (common practice, from memory).
 */
import type Decimal from 'decimal.js';
import { Dec } from './constants';

export function suggestedNohdExposureDuration(wavelength: Decimal.Value): string {
	const l = new Dec(wavelength);
	if (l.gte('400e-9') && l.lte('700e-9')) return '0.25';
	if (l.gt('700e-9')) return '10';
	return '30000';
}
