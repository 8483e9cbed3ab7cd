/**
 * The path walk: from the aperture through the ordered elements, for every line at once.
 *
 * Each element either moves along the path (free space, enclosure: position z is the running sum of
 * their lengths) or acts at the current position with zero length (transmission, mirror, expander,
 * lens, fibre). Every zero-length element starts a new beam — an origin — from which the beam would
 * go on if nothing further stopped it. How each element changes the beam (1/e basis, see beam.ts):
 *  • transmission, mirror: power × T (or R), per wavelength band where bands are given; every factor
 *    lies in [0, 1].
 *  • expander (magnification M, afocal, thin): D_w' = M·D_w, φ' = φ/M, and the distance back to the
 *    waist scales by the longitudinal magnification M²: z_w' = z_E − M²·(z_E − z_w), so that
 *    D'(z_E) = M·D(z_E) exactly.
 *  • lens (focal length f, thin, incoming beam taken as collimated): the beam converges to a focus at
 *    z_L + f and then diverges with the full angle of the cone, φ' = 2·atan(D_lens/(2f)) (exact for
 *    the cone; the small-angle D/f overstates the spread, 8 % at f = D). The focus has a diffraction
 *    floor: a Gaussian's 1/e² waist 4·M²·λ·f/(π·D_lens,1/e²) is, on the 1/e basis,
 *        d₀ = 2·M²·λ·f/(π·D_lens).
 *  • fibre (core diameter, NA): the output starts at the fibre end with the core diameter and full
 *    divergence 2·asin(NA), both taken as 1/e values; the coupling transmission multiplies the power.
 *    Right for a filled multimode fibre; for a single-mode fibre it understates the exposure, which
 *    every later point says (FIBRE_NOTE).
 *  • enclosure (length L): propagates like free space; points strictly inside are not accessible.
 *    Points on its entry or exit plane are accessible (the conservative reading).
 * The path is cut into stretches at every origin and enclosure boundary; each stretch has one beam
 * (its origin's) and is either open or enclosed.
 */
import type { ElementKind } from '$lib/enums';
import { diameterAt, type BeamState } from './beam';
import { POSITION_TOLERANCE, type NormElement, type NormLine } from './validate';

export const FIBRE_NOTE =
	'Fibre output modelled as filling its core and its NA cone (1/e). For a single-mode fibre, or an NA quoted at 5 % of the peak, the real beam spreads less and the exposure can be several times higher: describe such an output as a beam with its mode-field diameter and divergence instead.';

export interface Factor {
	index: number;
	symbol: string;
	value: number;
}

/** The beam as it leaves the aperture or an element. */
export interface Origin {
	n: number;
	afterElement: number | null;
	kind: ElementKind | null;
	position: number;
	/** Per line. */
	states: BeamState[];
	/** Product of the power factors so far, and the factors themselves, per line. */
	transmission: number[];
	factors: Factor[][];
	/** After a lens: its focal length, the beam arriving at it and the focal spot, per line. */
	lens?: { focalLength: number; focusPosition: number; lensDiameters: number[]; focalSpots: number[]; divergences: number[] };
	/** A caution on how the beam was modelled, carried to every later origin (fibre output). */
	note: string | null;
}

export interface Stretch {
	index: number;
	from: number;
	to: number;
	origin: number;
	enclosedBy: number | null;
}

export interface Walk {
	origins: Origin[];
	stretches: Stretch[];
	enclosures: { index: number; from: number; to: number }[];
	length: number;
	/** Positions closer than this are the same place. */
	tolerance: number;
}

const SUBSCRIPTS = '₀₁₂₃₄₅₆₇₈₉';
/** Element numbers in symbols are the 1-based numbers of the form, written as subscripts: T₃ is element 3. */
export function subscript(n: number): string {
	return String(n).replace(/\d/g, (d) => SUBSCRIPTS[Number(d)]);
}

/** Diffraction floor of a focused Gaussian beam on the 1/e basis: d₀ = 2·M²·λ·f/(π·D_lens). */
export function focalSpotDiameter(wavelength: number, focalLength: number, lensDiameter: number, beamQuality: number): number {
	return (2 * beamQuality * wavelength * focalLength) / (Math.PI * lensDiameter);
}

/** Full divergence after a thin lens: the cone from a beam of diameter D focused at f, 2·atan(D/(2f)). */
export function lensDivergence(lensDiameter: number, focalLength: number): number {
	return 2 * Math.atan(lensDiameter / (2 * focalLength));
}

export function walkPath(lines: NormLine[], elements: NormElement[], length: number): Walk {
	let z = 0;
	let current: Origin = {
		n: 0,
		afterElement: null,
		kind: null,
		position: 0,
		states: lines.map((l) => ({ waistDiameter: l.d0, waistPosition: 0, divergence: l.divergence })),
		transmission: lines.map(() => 1),
		factors: lines.map(() => []),
		note: null
	};
	const origins: Origin[] = [current];
	const enclosures: Walk['enclosures'] = [];
	/** The beam after a zero-length element; `factors` per line (null: the element passes all power on). */
	const next = (e: NormElement, states: BeamState[], factors: number[] | null): Origin => {
		const symbol = e.kind === 'mirror' ? `R${subscript(e.index + 1)}` : `T${subscript(e.index + 1)}`;
		const o: Origin = {
			n: origins.length,
			afterElement: e.index,
			kind: e.kind,
			position: z,
			states,
			transmission: factors === null ? current.transmission : current.transmission.map((t, i) => t * factors[i]),
			factors: factors === null ? current.factors : current.factors.map((f, i) => [...f, { index: e.index, symbol, value: factors[i] }]),
			note: current.note
		};
		origins.push(o);
		current = o;
		return o;
	};
	for (const e of elements) {
		switch (e.kind) {
			case 'propagate':
			case 'enclosure':
				if (e.kind === 'enclosure' && e.length > 0) enclosures.push({ index: e.index, from: z, to: z + e.length });
				z += e.length;
				break;
			case 'transmission':
			case 'mirror':
				next(e, current.states, lines.map((l) => bandFactor(e, l.wavelength)));
				break;
			case 'expander': {
				const m = e.magnification;
				next(
					e,
					current.states.map((s) => ({ waistDiameter: s.waistDiameter * m, waistPosition: z - m * m * (z - s.waistPosition), divergence: s.divergence / m })),
					null
				);
				break;
			}
			case 'lens': {
				const f = e.focalLength;
				const lensDiameters = current.states.map((s) => diameterAt(s, z));
				const focalSpots = lines.map((l, i) => focalSpotDiameter(l.wavelength, f, lensDiameters[i], l.beamQuality));
				const divergences = lensDiameters.map((d) => lensDivergence(d, f));
				const o = next(
					e,
					lines.map((_, i) => ({ waistDiameter: focalSpots[i], waistPosition: z + f, divergence: divergences[i] })),
					null
				);
				o.lens = { focalLength: f, focusPosition: z + f, lensDiameters, focalSpots, divergences };
				break;
			}
			case 'fibre': {
				const phi = 2 * Math.asin(e.numericalAperture);
				const o = next(
					e,
					lines.map(() => ({ waistDiameter: e.coreDiameter, waistPosition: z, divergence: phi })),
					lines.map(() => e.factor)
				);
				o.note = FIBRE_NOTE;
				break;
			}
		}
	}
	const tolerance = POSITION_TOLERANCE * Math.max(1, length);
	return { origins, stretches: cut(origins, enclosures, length, tolerance), enclosures, length, tolerance };
}

/**
 * What an element passes on at a wavelength: the band that holds it (inclusive ends; where bands
 * overlap, the larger value, which errs on the safe side), else the element's own value. A dichroic
 * that removes a line passes 0 of it: the line leaves the branch.
 */
export function bandFactor(e: NormElement, wavelength: number): number {
	let factor = -1;
	for (const b of e.bands) if (wavelength >= b.from && wavelength <= b.to && b.factor > factor) factor = b.factor;
	return factor < 0 ? e.factor : factor;
}

/** Stretches between consecutive origins and enclosure boundaries. */
function cut(origins: Origin[], enclosures: Walk['enclosures'], length: number, tol: number): Stretch[] {
	const marks = [0, length, ...origins.map((o) => o.position), ...enclosures.flatMap((e) => [e.from, e.to])].sort((a, b) => a - b);
	const stretches: Stretch[] = [];
	for (let i = 0; i + 1 < marks.length; i++) {
		const from = marks[i];
		const to = marks[i + 1];
		if (to - from <= tol) continue;
		let origin = 0;
		for (const o of origins) if (o.position <= from + tol) origin = o.n;
		const enc = enclosures.find((e) => e.from <= from + tol && to <= e.to + tol);
		stretches.push({ index: stretches.length, from, to, origin, enclosedBy: enc ? enc.index : null });
	}
	return stretches;
}

/**
 * The beams a point at z can see: inside a stretch, one; where zero-length elements act, the beam
 * arriving and every beam leaving them (the caller takes the worst).
 */
export function originsAt(walk: Walk, z: number): Origin[] {
	const { origins, tolerance } = walk;
	const here = origins.filter((o) => o.n > 0 && Math.abs(o.position - z) <= tolerance);
	if (here.length > 0) return [origins[here[0].n - 1], ...here];
	let last = origins[0];
	for (const o of origins) if (o.position < z) last = o;
	return [last];
}

/** The enclosure strictly around z, if any. */
export function enclosureAt(walk: Walk, z: number): number | null {
	for (const e of walk.enclosures) if (e.from + walk.tolerance < z && z < e.to - walk.tolerance) return e.index;
	return null;
}
