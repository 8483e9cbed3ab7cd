// Does a lab hold eyewear that covers a path's requirement? One pair is worn at a time, so one item
// must cover every line the path carries — each line's wavelength (its whole range for a tunable line)
// at its required OD. Pure, no database; decimals compared exactly.
import Decimal from 'decimal.js';

export type BandOnRecord = { eyewearId: string; label: string; location?: string; wavelengthMin: string; wavelengthMax: string; od: string };
/** One line's need: at least `od` over [wavelengthMin, wavelengthMax] (equal ends for a fixed line). */
export type Requirement = { wavelengthMin: string; wavelengthMax: string; od: string; label: string };
export type Adequacy = 'adequate' | 'inadequate' | 'none_on_record';
export type ItemCoverage = { eyewearId: string; label: string; location: string; uncovered: Requirement[] };
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
	const coverage: ItemCoverage[] = [...items].map(([eyewearId, own]) => ({ eyewearId, label: own[0].label, location: own[0].location ?? '', uncovered: requirements.filter((r) => !covers(own, r)) }));
	const matching = coverage.filter((c) => c.uncovered.length === 0).map((c) => c.eyewearId);
	if (matching.length) return { status: 'adequate', best: coverage.find((c) => c.eyewearId === matching[0])!, matching };
	const reaching = coverage.filter((c) => requirements.some((r) => touches(items.get(c.eyewearId)!, r)));
	if (reaching.length === 0) return { status: 'none_on_record', best: null, matching: [] };
	const best = reaching.reduce((a, b) => (b.uncovered.length < a.uncovered.length ? b : a));
	return { status: 'inadequate', best, matching: [] };
}

/** What the assessment asks of eyewear for one line: its wavelength (range) and the OD, assessed and rounded up (0: none needed). */
export type Need = { wavelengthMin: string; wavelengthMax: string; od: number; odAssessed: number; label: string };
/** An eyewear control as the officer typed it, in SI (its index in the form, to name the field). */
export type EyewearControl = { index: number; wavelengthMin: string; wavelengthMax: string; od: string; label: string };

/**
 * Do a clearance's eyewear controls protect against every line the path carries? Every line that
 * needs eyewear must be covered by the controls together at its rounded-up OD, and every control must
 * concern a line of the path. Returns the problems in words by form field ('controls': a line that
 * no control covers). `needs` has one entry per line of the path. A clearance without eyewear
 * (the beam enclosed, say) is the officer's call: with no eyewear control there is nothing to check.
 */
export function controlShortfalls(needs: Need[], controls: EyewearControl[]): Record<string, string> {
	const out: Record<string, string> = {};
	if (controls.length === 0) return out;
	const band = (c: EyewearControl): BandOnRecord => ({ eyewearId: 'controls', label: c.label, wavelengthMin: c.wavelengthMin, wavelengthMax: c.wavelengthMax, od: c.od });
	const bands = controls.map(band);
	const uncovered: string[] = [];
	for (const n of needs) {
		if (n.od <= 0) continue;
		const r: Requirement = { wavelengthMin: n.wavelengthMin, wavelengthMax: n.wavelengthMax, od: String(n.od), label: n.label };
		if (covers(bands, r)) continue;
		const need = `The ${n.label} line needs at least OD ${n.od} (assessed ${n.odAssessed.toFixed(2)}, rounded up)`;
		const touching = controls.filter((c) => touches([band(c)], r));
		if (touching.length) for (const c of touching) out[`controls.${c.index}.minOd`] = `${need}; this control gives ${c.label}.`;
		else uncovered.push(`${need}, and no eyewear control covers it.`);
	}
	for (const c of controls) {
		const concerns = needs.some((n) => touches([band(c)], { wavelengthMin: n.wavelengthMin, wavelengthMax: n.wavelengthMax, od: '0', label: '' }));
		if (!concerns) out[`controls.${c.index}.wavelength`] = `${c.label} concerns no line of this path (it carries ${needs.map((n) => n.label).join(', ')}).`;
	}
	if (uncovered.length) out.controls = uncovered.join(' ');
	return out;
}
