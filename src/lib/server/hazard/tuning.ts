/**
 * Tunable lines. A line tunable from λ₁ to λ₂ is assessed at both ends of its range and at every
 * wavelength inside it where something changes — a limit's wavelength range or its factor's range
 * begins or ends, an element's band begins or ends, the effect grouping changes — and the worst
 * wavelength decides. Between two such wavelengths nothing the engine uses jumps, and every factor
 * it uses there is monotone in λ (10^(s·(λ − λ₀)), or constant), so the worst lies on them.
 * Each assessed wavelength is a variant of the line: the same beam at another λ.
 */
import { EFFECT_BOUNDARIES } from './effects';
import type { NormElement, NormLimit, NormLine } from './validate';

/** At most this many wavelengths per tunable line (the ends are always among them). */
const MAX_VARIANTS = 64;

export function tuningWavelengths(line: NormLine, limits: NormLimit[], elements: NormElement[]): number[] {
	if (line.wavelengthMax === null) return [line.wavelength];
	const lo = line.wavelength;
	const hi = line.wavelengthMax;
	const marks = new Set<number>([lo, hi]);
	const add = (x: number) => {
		if (x > lo && x < hi) marks.add(x);
	};
	for (const l of limits) {
		add(l.wavelengthMin);
		add(l.wavelengthMax);
		if (l.wavelengthFactor?.kind === 'exponential') {
			add(l.wavelengthFactor.from);
			add(l.wavelengthFactor.to);
		}
	}
	for (const e of elements) for (const b of e.bands) (add(b.from), add(b.to));
	for (const x of EFFECT_BOUNDARIES) add(x);
	const sorted = [...marks].sort((a, b) => a - b);
	if (sorted.length <= MAX_VARIANTS) return sorted;
	// Keep the ends and an even spread of the rest (a register would need absurdly many limits for this).
	const step = (sorted.length - 1) / (MAX_VARIANTS - 1);
	return Array.from({ length: MAX_VARIANTS }, (_, i) => sorted[Math.round(i * step)]);
}

/** The variants of every line of a path, each knowing the line it stands for (its `index`). */
export function variantsOf(lines: NormLine[], limits: NormLimit[], elements: NormElement[]): NormLine[] {
	const out: NormLine[] = [];
	for (const line of lines) for (const wavelength of tuningWavelengths(line, limits, elements)) out.push(wavelength === line.wavelength ? line : { ...line, wavelength });
	return out;
}
