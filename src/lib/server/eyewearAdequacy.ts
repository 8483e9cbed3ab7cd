// Does a lab hold eyewear that covers a path's requirement? One pair is worn at a time, so one item
// must cover every line the path carries — each line's wavelength (its whole range for a tunable line)
// at its required OD. Pure, no database; decimals compared exactly.
import Decimal from 'decimal.js';

export type BandOnRecord = { eyewearId: string; label: string; wavelengthMin: string; wavelengthMax: string; od: string };
/** One line's need: at least `od` over [wavelengthMin, wavelengthMax] (equal ends for a fixed line). */
export type Requirement = { wavelengthMin: string; wavelengthMax: string; od: string; label: string };
export type Adequacy = 'adequate' | 'inadequate' | 'none_on_record';
export type ItemCoverage = { eyewearId: string; label: string; uncovered: Requirement[] };
export type AdequacyResult = { status: Adequacy; best: ItemCoverage | null; matching: string[] };

/** True when the bands of one item at ≥ the OD cover the whole range (band ends inclusive, no gap). */
function covers(bands: BandOnRecord[], r: Requirement): boolean {
	const need = new Decimal(r.od);
	const usable = bands.filter((b) => need.lte(b.od)).sort((a, b) => new Decimal(a.wavelengthMin).cmp(b.wavelengthMin));
	// `reached`: covered without a gap from the start up to here; nothing is covered until a band holds the start.
	let reached = new Decimal(r.wavelengthMin);
	let started = false;
	const end = new Decimal(r.wavelengthMax);
	for (const b of usable) {
		if (new Decimal(b.wavelengthMin).gt(reached)) break;
		if (new Decimal(b.wavelengthMax).gte(reached)) {
			reached = Decimal.max(reached, b.wavelengthMax);
			started = true;
		}
		if (started && reached.gte(end)) return true;
	}
	return false;
}

/** Does an item have any band touching the requirement's range, at whatever OD? */
function touches(bands: BandOnRecord[], r: Requirement): boolean {
	return bands.some((b) => new Decimal(b.wavelengthMin).lte(r.wavelengthMax) && new Decimal(b.wavelengthMax).gte(r.wavelengthMin));
}

/**
 * Adequate: some item covers every requirement. Inadequate: items reach some of the wavelengths but
 * none covers them all (the closest is named with what it leaves uncovered). None on record: no item
 * has a band at any of the wavelengths. The caller passes usable items only.
 */
export function adequacy(bands: BandOnRecord[], requirements: Requirement[]): AdequacyResult {
	const items = new Map<string, BandOnRecord[]>();
	for (const b of bands) items.set(b.eyewearId, [...(items.get(b.eyewearId) ?? []), b]);
	const coverage: ItemCoverage[] = [...items].map(([eyewearId, own]) => ({ eyewearId, label: own[0].label, uncovered: requirements.filter((r) => !covers(own, r)) }));
	const matching = coverage.filter((c) => c.uncovered.length === 0).map((c) => c.eyewearId);
	if (matching.length) return { status: 'adequate', best: coverage.find((c) => c.eyewearId === matching[0])!, matching };
	const reaching = coverage.filter((c) => requirements.some((r) => touches(items.get(c.eyewearId)!, r)));
	if (reaching.length === 0) return { status: 'none_on_record', best: null, matching: [] };
	const best = reaching.reduce((a, b) => (b.uncovered.length < a.uncovered.length ? b : a));
	return { status: 'inadequate', best, matching: [] };
}
