/**
 * Path elements: the beam is walked from the aperture through the ordered elements.
 *
 * Each element either moves along the path (propagate, enclosure: distance z is the running sum of
 * their lengths) or acts at the current position with zero length (transmission, mirror, expander,
 * lens, fibre). Power and energy are tracked as one transmission factor applied to P and Q; every
 * factor lies in [0, 1], so no element can raise the power or make it negative.
 *
 * The beam on each stretch is a hyperbola D(z) = √(D_w² + (φ·(z − z_w))²) in the 1/e basis (see
 * beam.ts). How each element changes it:
 *  • expander (magnification M, an afocal telescope, thin): diameters ×M, angles ÷M, and the
 *    distance from the element back to the waist scales by the longitudinal magnification M²:
 *    D_w' = M·D_w, φ' = φ/M, z_w' = z_E − M²·(z_E − z_w). This keeps D'(z_E) = M·D(z_E) exactly.
 *  • lens (focal length f, thin, the incoming beam treated as collimated): the beam converges to a
 *    focus at z_L + f and then diverges with full angle φ' = D_lens/f, D_lens = D(z_L). The focus
 *    has a diffraction floor: for a Gaussian beam the 1/e² waist diameter is 4·M²·λ·f/(π·D_lens,1/e²).
 *    On the 1/e basis both diameters shrink by √2 (D_1/e = D_1/e²/√2), so
 *        d₀ = (1/√2)·4·M²·λ·f/(π·√2·D_lens) = 2·M²·λ·f/(π·D_lens)      (both 1/e).
 *    Beyond the lens D(s) = √(d₀² + (φ'·(s − f))²), s measured from the lens. At the lens itself
 *    this gives √(d₀² + D_lens²), larger than D_lens by a relative d₀²/(2·D_lens²) — negligible
 *    whenever the focus is a real focus (d₀ ≪ D_lens).
 *  • fibre (core diameter, numerical aperture NA): the output beam starts at the fibre end with
 *    diameter = core diameter and full divergence 2·asin(NA); both are taken as 1/e values. The
 *    optional coupling transmission multiplies the power. Right for a filled multimode fibre; for a
 *    single-mode fibre it understates the exposure, which every later point says (FIBRE_MODEL_NOTE).
 *  • enclosure (length L): propagates like free space; points strictly inside it are not
 *    accessible. Points on its entry or exit plane are accessible (the conservative reading).
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';
import { diameterAt, type BeamState } from './beam';
import { compare } from './digits';
import { asin } from './fastmath';
import type { NormElement, NormLine } from './validate';

/** The beam as it is from one position onwards, until the next zero-length element acts. */
export interface BeamSnapshot {
	/** Where this beam starts to apply, and where the next zero-length element replaces it. */
	from: Decimal;
	to: Decimal;
	state: BeamState;
	/** Product of transmissions and reflectances so far. */
	transmission: Decimal;
	/** The factors that make up `transmission`, with the element index each came from. */
	factors: { index: number; symbol: string; value: Decimal }[];
	/** Index of the element that produced this beam; null = the aperture. */
	afterElement: number | null;
	/** The breakdown's formula for `transmission`, formed when first needed. */
	transmissionFormula?: string;
	/** A caution about how the beam was modelled, carried to every later beam (fibre output). */
	modelNote?: string;
}

/**
 * The fibre model fills the core and the NA cone. A single-mode fibre's mode is wider than its core
 * and spreads far less than its NA, so its real exposure can be several times higher (about 4× in
 * the far field for a typical telecom fibre); an NA quoted at the 5 % points also overstates the 1/e
 * angle. Said wherever such a beam is used.
 */
export const FIBRE_MODEL_NOTE =
	'Fibre output modelled as filling its core and its NA cone (1/e). For a single-mode fibre, or an NA quoted at 5 % of the peak, the real beam spreads less and the exposure can be several times higher: describe such an output as a beam with its mode-field diameter and divergence instead.';

export interface EnclosedStretch {
	index: number;
	from: Decimal;
	to: Decimal;
}

export interface LensRecord {
	index: number;
	position: Decimal;
	focalLength: Decimal;
	/** Beam diameter (1/e) arriving at the lens. */
	lensDiameter: Decimal;
	/** Diffraction-limited focal spot (1/e). */
	focalSpot: Decimal;
	divergenceAfter: Decimal;
	focusPosition: Decimal;
	transmission: Decimal;
}

export interface PathModel {
	snapshots: BeamSnapshot[];
	enclosures: EnclosedStretch[];
	lenses: LensRecord[];
	length: Decimal;
}

/** Diffraction floor of a focused Gaussian beam on the 1/e basis: d₀ = 2·M²·λ·f/(π·D_lens). */
export function focalSpotDiameter(wavelength: Decimal, focalLength: Decimal, lensDiameter: Decimal, beamQuality: Decimal): Decimal {
	const { TWO, PI } = numbersOf(wavelength);
	return TWO.times(beamQuality).times(wavelength).times(focalLength).div(PI.times(lensDiameter));
}

/** The beam after a zero-length element at z replaces `current` (which then ends at z). */
function nextSnapshot(current: BeamSnapshot, z: Decimal, index: number, state: BeamState, factor?: { symbol: string; value: Decimal }): BeamSnapshot {
	current.to = z;
	return {
		from: z,
		to: z,
		state,
		// The first factor is the transmission itself (1 × T = T).
		transmission: factor ? (current.factors.length === 0 ? factor.value : current.transmission.times(factor.value)) : current.transmission,
		factors: factor ? [...current.factors, { index, symbol: factor.symbol, value: factor.value }] : current.factors,
		afterElement: index,
		modelNote: current.modelNote
	};
}

/** A beam state with D_w² formed once (every point on the stretch needs it). */
function stateOf(waistDiameter: Decimal, waistPosition: Decimal, divergence: Decimal): BeamState {
	return { waistDiameter, waistPosition, divergence, waistSquared: waistDiameter.times(waistDiameter) };
}

export function walkPath(line: NormLine, elements: NormElement[]): PathModel {
	const { ZERO, ONE, TWO } = numbersOf(line.wavelength);
	let z = ZERO;
	let current: BeamSnapshot = {
		from: ZERO,
		to: ZERO,
		state: stateOf(line.d0, ZERO, line.divergence),
		transmission: ONE,
		factors: [],
		afterElement: null
	};
	const snapshots: BeamSnapshot[] = [current];
	const enclosures: EnclosedStretch[] = [];
	const lenses: LensRecord[] = [];

	for (const e of elements) {
		switch (e.kind) {
			case 'propagate':
			case 'enclosure': {
				const end = e.end ?? z.plus(e.length);
				if (e.kind === 'enclosure' && !e.length.isZero()) enclosures.push({ index: e.index, from: z, to: end });
				z = end;
				current.to = z;
				break;
			}
			case 'transmission':
				current = nextSnapshot(current, z, e.index, current.state, { symbol: `T${subscript(e.index)}`, value: e.factor });
				snapshots.push(current);
				break;
			case 'mirror':
				current = nextSnapshot(current, z, e.index, current.state, { symbol: `R${subscript(e.index)}`, value: e.factor });
				snapshots.push(current);
				break;
			case 'expander': {
				const s = current.state;
				const m = e.magnification;
				const behind = z.minus(s.waistPosition);
				current = nextSnapshot(current, z, e.index, stateOf(s.waistDiameter.times(m), z.minus(m.times(m).times(behind)), s.divergence.div(m)));
				snapshots.push(current);
				break;
			}
			case 'lens': {
				const lensDiameter = diameterAt(current.state, z);
				const focalSpot = focalSpotDiameter(line.wavelength, e.focalLength, lensDiameter, line.beamQuality);
				const divergenceAfter = lensDiameter.div(e.focalLength);
				const focusPosition = z.plus(e.focalLength);
				lenses.push({ index: e.index, position: z, focalLength: e.focalLength, lensDiameter, focalSpot, divergenceAfter, focusPosition, transmission: current.transmission });
				current = nextSnapshot(current, z, e.index, stateOf(focalSpot, focusPosition, divergenceAfter));
				snapshots.push(current);
				break;
			}
			case 'fibre': {
				const divergence = TWO.times(asin(e.numericalAperture));
				current = nextSnapshot(current, z, e.index, stateOf(e.coreDiameter, z, divergence), { symbol: `T${subscript(e.index)}`, value: e.factor });
				current.modelNote = FIBRE_MODEL_NOTE;
				snapshots.push(current);
				break;
			}
		}
	}
	return { snapshots, enclosures, lenses, length: z };
}

/**
 * The beams a point at position z can see. Inside a stretch that is one beam; on a position where
 * zero-length elements act there are several (before and after each), and the caller takes the worst.
 */
export function beamsAt(path: PathModel, z: Decimal): BeamSnapshot[] {
	const out: BeamSnapshot[] = [];
	for (const s of path.snapshots) if (compare(s.from, z) <= 0 && compare(z, s.to) <= 0) out.push(s);
	return out.length > 0 ? out : [path.snapshots[path.snapshots.length - 1]];
}

/** The enclosure that strictly contains z, if any. */
export function enclosureAt(path: PathModel, z: Decimal): EnclosedStretch | null {
	for (const e of path.enclosures) if (compare(e.from, z) < 0 && compare(z, e.to) < 0) return e;
	return null;
}

const SUBSCRIPTS = '₀₁₂₃₄₅₆₇₈₉';
const SUBSCRIPT_MEMO: string[] = [];
/** Element numbers in symbols use the 0-based element index, written as a subscript: T₂ is element 2. */
export function subscript(n: number): string {
	if (n < 64 && SUBSCRIPT_MEMO[n] !== undefined) return SUBSCRIPT_MEMO[n];
	const s = String(n).replace(/\d/g, (d) => SUBSCRIPTS[Number(d)]);
	if (n < 64) SUBSCRIPT_MEMO[n] = s;
	return s;
}
