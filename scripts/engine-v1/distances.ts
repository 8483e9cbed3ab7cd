/**
 * Hazard distances.
 *
 * NOHD (closed form, consistent with D(r) = √(D₀² + (r·φ)²) and averaging over max(D, D_f)):
 *   the exposure X/(π·D²/4) equals the limit EL when D equals the critical diameter
 *       D_c = √(4·X/(π·EL)),
 *   X being the power (continuous, average) or the pulse energy and EL the limit in the matching
 *   measure. If D_c ≤ max(D₀, D_f) the beam never exceeds the limit: NOHD = 0. Otherwise
 *       NOHD = √(D_c² − D₀²)/φ,
 *   and for φ = 0 the beam never spreads: the NOHD is unbounded (no division by zero).
 *   The linear handbook form (D_c − D₀)/φ, which treats the diameter as growing linearly from D₀,
 *   is reported beside it; the two agree when D_c ≫ D₀, and the linear form is the shorter.
 *
 * After a lens the same closed form is used from the focus, with the focal spot d₀ in place of D₀
 * and the post-focus divergence φ = D_lens/f: distance from the focus = √(D_c² − d₀²)/φ. Beside it
 * the handbook lens form (f/D_lens)·D_c, which neglects d₀.
 *
 * With pulsed lines every applicable check gives a candidate (single pulse with the pulse energy,
 * average power, pulse train) and the largest distance decides.
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';
import type { Working } from './breakdown';
import { compare } from './digits';
import { sqrt } from './fastmath';
import { applicableLimits, evaluateLimit, inverseNatural, limitForPlan, plansFor, MEASURE_UNIT, type CheckPlan, type PointContext } from './exposure';
import { fmt, fmtOrNull, toSignificantString } from './format';
import { limitRef } from './limits';
import type { NormLimit } from './validate';
import type { CheckKind, NohdCandidate, NohdResult } from './types';

export interface DistanceBeam {
	/** Waist diameter the beam spreads from (D₀ at the aperture, d₀ at a focus), 1/e. */
	waist: Decimal;
	waistSymbol: string;
	divergence: Decimal;
	/** Transmission of the path up to the waist. */
	transmission: Decimal;
}

interface Candidate {
	plan: CheckPlan;
	limit: NormLimit;
	x: Decimal;
	el: Decimal;
	criticalDiameter: Decimal;
	distance: Decimal | null;
	linear: Decimal | null;
	unbounded: boolean;
}

export interface DistanceOutcome {
	result: NohdResult;
	deciding: Candidate | null;
}

/** D_c = √(4·X/(π·EL)). */
export function criticalDiameter(x: Decimal, el: Decimal): Decimal {
	const { FOUR, PI } = numbersOf(x);
	return sqrt(FOUR.times(x).div(PI.times(el)));
}

type NohdHead = [exposureDuration: string | null, checksWithoutLimit: CheckKind[], candidates: NohdCandidate[]];

/** One literal per outcome, fields in the order of NohdResult (a spread of shared fields costs more). */
function nohdResult(head: NohdHead, status: NohdResult['status'], unbounded: boolean, distance: string | null, linearFormDistance: string | null, decidingLimit: NohdResult['decidingLimit'], decidingCheck: CheckKind | null, reason: string): NohdResult {
	return { exposureDuration: head[0], checksWithoutLimit: head[1], candidates: head[2], status, unbounded, distance, linearFormDistance, decidingLimit, decidingCheck, reason };
}

export function hazardDistance(ctx: PointContext, exposureDuration: Decimal | null, beam: DistanceBeam, w: Working, prefix: string, place: string): DistanceOutcome {
	const { line, K } = ctx;
	const plans = plansFor(ctx, exposureDuration);
	const candidates: Candidate[] = [];
	const withoutLimit: CheckKind[] = [];
	let missing = false;
	let waist2: Decimal | null = null;
	let perDivergence: Decimal | null = null;
	for (const plan of plans) {
		const t = plan.duration;
		if (t === null) {
			missing = true;
			continue;
		}
		const applicable = applicableLimits(ctx, plan, 'eye');
		if (applicable.length === 0) {
			if (!plan.optional) withoutLimit.push(plan.kind);
			continue;
		}
		if (plan.missingT) {
			missing = true;
			continue;
		}
		// T = 1 exactly at the aperture (and before any attenuating element).
		const x = beam.transmission === K.ONE ? plan.source : beam.transmission.times(plan.source);
		// D_c² = (4/π)·X/EL, formed with the reciprocal of the limit (once per assessment).
		const xScaled = K.FOUR_OVER_PI.times(x);
		for (const limit of applicable) {
			const lim = evaluateLimit(limit, plan, t);
			const el = lim.natural;
			const dc2 = xScaled.times(inverseNatural(lim, plan, limit, t));
			const dc = sqrt(dc2);
			const threshold = compare(beam.waist, limit.limitingAperture) >= 0 ? beam.waist : limit.limitingAperture;
			let distance: Decimal | null = K.ZERO;
			let linear: Decimal | null = K.ZERO;
			let unbounded = false;
			if (compare(dc, threshold) > 0) {
				if (beam.divergence.isZero()) {
					distance = null;
					linear = null;
					unbounded = true;
				} else {
					perDivergence ??= K.ONE.div(beam.divergence);
					waist2 ??= beam.waist.times(beam.waist);
					distance = sqrt(dc2.minus(waist2)).times(perDivergence);
					linear = dc.minus(beam.waist).times(perDivergence);
				}
			}
			candidates.push({ plan, limit, x, el, criticalDiameter: dc, distance, linear, unbounded });
		}
	}
	for (const c of candidates) ctx.used.add(c.limit);

	const written: NohdCandidate[] = candidates.map((c) => ({
		check: c.plan.kind,
		limit: limitRef(c.limit),
		criticalDiameter: fmt(c.criticalDiameter),
		distance: fmtOrNull(c.distance),
		linearFormDistance: fmtOrNull(c.linear),
		unbounded: c.unbounded
	}));
	const head: NohdHead = [fmtOrNull(exposureDuration), withoutLimit, written];
	if (missing) {
		return { deciding: null, result: nohdResult(head, 'incomplete', false, null, null, null, null, 'Needs nohd.exposureDuration: the exposure duration assumed for the NOHD.') };
	}
	if (candidates.length === 0) {
		return { deciding: null, result: nohdResult(head, 'no_applicable_limit', false, null, null, null, null, `No entered eye limit applies at λ = ${fmt(line.wavelength)} m for the assumed durations; no NOHD can be given. Not shown as safe.`) };
	}
	let decidingIndex = 0;
	for (let i = 0; i < candidates.length; i++) {
		const c = candidates[i];
		if (candidates[decidingIndex].unbounded) break;
		// Distances written alike tie (the first is kept): arithmetic noise cannot choose.
		if (c.unbounded || (written[i].distance !== written[decidingIndex].distance && compare(c.distance!, candidates[decidingIndex].distance!) > 0)) decidingIndex = i;
	}
	const deciding = candidates[decidingIndex];
	const decidingWritten = written[decidingIndex];
	const partial = withoutLimit.length > 0 ? ` No eye limit for the ${withoutLimit.map((k) => k.replace('_', ' ')).join(', ')} check: the distance may be understated.` : '';
	if (w.enabled) {
		const dcInputs = [[deciding.plan.pointSymbol, deciding.x, deciding.plan.sourceUnit], ['EL', deciding.el, MEASURE_UNIT[deciding.plan.measure]]] as const;
		const t = deciding.plan.duration!;
		const lim = limitForPlan(deciding.limit, deciding.plan, t, w, `${prefix}.limit`);
		if (deciding.plan.measure !== deciding.limit.quantity) {
			w.add(`${prefix}.limit-measure`, 'Limit in the measure of the source', deciding.plan.measure === 'irradiance' ? `EL_E = EL_H / ${deciding.plan.durationSymbol}` : `EL_H = EL_E·${deciding.plan.durationSymbol}`, [['EL', (lim.valueText ??= fmt(lim.value)), MEASURE_UNIT[deciding.limit.quantity]], [deciding.plan.durationSymbol, (deciding.plan.durationText ??= fmt(t)), 's']], deciding.el, MEASURE_UNIT[deciding.plan.measure]);
		}
		w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', `D_c = √(4·${deciding.plan.pointSymbol} / (π·EL))`, dcInputs, decidingWritten.criticalDiameter, 'm');
	}
	if (deciding.unbounded) {
		return { deciding, result: nohdResult(head, 'unbounded', true, null, null, limitRef(deciding.limit), deciding.plan.kind, `The beam ${place} does not spread (divergence 0) and exceeds “${deciding.limit.label}”: the NOHD is unbounded.${partial}`) };
	}
	if (w.enabled) {
		const dc = decidingWritten.criticalDiameter;
		if (deciding.distance!.isZero()) {
			w.add(`${prefix}.distance`, 'Hazard distance', `0 when D_c ≤ max(${beam.waistSymbol}, D_f)`, [['D_c', dc, 'm'], [beam.waistSymbol, beam.waist, 'm'], ['D_f', deciding.limit.limitingAperture, 'm']], K.ZERO, 'm');
		} else {
			w.add(`${prefix}.distance`, 'Hazard distance', `r = √(D_c² − ${beam.waistSymbol}²) / φ`, [['D_c', dc, 'm'], [beam.waistSymbol, beam.waist, 'm'], ['φ', beam.divergence, 'rad']], decidingWritten.distance!, 'm', `Linear handbook form (D_c − ${beam.waistSymbol})/φ = ${decidingWritten.linearFormDistance!} m.`);
		}
	}
	const reason = (deciding.distance!.isZero() ? `The beam ${place} is below the most restrictive eye limit at every distance.` : `Beyond ${toSignificantString(deciding.distance!, 4)} m ${place === 'at the aperture' ? 'from the aperture' : 'from the focus'} the beam is below “${deciding.limit.label}”.`) + partial;
	return { deciding, result: nohdResult(head, 'finite', false, decidingWritten.distance!, decidingWritten.linearFormDistance!, limitRef(deciding.limit), deciding.plan.kind, reason) };
}
