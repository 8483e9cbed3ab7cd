/**
 * Hazard distances: how far the beam that leaves the aperture or an element stays hazardous if it
 * went on unobstructed (a mirror knocked, an enclosure opened). The largest, for the eye, is the
 * path's NOHD; skin points get the same for skin. The same figures give the worst exposure of every
 * open stretch of the path.
 *
 * One line, closed form, consistent with D(z) = √(D_w² + (φ·(z − z_w))²) and averaging over
 * max(D, D_f): the exposure h·X/(π·D²/4) equals the limit EL when D equals the critical diameter
 *     D_c = √(4·h·X/(π·EL)),
 * X being the power (continuous, average) or the pulse energy at the origin and EL the limit in the
 * matching measure. If D_c ≤ max(D_w, D_f) the beam never exceeds the limit: distance 0. Otherwise the
 * beam is hazardous while |z − z_w| < a = √(D_c² − D_w²)/φ, so up to the position z_w + a; the
 * distance from the origin z₀ is z_w + a − z₀. From the aperture (z_w = z₀ = 0) this is the usual
 *     NOHD = √(D_c² − D₀²)/φ;
 * after a lens (z_w = z₀ + f) it is f plus the distance from the focus, √(D_c² − d₀²)/φ'. A beam that
 * does not spread (φ = 0) and exceeds the limit is hazardous without bound: said, never divided by 0.
 *
 * Several lines acting alike (effects.ts): their ratios add, Σᵢ ratioᵢ(z) = 1 at the far end of the
 * hazard. Every line's beam has its waist at the same place (every element moves all lines alike), and
 * past it each ratio falls as the beam widens, so the sum falls too: the end is found by bracketing
 * and bisection, to 1e-12 relative, and the upper bracket is reported (never short).
 *
 * Every applicable check of every line gives a candidate; the largest distance decides. A check that
 * applies but has no limit (or no pulse-train rule) makes the distance 'partial': a lower bound.
 * On a stretch [a, b] the exposure is largest where the beam is narrowest, at z* = clamp(z_w, a, b).
 */
import type { CheckKind, DistanceCandidate, HazardDistance, Verdict } from '$lib/assessmentResult';
import type { Tissue } from '$lib/enums';
import { diameterAt } from './beam';
import { applicableLimits, MEASURE_UNIT, planMissesT, type LimitAt, type Plan } from './checks';
import { effectGroup } from './effects';
import { exceeds, limitRef, nm, sig, type Context } from './context';
import type { Origin } from './walk';
import type { Working } from './working';

/** One check of one line (one variant of it) against one limit, for the beam of one origin. */
export interface Candidate {
	/** Index of the variant in ctx.lines, and of the line it stands for. */
	variant: number;
	line: number;
	group: string;
	plan: Plan;
	at: LimitAt;
	/** h·X: the power or energy at the origin (of a pulse group under T_i) with the hot-spot factor. */
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
	for (let vi = 0; vi < ctx.lines.length; vi++) {
		const line = ctx.lines[vi];
		const s = origin.states[vi];
		const group = effectGroup(tissue, line.wavelength).id;
		for (const plan of ctx.plans[vi].for(T)) {
			if (planMissesT(plan)) {
				out.needsT = true;
				continue;
			}
			const limits = applicableLimits(plan, line, tissue, ctx.limits);
			if (limits.length === 0 && !out.missingChecks.includes(plan.kind)) out.missingChecks.push(plan.kind);
			for (const at of limits) {
				if (at.natural === null) {
					if (!out.missingChecks.includes(plan.kind)) out.missingChecks.push(plan.kind);
					continue;
				}
				out.used.push(at.limit.index);
				const hx = line.hotSpot * origin.transmission[vi] * plan.source * at.grouped;
				const dc = Math.sqrt(hx / (PI_4 * at.natural));
				let distance = 0;
				let reach = origin.position;
				let unbounded = false;
				if (dc > at.aperture && dc > s.waistDiameter) {
					if (s.divergence === 0) unbounded = true;
					else {
						reach = s.waistPosition + Math.sqrt(dc * dc - s.waistDiameter * s.waistDiameter) / s.divergence;
						distance = Math.max(0, reach - origin.position);
					}
				}
				out.candidates.push({ variant: vi, line: line.index, group, plan, at, hx, dc, distance, reach, unbounded });
			}
		}
	}
	return out;
}

/** A candidate's ratio at z (direct view: C_E = 1). */
function ratioAt(origin: Origin, c: Candidate, z: number): number {
	const D = diameterAt(origin.states[c.variant], z);
	const d = D > c.at.aperture ? D : c.at.aperture;
	return c.hx / (PI_4 * d * d * c.at.natural!);
}

/** Per effect group, the lines in it and, per line, its candidates. */
function byGroup(candidates: Candidate[]): Map<string, Map<number, Candidate[]>> {
	const groups = new Map<string, Map<number, Candidate[]>>();
	for (const c of candidates) {
		let lines = groups.get(c.group);
		if (!lines) groups.set(c.group, (lines = new Map()));
		const list = lines.get(c.line);
		if (list) list.push(c);
		else lines.set(c.line, [c]);
	}
	return groups;
}

/** Σ over lines of each line's largest ratio at z. */
function groupRatio(origin: Origin, lines: Map<number, Candidate[]>, z: number): number {
	let total = 0;
	for (const list of lines.values()) {
		let largest = 0;
		for (const c of list) {
			const r = ratioAt(origin, c, z);
			if (r > largest) largest = r;
		}
		total += largest;
	}
	return total;
}

/** Where the summed ratio of several lines falls to 1, past the common waist. */
function summedReach(origin: Origin, lines: Map<number, Candidate[]>): { reach: number; unbounded: boolean } {
	let waist = origin.position;
	for (const list of lines.values()) for (const c of list) waist = Math.max(waist, origin.states[c.variant].waistPosition);
	if (groupRatio(origin, lines, waist) < 1) return { reach: origin.position, unbounded: false };
	let lo = waist;
	let step = 1;
	let hi = waist + step;
	while (groupRatio(origin, lines, hi) >= 1) {
		lo = hi;
		step *= 2;
		hi = waist + step;
		if (step > 1e30) return { reach: Infinity, unbounded: true };
	}
	for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
		const mid = (lo + hi) / 2;
		if (groupRatio(origin, lines, mid) >= 1) lo = mid;
		else hi = mid;
	}
	return { reach: hi, unbounded: false };
}

/** The worst summed ratio on a stretch [from, to] of the beam, where, and the verdict it gives. */
export function stretchWorst(origin: Origin, b: BeamLimits, from: number, to: number): { ratio: number | null; at: number | null; verdict: Verdict } {
	let ratio: number | null = null;
	let at: number | null = null;
	const probes = new Set<number>();
	for (const c of b.candidates) probes.add(Math.min(to, Math.max(from, origin.states[c.variant].waistPosition)));
	const groups = byGroup(b.candidates);
	for (const z of probes)
		for (const lines of groups.values()) {
			const r = groupRatio(origin, lines, z);
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
	const result = (status: HazardDistance['status'], distance: number | null, reach: number | null, deciding: Candidate | null, summedLines: number[], reason: string): HazardDistance => {
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
			summedLines,
			missingChecks,
			reason,
			candidates: written
		};
		if (lens) {
			out.focusPosition = lens.focusPosition;
			out.distanceFromFocus = distance === null || reach === null ? null : distance === 0 ? 0 : reach - lens.focusPosition;
		}
		return out;
	};
	if (b.needsT) return result('incomplete', null, null, null, [], 'Needs the exposure duration for the hazard distances (nohdExposureDuration).');
	if (candidates.length === 0) return result('no_applicable_limit', null, null, null, [], `No entered ${tissue} limit applies to this beam for the assumed duration; no hazard distance can be given. Not shown as safe.`);

	// Per effect group: one line by the closed form (its farthest candidate), several by their sum.
	let best: { reach: number; unbounded: boolean; deciding: Candidate; summed: number[] } | null = null;
	for (const lines of byGroup(candidates).values()) {
		let farthest: Candidate | null = null;
		for (const list of lines.values()) for (const c of list) if (!farthest || (!farthest.unbounded && (c.unbounded || c.reach > farthest.reach))) farthest = c;
		const option = lines.size === 1 ? { reach: farthest!.reach, unbounded: farthest!.unbounded, deciding: farthest!, summed: [] as number[] } : { ...summedReach(origin, lines), deciding: farthest!, summed: [...lines.keys()] };
		if (!best || (!best.unbounded && (option.unbounded || option.reach > best.reach))) best = option;
	}
	const d = best!.deciding;
	const distance = best!.unbounded ? null : Math.max(0, best!.reach - origin.position);
	const partial = missingChecks.length ? ` No ${tissue} limit (or no pulse-train rule) for the ${missingChecks.map((k) => k.replace('_', ' ')).join(', ')} check: the distance may be understated.` : '';
	const together = best!.summed.length ? `the lines ${best!.summed.map((l) => l + 1).join(' and ')} together are` : 'the beam is';
	if (w) {
		if (best!.summed.length) summedSteps(origin, candidates, best!, w, prefix, where);
		else distanceSteps(ctx, origin, d, w, prefix, where);
	}
	if (best!.unbounded) return result('unbounded', null, null, d, best!.summed, `The beam ${where} does not spread (divergence 0) and exceeds “${d.at.limit.label}”: the hazard distance is unbounded.${partial}`);
	const reason = (distance === 0 ? `The beam ${where} is below the most restrictive ${tissue} limit at every distance.` : `Beyond ${sig(distance!)} m ${where} ${together} below the most restrictive limits.`) + partial;
	return result(missingChecks.length ? 'partial' : 'finite', distance, best!.reach, d, best!.summed, reason);
}

function distanceSteps(ctx: Context, origin: Origin, d: Candidate, w: Working, prefix: string, where: string): void {
	const line = ctx.lines[d.variant];
	const s = origin.states[d.variant];
	const natUnit = MEASURE_UNIT[d.plan.measure];
	const x = d.hx / line.hotSpot;
	if (d.at.limit.quantity !== d.plan.measure) w.add(`${prefix}.limit-measure`, 'Limit in the measure of the source', d.plan.measure === 'irradiance' ? `EL_E = EL_H / ${d.plan.tSymbol}` : `EL_H = EL_E·${d.plan.tSymbol}`, [['EL', d.at.value!, MEASURE_UNIT[d.at.limit.quantity]], [d.plan.tSymbol, d.at.t, 's']], d.at.natural!, natUnit);
	const note = `Most restrictive: “${d.at.limit.label}” (${d.plan.label.toLowerCase()}, ${nm(line.wavelength)}).`;
	if (line.hotSpot === 1) w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', `D_c = √(4·${d.plan.symbol} / (π·EL))`, [[d.plan.symbol, x, d.plan.unit], ['EL', d.at.natural!, natUnit]], d.dc, 'm', note);
	else w.add(`${prefix}.critical-diameter`, 'Diameter at which the exposure equals the limit', `D_c = √(4·h·${d.plan.symbol} / (π·EL))`, [[d.plan.symbol, x, d.plan.unit], ['EL', d.at.natural!, natUnit], ['h', line.hotSpot, '']], d.dc, 'm', note);
	if (d.unbounded) return;
	if (d.distance === 0) {
		w.add(`${prefix}.distance`, `Hazard distance ${where}`, '0 when D_c ≤ max(D_w, D_f)', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['D_f', d.at.aperture, 'm']], 0, 'm');
		return;
	}
	const lensNote = origin.lens
		? `From the focus: ${sig(d.reach - origin.lens.focusPosition)} m; the handbook lens form (f/D_lens)·D_c gives ${sig((origin.lens.focalLength / origin.lens.lensDiameters[d.variant]) * d.dc)} m from the focus.`
		: s.waistPosition === origin.position
			? `Linear handbook form (D_c − D_w)/φ = ${sig((d.dc - s.waistDiameter) / s.divergence)} m.`
			: undefined;
	w.add(`${prefix}.distance`, `Hazard distance ${where}`, 'r = z_w + √(D_c² − D_w²)/φ − z₀', [['D_c', d.dc, 'm'], ['D_w', s.waistDiameter, 'm'], ['φ', s.divergence, 'rad'], ['z_w', s.waistPosition, 'm'], ['z₀', origin.position, 'm']], d.distance, 'm', lensNote);
}

/** The working of a summed distance: each line's ratio at the end found, and their sum (1). */
function summedSteps(origin: Origin, candidates: Candidate[], best: { reach: number; unbounded: boolean; summed: number[] }, w: Working, prefix: string, where: string): void {
	if (best.unbounded) return;
	const z = best.reach;
	const lines = byGroup(candidates.filter((c) => best.summed.includes(c.line)));
	const terms: [string, number, string][] = [];
	let total = 0;
	for (const group of lines.values())
		for (const [line, list] of group) {
			let largest = 0;
			for (const c of list) largest = Math.max(largest, ratioAt(origin, c, z));
			terms.push([`ratio${line + 1}`, largest, '']);
			total += largest;
		}
	w.add(`${prefix}.distance`, `Hazard distance ${where}, lines acting alike summed`, 'Σᵢ ratioᵢ(z₀ + r) = 1, solved numerically', [...terms, ['z₀', origin.position, 'm']], Math.max(0, z - origin.position), 'm', `At the distance found the ratios add up to ${sig(total)}; bisection to 1e-12, the far end taken.`);
}
