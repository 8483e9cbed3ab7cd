// Does a lab hold eyewear of the required optical density at a wavelength? Pure, no database.
import Decimal from 'decimal.js';

export type BandOnRecord = { eyewearId: string; label: string; wavelengthMin: string; wavelengthMax: string; od: string };
export type Adequacy = 'adequate' | 'inadequate' | 'none_on_record';
export type AdequacyResult = { status: Adequacy; best: { eyewearId: string; label: string; od: string } | null; matching: string[] };

/**
 * Band ends are inclusive. An item counts only through a band that covers the wavelength: eyewear
 * with no band there is never adequate for it, whatever its OD elsewhere. Several items: one that
 * meets the required OD is enough (best shown); the caller passes usable items only.
 */
export function adequacy(bands: BandOnRecord[], wavelength: Decimal.Value, requiredOd: Decimal.Value): AdequacyResult {
	const lambda = new Decimal(wavelength);
	const need = new Decimal(requiredOd);
	const covering = bands.filter((b) => lambda.gte(b.wavelengthMin) && lambda.lte(b.wavelengthMax));
	if (covering.length === 0) return { status: 'none_on_record', best: null, matching: [] };
	const best = covering.reduce((a, b) => (new Decimal(b.od).gt(a.od) ? b : a));
	const matching = [...new Set(covering.filter((b) => need.lte(b.od)).map((b) => b.eyewearId))];
	return { status: matching.length ? 'adequate' : 'inadequate', best: { eyewearId: best.eyewearId, label: best.label, od: best.od }, matching };
}
