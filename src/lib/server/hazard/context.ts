// What every step of one assessment shares: the context, the verdict order and the sentence
// number formats. Its own module so that the exposure and hazard-distance steps both depend on it
// rather than on each other.
import type { LimitRef, Verdict } from '$lib/assessmentResult';
import { RATIO_TOLERANCE } from './constants';
import type { Plans } from './checks';
import type { NormLimit, NormLine, NormPath } from './validate';
import type { Walk } from './walk';

export const VERDICT_RANK: Record<Verdict, number> = { within_limit: 0, no_applicable_limit: 1, incomplete: 2, exceeds_limit: 3 };

export function worse(a: Verdict, b: Verdict): Verdict {
	return VERDICT_RANK[a] >= VERDICT_RANK[b] ? a : b;
}

export function exceeds(ratio: number): boolean {
	return ratio >= 1 - RATIO_TOLERANCE;
}

/**
 * What one assessment shares: its input, the lines as assessed (a tunable line as one variant per
 * wavelength, each knowing its line by `index`), its path walk and check plans (per variant), its
 * photon energies.
 */
export interface Context {
	path: NormPath;
	lines: NormLine[];
	limits: NormLimit[];
	walk: Walk;
	plans: Plans[];
	photonEnergy: number[];
	breakdown: boolean;
}

/** The limit's reference, one shared object per limit and assessment. */
export const limitRef = (l: NormLimit): LimitRef => l.ref;

/** 4 significant figures for sentences (the numbers themselves stay exact in the result). */
export const sig = (v: number) => String(Number(v.toPrecision(4)));
export const nm = (lambda: number) => `${Number((lambda * 1e9).toPrecision(4))} nm`;
