/**
 * Hazard distances: how far the beam that leaves the aperture or an element stays hazardous if it
 * went on unobstructed (a mirror knocked, an enclosure opened). The largest, for the eye, is the
 * path's NOHD; skin points get the same for skin. The same figures give the worst exposure of every
 * open stretch of the path.
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
 *
 * On a stretch [a, b] the exposure h·X/(π·max(D, D_f)²/4) is largest where the beam is narrowest,
 * at z* = clamp(z_w, a, b): its worst ratio is the largest candidate's ratio there.
 */
import type { CheckKind, DistanceCandidate, HazardDistance, Verdict } from '$lib/assessmentResult';
import type { Tissue } from '$lib/enums';
import { diameterAt } from './beam';
import { applicableLimits, MEASURE_UNIT, planMissesT, type LimitAt, type Plan } from './checks';
import { exceeds, limitRef, nm, sig, type Context } from './exposure';
import type { Origin } from './walk';
import type { Working } from './working';

/** One check of one line against one limit, for the beam of one origin. */
export interface Candidate {
	line: number;
	plan: Plan;
	at: LimitAt;
	/** h·X: the power or energy at the origin with the hot-spot factor. */
	hx: number;
	dc: number;
	distance: number;
	reach: number;
	unbounded: boolean;
}

/** Every candidate of a beam, and what kept the set from being complete. */
export interface BeamLimits {
	candidates: Candidate[];
	missingChecks: CheckKind[];
	needsT: boolean;
	used: number[];
}

const PI_4 = Math.PI / 4;

export function beamLimits(ctx: Context, origin: Origin, tissue: Tissue, T: number | null): BeamLimits {
	const out: BeamLimits = { candidates: [], missingChecks: [], needsT: false, used: [] };
	for (let li = 0; li < ctx.path.lines.length; li++) {
		const line = ctx.path.lines[li];
		const s = origin.states[li];
		for (const plan of ctx.plans[li].for(T)) {
			if (planMissesT(plan)) {
				out.needsT = true;
				continue;
			}
			const limits = applicableLimits(plan, line, tissue, ctx.limits);
			if (limits.length === 0 && !out.missingChecks.includes(plan.kind)) out.missingChecks.push(plan.kind);
			const hx = line.hotSpot * origin.transmission[li] * plan.source;
			for (const at of limits) {
				if (at.natural === null) {
					if (!out.missingChecks.includes(plan.kind)) out.missingChecks.push(plan.kind);
					continue;
				}
				out.used.push(at.limit.index);
				const dc = Math.sqrt(hx / (PI_4 * at.natural));
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
				out.candidates.push({ line: li, plan, at, hx, dc, distance, reach, unbounded });
			}
		}
	}
	return out;
}

/** The worst ratio on a stretch [a, b] of the beam, and where; the verdict it gives. */
export function stretchWorst(ctx: Context, origin: Origin, b: BeamLimits, from: number, to: number): { ratio: number | null; at: number | null; verdict: Verdict } {
	let ratio: number | null = null;
	let at: number | null = null;
	for (const c of b.candidates) {
		const s = origin.states[c.line];
		const z = Math.min(to, Math.max(from, s.waistPosition));
		const D = diameterAt(s, z);
		const d = D > c.at.limit.limitingAperture ? D : c.at.limit.limitingAperture;
		const r = c.hx / (PI_4 * d * d * c.at.natural!);
		if (ratio === null || r > ratio) {
			ratio = r;
			at = z;
		}
	}
	let verdict: Verdict;
	if (ratio !== null && exceeds(ratio)) verdict = 'exceeds_limit';
	else if (b.needsT || (ratio !== null && b.missingChecks.length)) verdict = 'incomplete';
	else if (ratio === null) verdict = 'no_applicable_limit';
	else verdict = 'within_limit';
	return { ratio, at, verdict };
}

export function hazardDistance(ctx: Context, origin: Origin, tissue: Tissue, T: number | null, w: Working | null, prefix: string, b = beamLimits(ctx, origin, tissue, T)): HazardDistance {
	const { candidates, missingChecks } = b;
	const where = origin.afterElement === null ? 'from the aperture' : `after element ${origin.afterElement + 1}`;
	const written: DistanceCandidate[] = new Array(candidates.length);
	for (let i = 0; i < candidates.length; i++) {
		const c = candidates[i];
		written[i] = { line: c.line, check: c.plan.kind, limit: limitRef(c.at.limit), criticalDiameter: c.dc, distance: c.unbounded ? null : c.distance, unbounded: c.unbounded };
	}
	const lens = origin.lens;
	const result = (status: HazardDistance['status'], distance: number | null, deciding: Candidate | null, reason: string): HazardDistance => {
		const out: HazardDistance = {
			status,
			tissue,
			afterElement: origin.afterElement,
			elementKind: origin.kind,
			origin: origin.position,
			distance,
			exposureDuration: T,
			decidingLimit: deciding ? limitRef(deciding.at.limit) : null,
			decidingCheck: deciding ? deciding.plan.kind : null,
			decidingLine: deciding ? deciding.line : null,
			missingChecks,
			reason,
			candidates: written
		};
		if (lens) {
			out.focusPosition = lens.focusPosition;
			out.distanceFromFocus = distance === null ? null : distance === 0 ? 0 : deciding!.reach - lens.focusPosition;
		}
		return out;
	};
	if (b.needsT) return result('incomplete', null, null, 'Needs the exposure duration for the hazard distances (nohdExposureDuration).');
	if (candidates.length === 0) return result('no_applicable_limit', null, null, `No entered ${tissue} limit applies to this beam for the assumed duration; no hazard distance can be given. Not shown as safe.`);
	let d = candidates[0];
	for (const c of candidates) if (!d.unbounded && (c.unbounded || c.distance > d.distance)) d = c;
	const partial = missingChecks.length ? ` No ${tissue} limit (or no pulse-train rule) for the ${missingChecks.map((k) => k.replace('_', ' ')).join(', ')} check: the distance may be understated.` : '';
	if (w) distanceSteps(ctx, origin, d, w, prefix, where);
	if (d.unbounded) return result('unbounded', null, d, `The beam ${where} does not spread (divergence 0) and exceeds “${d.at.limit.label}”: the hazard distance is unbounded.${partial}`);
	const reason = (d.distance === 0 ? `The beam ${where} is below the most restrictive ${tissue} limit at every distance.` : `Beyond ${sig(d.distance)} m ${where} the beam is below “${d.at.limit.label}”.`) + partial;
	return result(missingChecks.length ? 'partial' : 'finite', d.distance, d, reason);
}

function distanceSteps(ctx: Context, origin: Origin, d: Candidate, w: Working, prefix: string, where: string): void {
	const line = ctx.path.lines[d.line];
	const s = origin.states[d.line];
	const natUnit = MEASURE_UNIT[d.plan.measure];
	const x = d.hx / line.hotSpot;
	if (d.at.limit.quantity !== d.plan.measure) w.add(`${prefix}.limit-measure`, 'Limit in the measure of the source', d.plan.measure === 'irradiance' ? `EL_E = EL_H / ${d.plan.tSymbol}` : `EL_H = EL_E·${d.plan.tSymbol}`, [['EL', d.at.value!, MEASURE_UNIT[d.at.limit.quantity]], [d.plan.tSymbol, d.plan.t!, 's']], d.at.natural!, natUnit);
	if (line.hotSpot === 1) w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', `D_c = √(4·${d.plan.symbol} / (π·EL))`, [[d.plan.symbol, x, d.plan.unit], ['EL', d.at.natural!, natUnit]], d.dc, 'm', `Most restrictive: “${d.at.limit.label}” (${d.plan.label.toLowerCase()}, ${nm(line.wavelength)}).`);
	else w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', `D_c = √(4·h·${d.plan.symbol} / (π·EL))`, [[d.plan.symbol, x, d.plan.unit], ['EL', d.at.natural!, natUnit], ['h', line.hotSpot, '']], d.dc, 'm', `Most restrictive: “${d.at.limit.label}” (${d.plan.label.toLowerCase()}, ${nm(line.wavelength)}).`);
	if (d.unbounded) return;
	if (d.distance === 0) {
		w.add(`${prefix}.distance`, `Hazard distance ${where}`, '0 when D_c ≤ max(D_w, D_f)', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['D_f', d.at.limit.limitingAperture, 'm']], 0, 'm');
		return;
	}
	const note = origin.lens
		? `From the focus: ${sig(d.reach - origin.lens.focusPosition)} m; the handbook lens form (f/D_lens)·D_c gives ${sig((origin.lens.focalLength / origin.lens.lensDiameters[d.line]) * d.dc)} m from the focus.`
		: s.waistPosition === origin.position
			? `Linear handbook form (D_c − D_w)/φ = ${sig((d.dc - s.waistDiameter) / s.divergence)} m.`
			: undefined;
	w.add(`${prefix}.distance`, `Hazard distance ${where}`, 'r = z_w + √(D_c² − D_w²)/φ − z₀', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['φ', s.divergence, 'rad'], ['z_w', s.waistPosition, 'm'], ['z₀', origin.position, 'm']], d.distance, 'm', note);
}

