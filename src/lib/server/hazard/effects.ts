/**
 * Which exposures add up. Lines of different wavelengths that act on the same tissue in the same way
 * add as Σ Hᵢ/ELᵢ ≤ 1 (ICNIRP 2013 guidelines on laser radiation; IEC 60825-1, its table of additive
 * effects by spectral region; Directive 2006/25/EC, Annex II — all recalled from memory, not checked
 * against the texts). The grouping here follows the part of the body each region acts on:
 *   eye   180–400 nm     cornea, conjunctiva and lens (ultraviolet)
 *   eye   400–1400 nm    retina (visible and near infrared)
 *   eye   1.4 µm – 1 mm  cornea (far infrared)
 *   skin  180 nm – 1 mm  the skin
 * Where the published table could not be checked it is joined rather than split, which only ever
 * raises a sum: all ultraviolet together for the eye, every region together for the skin. The
 * breakdown names the group each line is summed in.
 */
import type { Tissue } from '$lib/enums';

export interface EffectGroup {
	id: string;
	tissue: Tissue;
	/** Inclusive lower end, exclusive upper end (the last group of a tissue includes 1 mm). */
	from: number;
	to: number;
	label: string;
}

export const EFFECT_GROUPS: readonly EffectGroup[] = [
	{ id: 'eye-uv', tissue: 'eye', from: 180e-9, to: 400e-9, label: 'front of the eye, ultraviolet (180–400 nm)' },
	{ id: 'eye-retina', tissue: 'eye', from: 400e-9, to: 1400e-9, label: 'retina (400–1400 nm)' },
	{ id: 'eye-ir', tissue: 'eye', from: 1400e-9, to: 1e-3, label: 'front of the eye, infrared (1.4 µm – 1 mm)' },
	{ id: 'skin', tissue: 'skin', from: 180e-9, to: 1e-3, label: 'skin (all wavelengths)' }
];

export function effectGroup(tissue: Tissue, wavelength: number): EffectGroup {
	const groups = EFFECT_GROUPS.filter((g) => g.tissue === tissue);
	for (const g of groups) if (wavelength >= g.from && wavelength < g.to) return g;
	return groups[groups.length - 1];
}

/** Wavelengths where the grouping changes: a tunable line is assessed on both sides of each. */
export const EFFECT_BOUNDARIES: readonly number[] = [400e-9, 1400e-9];
