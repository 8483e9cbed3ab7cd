/**
 * Hazard distances: how far the beam that leaves the aperture or an element stays hazardous if it
 * went on unobstructed (a mirror knocked, an enclosure opened). The largest, for the eye, is the
 * path's NOHD; skin points get the same for skin.
 *
 * Closed form, consistent with D(z) = √(D_w² + (φ·(z − z_w))²) and averaging over max(D, D_f): the
 * exposure h·X/(π·D²/4) equals the limit EL when D equals the critical diameter
 *     D_c = √(4·h·X/(π·EL)),
 * X being the power (continuous, average) or the pulse energy at the origin and EL the limit in the
 * matching measure. If D_c ≤ max(D_w, D_f) the beam never exceeds the limit: distance 0. Otherwise the
 * beam is hazardous while |z − z_w| < a = √(D_c² − D_w²)/φ, so up to the position z_w + a; the
 * distance from the origin z₀ is z_w + a − z₀. From the aperture (z_w = z₀ = 0) this is the usual
 *     NOHD = √(D_c² − D₀²)/φ;
 * after a lens (z_w = z₀ + f) it is f plus the distance from the focus, √(D_c² − d₀²)/φ'. A beam that
 * does not spread (φ = 0) and exceeds the limit is hazardous without bound: said, never divided by 0.
 * Every applicable check of every line gives a candidate; the largest distance decides. A check that
 * applies but has no limit (or no pulse-train rule) makes the distance 'partial': a lower bound.
 */
import type { CheckKind, DistanceCandidate, HazardDistance } from '$lib/assessmentResult';
import type { Tissue } from '$lib/enums';
import { applicableLimits, MEASURE_UNIT, planMissesT, type LimitAt, type Plan } from './checks';
import { limitRef, nm, sig, type Context } from './exposure';
import type { Origin } from './walk';
import type { Working } from './working';

interface Candidate {
	line: number;
	plan: Plan;
	at: LimitAt;
	x: number;
	dc: number;
	distance: number;
	reach: number;
	unbounded: boolean;
}

export interface DistanceOutcome {
	result: HazardDistance;
	used: number[];
}

const PI_4 = Math.PI / 4;

export function hazardDistance(ctx: Context, origin: Origin, tissue: Tissue, T: number | null, w: Working | null, prefix: string): DistanceOutcome {
	const candidates: Candidate[] = [];
	const missingChecks: CheckKind[] = [];
	let needsT = false;
	const used: number[] = [];
	for (let li = 0; li < ctx.path.lines.length; li++) {
		const line = ctx.path.lines[li];
		const s = origin.states[li];
		const h = line.hotSpot;
		for (const plan of ctx.plans[li].for(T)) {
			if (planMissesT(plan)) {
				needsT = true;
				continue;
			}
			const limits = applicableLimits(plan, line, tissue, ctx.limits);
			if (limits.length === 0 && !missingChecks.includes(plan.kind)) missingChecks.push(plan.kind);
			const x = origin.transmission[li] * plan.source;
			for (const at of limits) {
				if (at.natural === null) {
					if (!missingChecks.includes(plan.kind)) missingChecks.push(plan.kind);
					continue;
				}
				used.push(at.limit.index);
				const dc = Math.sqrt((h * x) / (PI_4 * at.natural));
				let distance = 0;
				let reach = origin.position;
				let unbounded = false;
				if (dc > at.limit.limitingAperture && dc > s.waistDiameter) {
					if (s.divergence === 0) unbounded = true;
					else {
						reach = s.waistPosition + Math.sqrt(dc * dc - s.waistDiameter * s.waistDiameter) / s.divergence;
						distance = Math.max(0, reach - origin.position);
					}
				}
				candidates.push({ line: li, plan, at, x, dc, distance, reach, unbounded });
			}
		}
	}
	const where = origin.afterElement === null ? 'from the aperture' : `after element ${origin.afterElement + 1}`;
	const head = {
		tissue,
		afterElement: origin.afterElement,
		elementKind: origin.kind,
		origin: origin.position,
		exposureDuration: T,
		missingChecks,
		candidates: candidates.map<DistanceCandidate>((c) => ({ line: c.line, check: c.plan.kind, limit: limitRef(c.at.limit), criticalDiameter: c.dc, distance: c.unbounded ? null : c.distance, unbounded: c.unbounded }))
	};
	const lens = origin.lens ? { focusPosition: origin.lens.focusPosition } : {};
	const none = { distance: null, decidingLimit: null, decidingCheck: null, decidingLine: null, ...(origin.lens ? { ...lens, distanceFromFocus: null } : {}) };
	if (needsT) {
		return { used, result: { ...head, ...none, status: 'incomplete', reason: 'Needs the exposure duration for the hazard distances (nohdExposureDuration).' } };
	}
	if (candidates.length === 0) {
		return { used, result: { ...head, ...none, status: 'no_applicable_limit', reason: `No entered ${tissue} limit applies to this beam for the assumed duration; no hazard distance can be given. Not shown as safe.` } };
	}
	let d = candidates[0];
	for (const c of candidates) if (!d.unbounded && (c.unbounded || c.distance > d.distance)) d = c;
	const partial = missingChecks.length ? ` No ${tissue} limit (or no pulse-train rule) for the ${missingChecks.map((k) => k.replace('_', ' ')).join(', ')} check: the distance may be understated.` : '';
	const deciding = { decidingLimit: limitRef(d.at.limit), decidingCheck: d.plan.kind, decidingLine: d.line };

	if (w) {
		const line = ctx.path.lines[d.line];
		const s = origin.states[d.line];
		const natUnit = MEASURE_UNIT[d.plan.measure];
		if (d.at.limit.quantity !== d.plan.measure) w.add(`${prefix}.limit-measure`, 'Limit in the measure of the source', d.plan.measure === 'irradiance' ? `EL_E = EL_H / ${d.plan.tSymbol}` : `EL_H = EL_E·${d.plan.tSymbol}`, [['EL', d.at.value!, MEASURE_UNIT[d.at.limit.quantity]], [d.plan.tSymbol, d.plan.t!, 's']], d.at.natural!, natUnit);
		const hIn = line.hotSpot === 1 ? [] : ([['h', line.hotSpot, '']] as const);
		w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', line.hotSpot === 1 ? `D_c = √(4·${d.plan.symbol} / (π·EL))` : `D_c = √(4·h·${d.plan.symbol} / (π·EL))`, [[d.plan.symbol, d.x, d.plan.unit], ['EL', d.at.natural!, natUnit], ...hIn], d.dc, 'm', `Most restrictive: “${d.at.limit.label}” (${d.plan.label.toLowerCase()}, ${nm(line.wavelength)}).`);
		if (!d.unbounded) {
			if (d.distance === 0) w.add(`${prefix}.distance`, `Hazard distance ${where}`, '0 when D_c ≤ max(D_w, D_f)', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['D_f', d.at.limit.limitingAperture, 'm']], 0, 'm');
			else {
				const note = origin.lens
					? `From the focus: ${sig(d.reach - origin.lens.focusPosition)} m; the handbook lens form (f/D_lens)·D_c gives ${sig((origin.lens.focalLength / origin.lens.lensDiameters[d.line]) * d.dc)} m from the focus.`
					: s.waistPosition === origin.position
						? `Linear handbook form (D_c − D_w)/φ = ${sig((d.dc - s.waistDiameter) / s.divergence)} m.`
						: undefined;
				w.add(`${prefix}.distance`, `Hazard distance ${where}`, 'r = z_w + √(D_c² − D_w²)/φ − z₀', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['φ', s.divergence, 'rad'], ['z_w', s.waistPosition, 'm'], ['z₀', origin.position, 'm']], d.distance, 'm', note);
			}
		}
	}
	if (d.unbounded) {
		return {
			used,
			result: { ...head, ...none, ...deciding, status: 'unbounded', reason: `The beam ${where} does not spread (divergence 0) and exceeds “${d.at.limit.label}”: the hazard distance is unbounded.${partial}` }
		};
	}
	const fromFocus = origin.lens ? { ...lens, distanceFromFocus: d.distance === 0 ? 0 : d.reach - origin.lens.focusPosition } : {};
	const reason = (d.distance === 0 ? `The beam ${where} is below the most restrictive ${tissue} limit at every distance.` : `Beyond ${sig(d.distance)} m ${where} the beam is below “${d.at.limit.label}”.`) + partial;
	return { used, result: { ...head, ...deciding, ...fromFocus, status: missingChecks.length ? 'partial' : 'finite', distance: d.distance, reason } };
}
