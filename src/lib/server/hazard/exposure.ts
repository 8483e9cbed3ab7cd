/**
 * Exposure at a point of concern and its comparison with every applicable limit.
 *
 * Averaging (conservative common practice): the exposure of the beam is averaged over the larger of
 * the beam diameter D and the limit's limiting aperture D_f, and the hot-spot factor h (peak ÷
 * average, 1 for an ideal profile) is applied:
 *     A = π·max(D, D_f)²/4,   E = h·P/A (irradiance),   H = h·Q/A (radiant exposure of one pulse),
 * and H = E·T over the exposure duration T for continuous beams. Putting the whole power into the
 * aperture (rather than the part of a Gaussian that passes it) errs on the safe side.
 *
 * Diffuse (Lambertian) reflection: at distance r from the reflecting spot, viewed at θ from the
 * surface normal, E = ρ·P·cosθ/(π·r²) (and H = ρ·Q·cosθ/(π·r²) per pulse). The reflected field is
 * wide compared with any limiting aperture, so no aperture averaging (and no hot spot) applies; the
 * distance within which it exceeds a limit is r_h = √(ρ·X·cosθ/(π·EL)).
 *
 * A ratio at or above 1 − 1e-9 is at the limit, which exceeds it (see constants.ts).
 */
import type { CheckKind, CheckResult, Comparison, DiffuseDistance, EffectSum, LimitRef, LineAtPoint, LineOpticalDensity, PointResult, Step, Verdict } from '$lib/assessmentResult';
import { AVERSION_DURATION, INVISIBLE_DEFAULT_DURATION, RATIO_TOLERANCE, VISIBLE_MAX, VISIBLE_MIN } from './constants';
import { diameterAt } from './beam';
import { applicableLimits, extendedSourceFactor, MEASURE_SYMBOL, MEASURE_UNIT, planMissesT, type ComparisonTexts, type LimitAt, type Plan, type Plans } from './checks';
import { effectGroup } from './effects';
import { requiredOpticalDensity } from './density';
import { hazardDistance } from './distances';
import { exceeds, limitRef, nm, sig, VERDICT_RANK, worse, type Context } from './context';
import { Working, type In } from './working';
import { enclosureAt, originsAt, type Origin, type Walk } from './walk';
import { pointFieldWords } from '$lib/pathFieldWords';

/** 'points.1.reflectance' → 'the reflectance ρ (0–1)': the form's own label, within the point's message. */
function pointFieldLabel(key: string): string {
	const field = key.split('.').pop() ?? key;
	const words = pointFieldWords[field] ?? field;
	return `the ${words.charAt(0).toLowerCase()}${words.slice(1)}`;
}
import type { NormLimit, NormLine, NormPath, NormPoint } from './validate';

interface LineEval {
	res: LineAtPoint;
	/** Highest ratio among the comparisons made (null when none could be made). */
	ratio: number | null;
	used: number[];
	missingChecks: CheckKind[];
	/** This variant's working (merged into the point's when it decides for its line). */
	steps: Step[];
	/** Highest ratio with every C_E taken as 1 (for the diffuse distance), and the limit and check behind the highest ratio. */
	pointSourceRatio: number | null;
	deciding: { limit: LimitRef; check: CheckKind; label: string } | null;
}

const PI_4 = Math.PI / 4;

/** The prefix of a variant's step ids: 'line2', or 'line2@532nm' for a tunable line's wavelength. */
export function stepPrefix(line: NormLine): string {
	return line.wavelengthMax === null ? `line${line.index + 1}` : `line${line.index + 1}@${nm(line.wavelength).replace(' ', '')}`;
}

/** One line (one variant of it) at a point, seen in the beam of `origin`. */
function evaluateLine(ctx: Context, point: NormPoint, li: number, origin: Origin, missingPoint: string[], breakdown: boolean): LineEval {
	const line = ctx.lines[li];
	const w = new Working(breakdown);
	const state = origin.states[li];
	const tr = origin.transmission[li];
	const z = point.position;
	const diffuse = point.kind === 'diffuse';
	const h = line.hotSpot;
	const p = stepPrefix(line);
	const D = diameterAt(state, z);
	// The apparent source of a diffuse reflection: the spot on the surface seen from r (α_min when viewed directly).
	const alpha = diffuse && point.viewingDistance !== null ? 2 * Math.atan(D / (2 * point.viewingDistance)) : null;
	const P = line.averagePower === null ? null : tr * line.averagePower;
	const Q = line.pulseEnergy === null ? null : tr * line.pulseEnergy;

	if (w.enabled) {
		const factors = origin.factors[li];
		w.add(`${p}.transmission`, 'Transmission of the path up to the point', factors.length ? `T_path = ${factors.map((f) => f.symbol).join('·')}` : 'T_path = 1 (no attenuating element before the point)', factors.map((f) => [f.symbol, f.value, ''] as const), tr, '');
		w.add(`${p}.diameter`, 'Beam diameter at the point' + (line.profile === 'flat_top' ? ' (full width)' : ' (1/e)'), 'D = √(D_w² + (φ·(z − z_w))²)', [['D_w', state.waistDiameter, 'm'], ['φ', state.divergence, 'rad'], ['z', z, 'm'], ['z_w', state.waistPosition, 'm']], D, 'm', (origin.afterElement === null ? 'Beam as it leaves the aperture.' : `Beam after element ${origin.afterElement + 1}.`) + (origin.note ? ` ${origin.note}` : ''));
		if (P !== null) w.add(`${p}.power`, line.mode === 'continuous' ? 'Power at the point' : 'Average power at the point', 'P = T_path·P₀', [['T_path', tr, ''], ['P₀', line.averagePower!, 'W']], P, 'W');
		if (Q !== null) w.add(`${p}.energy`, 'Pulse energy at the point', 'Q = T_path·Q₀', [['T_path', tr, ''], ['Q₀', line.pulseEnergy!, 'J']], Q, 'J');
	}

	// Diffuse geometry G = ρ·cosθ/(π·r²), when the point says enough.
	let G: number | null = null;
	if (diffuse && missingPoint.length === 0) G = (point.reflectance! * Math.cos(point.viewingAngle)) / (Math.PI * point.viewingDistance! * point.viewingDistance!);

	// Exposure before aperture averaging, and photon quantities.
	const perArea = diffuse ? G : h / (PI_4 * D * D);
	const irradiance = P === null || perArea === null ? null : P * perArea;
	const pulseH = Q === null || perArea === null ? null : Q * perArea;
	const ePh = ctx.photonEnergy[li];
	if (w.enabled) {
		const hIn: In[] = h === 1 ? [] : [['h', h, '']];
		if (irradiance !== null) {
			if (diffuse) w.add(`${p}.irradiance`, 'Irradiance of the diffuse reflection at the viewer', 'E = ρ·P·cosθ / (π·r²)', diffuseIn(point, 'P', P!, 'W'), irradiance, 'W/m²', 'Lambertian surface.');
			else w.add(`${p}.irradiance`, 'Irradiance of the beam at the point (no aperture averaging)', h === 1 ? 'E_beam = P / (π·D²/4)' : 'E_beam = h·P / (π·D²/4)', [['P', P!, 'W'], ['D', D, 'm'], ...hIn], irradiance, 'W/m²', h === 1 ? undefined : 'h: hot-spot factor (peak ÷ average) of the beam profile.');
		}
		if (pulseH !== null) {
			if (diffuse) w.add(`${p}.pulse-exposure`, 'Radiant exposure of one pulse of the diffuse reflection at the viewer', 'H = ρ·Q·cosθ / (π·r²)', diffuseIn(point, 'Q', Q!, 'J'), pulseH, 'J/m²', 'Lambertian surface.');
			else w.add(`${p}.pulse-exposure`, 'Radiant exposure of one pulse at the point (no aperture averaging)', h === 1 ? 'H_beam = Q / (π·D²/4)' : 'H_beam = h·Q / (π·D²/4)', [['Q', Q!, 'J'], ['D', D, 'm'], ...hIn], pulseH, 'J/m²');
		}
		if (irradiance !== null) w.add(`${p}.photon-flux-density`, 'Photon flux density at the point', 'Φ_A = E / E_ph', [['E', irradiance, 'W/m²'], ['E_ph', ePh, 'J']], irradiance / ePh, 's⁻¹·m⁻²');
		if (pulseH !== null) w.add(`${p}.photon-fluence`, 'Photons per pulse per area at the point', 'N_A = H / E_ph', [['H', pulseH, 'J/m²'], ['E_ph', ePh, 'J']], pulseH / ePh, 'm⁻²');
	}

	const checks: CheckResult[] = [];
	let verdict: Verdict = 'within_limit';
	let worst: number | null = null;
	const used: number[] = [];
	const missingChecks: CheckKind[] = [];
	const T = point.exposureDuration;
	let pointSourceRatio: number | null = null;
	let deciding: LineEval['deciding'] = null;
	if (alpha !== null && w.enabled) w.add(`${p}.apparent-source`, 'Apparent source of the reflection', 'α = 2·atan(D / (2r))', [['D', D, 'm'], ['r', point.viewingDistance!, 'm']], alpha, 'rad', 'The spot on the surface as seen from the viewer; limits with an extended-source rule use it.');

	for (const plan of ctx.plans[li].for(T)) {
		const missing = planMissesT(plan) ? [`points.${point.index}.exposureDuration`, ...missingPoint] : missingPoint;
		if (missing.length > 0) {
			checks.push({ kind: plan.kind, label: plan.label, duration: plan.t, verdict: 'incomplete', reason: `Needs ${missing.map(pointFieldLabel).join(', ')}.`, ratio: null, decidingLimit: null, comparisons: [], missing: [...missing] });
			verdict = worse(verdict, 'incomplete');
			continue;
		}
		const t = plan.t!;
		const limits = applicableLimits(plan, line, point.tissue, ctx.limits);
		if (limits.length === 0) {
			checks.push({ kind: plan.kind, label: plan.label, duration: t, verdict: 'no_applicable_limit', reason: `No entered limit covers ${point.tissue} exposure at λ = ${nm(line.wavelength)} for ${plan.tSymbol} = ${t} s (${plan.basis === 'continuous' ? 'continuous' : 'single-pulse'} basis).`, ratio: null, decidingLimit: null, comparisons: [], missing: [] });
			verdict = worse(verdict, 'no_applicable_limit');
			missingChecks.push(plan.kind);
			continue;
		}
		const x0 = plan.unit === 'W' ? P! : Q!;
		const comparisons: Comparison[] = [];
		let best = -1;
		let anyIncomplete = false;
		for (let j = 0; j < limits.length; j++) {
			const la = limits[j];
			const limit = la.limit;
			// T_i: a group of pulses counts as one pulse of duration T_i carrying their energy.
			const x = la.grouped === 1 ? x0 : x0 * la.grouped;
			const tl = la.t;
			const ce = extendedSourceFactor(limit, alpha);
			// The words of this comparison's steps are the same at every point: formed once.
			const tx = w.enabled ? (la.texts ??= comparisonTexts(p, plan, limit, h)) : null;
			let exposureNat: number;
			let averaging: number | null = null;
			if (diffuse) {
				exposureNat = G! * x;
				if (tx) w.add(tx.exposure, tx.diffuseLabel, tx.diffuseFormula, diffuseIn(point, plan.symbol, x, plan.unit), exposureNat, MEASURE_UNIT[plan.measure], la.grouped === 1 ? 'Lambertian surface; no aperture averaging.' : `Lambertian surface; ${sig(la.grouped)} pulses within T_i count as one.`);
			} else {
				averaging = D >= la.aperture ? D : la.aperture;
				exposureNat = (h * x) / (PI_4 * averaging * averaging);
				if (tx) {
					w.add(tx.averaging, tx.averagingLabel, 'D_avg = max(D, D_f)', [['D', D, 'm'], ['D_f', la.aperture, 'm']], averaging, 'm', limit.apertureExponent === 0 ? undefined : `D_f = a·tᵇ = ${sig(limit.limitingAperture)}·${sig(tl)}^${limit.apertureExponent} m.`);
					w.add(tx.exposure, tx.averagedLabel, tx.averagedFormula, h === 1 ? [[plan.symbol, x, plan.unit], ['D_avg', averaging, 'm']] : [[plan.symbol, x, plan.unit], ['D_avg', averaging, 'm'], ['h', h, '']], exposureNat, MEASURE_UNIT[plan.measure], la.grouped === 1 ? undefined : `${sig(la.grouped)} pulses within T_i = ${sig(tl)} s count as one: ${plan.symbol} is their energy.`);
				}
			}
			let exposure = exposureNat;
			if (limit.quantity !== plan.measure) {
				exposure = plan.measure === 'irradiance' ? exposureNat * tl : exposureNat / tl;
				if (tx) {
					if (plan.measure === 'irradiance') w.add(tx.convert, tx.convertLabel, tx.convertFormula, [['E', exposureNat, 'W/m²'], [plan.tSymbol, tl, 's']], exposure, 'J/m²');
					else w.add(tx.convert, tx.convertLabel, tx.convertFormula, [['H', exposureNat, 'J/m²'], ['τ', tl, 's']], exposure, 'W/m²');
				}
			}
			const unit = MEASURE_UNIT[limit.quantity];
			const cmp: Comparison = {
				limit: limit.cited,
				quantity: limit.quantity,
				unit,
				duration: tl,
				limitingAperture: la.aperture,
				beamDiameter: diffuse ? null : D,
				averagingDiameter: averaging,
				exposure,
				limitValue: la.value === null ? null : la.value * ce,
				wavelengthFactor: la.wavelengthFactor,
				extendedSourceFactor: ce,
				ratio: null,
				verdict: 'incomplete',
				deciding: false
			};
			if (la.grouped !== 1) cmp.groupedPulses = la.grouped;
			if (plan.kind === 'pulse_train') {
				cmp.pulseCount = la.pulseCount!;
				cmp.trainRule = la.trainRule;
				if (la.trainFactor !== undefined) cmp.trainFactor = la.trainFactor;
			}
			used.push(limit.index);
			if (la.value === null) {
				cmp.reason = `“${limit.label}” gives no pulse-train rule: enter its exponent, or mark it “no train correction” if the local code applies none.`;
				anyIncomplete = true;
				comparisons.push(cmp);
				continue;
			}
			const value = la.value * ce;
			if (tx) limitStep(w, tx.limit, la, ce, alpha);
			const ratio = exposure / value;
			cmp.ratio = ratio;
			cmp.verdict = exceeds(ratio) ? 'exceeds_limit' : 'within_limit';
			if (tx) w.add(tx.ratio, tx.ratioLabel, tx.ratioFormula, [[MEASURE_SYMBOL[limit.quantity], exposure, unit], ['EL', value, unit]], ratio, '');
			comparisons.push(cmp);
			if (best < 0 || ratio > comparisons[best].ratio!) best = comparisons.length - 1;
			if (pointSourceRatio === null || ratio * ce > pointSourceRatio) pointSourceRatio = ratio * ce;
		}
		if (anyIncomplete) missingChecks.push(plan.kind);
		let checkVerdict: Verdict;
		let reason: string;
		const decided = best >= 0 ? comparisons[best] : null;
		if (decided) decided.deciding = true;
		if (decided && exceeds(decided.ratio!)) {
			checkVerdict = 'exceeds_limit';
			reason = `Exceeds “${decided.limit.label}”, the most restrictive applicable limit.`;
		} else if (anyIncomplete) {
			checkVerdict = 'incomplete';
			const names = comparisons.filter((c) => c.ratio === null).map((c) => `“${c.limit.label}”`);
			reason = `${names.join(', ')} ${names.length === 1 ? 'gives' : 'give'} no pulse-train rule, so the pulse train cannot be checked against ${names.length === 1 ? 'it' : 'them'}.` + (decided ? ' The ratio shown is against the others only.' : '');
		} else {
			checkVerdict = 'within_limit';
			reason = `Within “${decided!.limit.label}”, the most restrictive applicable limit.`;
		}
		verdict = worse(verdict, checkVerdict);
		if (decided && (worst === null || decided.ratio! > worst)) {
			worst = decided.ratio!;
			deciding = { limit: limits[best].limit.ref, check: plan.kind, label: limits[best].limit.label };
		}
		checks.push({ kind: plan.kind, label: plan.label, duration: t, verdict: checkVerdict, reason, ratio: decided ? decided.ratio : null, decidingLimit: decided ? limits[best].limit.ref : null, comparisons, missing: [] });
	}
	const od = worst === null ? null : requiredOpticalDensity(worst);
	return {
		res: {
			line: line.index,
			wavelength: line.wavelength,
			tuning: null,
			effectGroup: effectGroup(point.tissue, line.wavelength).label,
			apparentSource: alpha,
			transmissionFactor: tr,
			power: P,
			pulseEnergy: Q,
			beamDiameter: D,
			beamDivergence: state.divergence,
			irradiance,
			pulseRadiantExposure: pulseH,
			photonFluxDensity: irradiance === null ? null : irradiance / ePh,
			photonFluencePerPulse: pulseH === null ? null : pulseH / ePh,
			checks,
			verdict,
			worstRatio: worst,
			requiredOpticalDensity: od
		},
		ratio: worst,
		used,
		missingChecks,
		steps: w.steps,
		pointSourceRatio,
		deciding
	};
}

function comparisonTexts(p: string, plan: Plan, limit: NormLimit, h: number): ComparisonTexts {
	const sid = `${p}.${plan.kind}.limit${limit.index + 1}`;
	const nat = MEASURE_SYMBOL[plan.measure];
	return {
		averaging: `${sid}.averaging`,
		exposure: `${sid}.exposure`,
		convert: `${sid}.convert`,
		limit: `${sid}.limit`,
		ratio: `${sid}.ratio`,
		averagingLabel: `${plan.label}: averaging diameter`,
		averagedLabel: `${plan.label}: exposure averaged over D_avg`,
		averagedFormula: h === 1 ? `${nat} = ${plan.symbol} / (π·D_avg²/4)` : `${nat} = h·${plan.symbol} / (π·D_avg²/4)`,
		diffuseLabel: `${plan.label}: exposure at the viewer`,
		diffuseFormula: `${nat} = ρ·${plan.symbol}·cosθ / (π·r²)`,
		convertLabel: plan.measure === 'irradiance' ? `${plan.label}: radiant exposure over ${plan.tSymbol}` : `${plan.label}: irradiance during the pulse`,
		convertFormula: plan.measure === 'irradiance' ? `H = E·${plan.tSymbol}` : 'E = H / τ',
		ratioLabel: `${plan.label}: ratio to “${limit.label}”`,
		ratioFormula: `ratio = ${MEASURE_SYMBOL[limit.quantity]} / EL`
	};
}

/**
 * The limit's step: EL = k·C(λ)·C_E(α)·tⁿ (× N^x for a pulse train), with the factors that are not 1.
 * Where C_E is 1 (every direct view) the step is the same at every point: formed once and shared.
 */
function limitStep(w: Working, id: string, la: LimitAt, ce: number, alpha: number | null): void {
	if (ce === 1 && la.step) return w.push(la.step);
	const l = la.limit;
	const unit = MEASURE_UNIT[l.quantity];
	const factors: In[] = [];
	let formula = 'EL = k';
	if (l.wavelengthFactor) {
		formula += '·C(λ)';
		factors.push(['C(λ)', la.wavelengthFactor, '']);
	}
	if (ce !== 1) {
		formula += '·C_E(α)';
		factors.push(['C_E', ce, ''], ['α', alpha!, 'rad']);
	}
	formula += l.n === 0 ? '' : '·tⁿ';
	const inputs: In[] = [['k', l.k, unit], ...factors, ['t', la.t, 's'], ['n', l.n, '']];
	if (la.trainRule === 'exponent') {
		formula += '·N^x';
		inputs.push(['N', la.pulseCount!, ''], ['x', l.trainExponent!, '']);
	}
	const notes = [l.citation];
	if (l.wavelengthFactor?.kind === 'exponential') notes.push(`C(λ) = 10^(${sig(l.wavelengthFactor.slope * 1e-9)}/nm·(λ − ${nm(l.wavelengthFactor.origin)})), λ held within ${nm(l.wavelengthFactor.from)}–${nm(l.wavelengthFactor.to)}.`);
	if (l.extendedSource) notes.push(`C_E = (α/α_min)^${l.extendedSource.exponent} for α_min = ${sig(l.extendedSource.alphaMin)} rad < α < α_max = ${sig(l.extendedSource.alphaMax)} rad.`);
	if (la.grouped !== 1) notes.push(`Evaluated at T_i = ${sig(la.t)} s: pulses within T_i count as one.`);
	if (la.trainRule === 'no_correction') notes.push('No pulse-train correction, as the officer entered it.');
	const scratch = new Working(true);
	scratch.add(id, la.trainRule === 'exponent' ? `Limit “${l.label}” for the pulse train` : `Limit “${l.label}”`, formula, inputs, la.value! * ce, unit, notes.join(' '));
	if (ce === 1) la.step = scratch.steps[0];
	w.push(scratch.steps[0]);
}

function diffuseIn(point: NormPoint, symbol: string, x: number, unit: string): In[] {
	return [['ρ', point.reflectance!, ''], [symbol, x, unit], ['θ', point.viewingAngle, 'rad'], ['r', point.viewingDistance!, 'm']];
}

/** Durations shorter than the usual default give less restrictive limits: say so. */
export function durationWarning(T: number | null, lambda: number, tissue: 'eye' | 'skin', what: string): string | null {
	if (T === null) return null;
	const visible = lambda >= VISIBLE_MIN && lambda <= VISIBLE_MAX;
	if (tissue === 'eye' && visible && T < AVERSION_DURATION) return `${what} (${T} s) is shorter than the ${AVERSION_DURATION} s aversion response usually assumed for a visible beam (${nm(lambda)}): the limit is less restrictive than at ${AVERSION_DURATION} s.`;
	if ((tissue === 'skin' || !visible) && T < INVISIBLE_DEFAULT_DURATION)
		return `${what} (${T} s) is shorter than the ${INVISIBLE_DEFAULT_DURATION} s usually assumed ${tissue === 'skin' ? 'for the skin' : `at ${nm(lambda)}, where no aversion response protects the eye`}: the limit is less restrictive than at ${INVISIBLE_DEFAULT_DURATION} s.`;
	return null;
}

export interface PointEval {
	result: PointResult;
	ratio: number | null;
	used: number[];
}

/** A point in the worse of the beams it sees (at an element, both sides). */
export function evaluatePoint(ctx: Context, point: NormPoint, withBreakdown = true): PointEval {
	const enclosedBy = enclosureAt(ctx.walk, point.position);
	let best: PointEval | null = null;
	for (const origin of originsAt(ctx.walk, point.position)) {
		const ev = evaluateSide(ctx, point, origin, enclosedBy, withBreakdown);
		// The worse side decides; equal sides keep the earlier beam.
		if (!best || VERDICT_RANK[ev.result.verdict] > VERDICT_RANK[best.result.verdict] || (ev.result.verdict === best.result.verdict && ev.ratio !== null && (best.ratio === null || ev.ratio > best.ratio))) best = ev;
	}
	return best!;
}

function evaluateSide(ctx: Context, point: NormPoint, origin: Origin, enclosedBy: number | null, withBreakdown: boolean): PointEval {
	const breakdown = ctx.breakdown && withBreakdown;
	const w = new Working(breakdown);
	const missingPoint: string[] = [];
	if (point.kind === 'diffuse') {
		if (point.reflectance === null) missingPoint.push(`points.${point.index}.reflectance`);
		if (point.viewingDistance === null) missingPoint.push(`points.${point.index}.viewingDistance`);
	}
	const used: number[] = [];
	let verdict: Verdict = 'within_limit';
	const missingChecks: CheckKind[] = [];
	const missing = new Set<string>(missingPoint);

	// Every variant of every line; per line, its worst variant is what the point shows for it.
	const perLine: (LineEval | null)[] = ctx.path.lines.map(() => null);
	const assessedAt: number[][] = ctx.path.lines.map(() => []);
	// Per effect group and line, the worst ratio of that line's variants in the group.
	const groups = new Map<string, { label: string; ratios: Map<number, number>; pointSource: Map<number, number> }>();
	for (let vi = 0; vi < ctx.lines.length; vi++) {
		const ev = evaluateLine(ctx, point, vi, origin, missingPoint, breakdown);
		const li = ev.res.line;
		assessedAt[li].push(ev.res.wavelength);
		for (const u of ev.used) used.push(u);
		verdict = worse(verdict, ev.res.verdict);
		for (const k of ev.missingChecks) if (!missingChecks.includes(k)) missingChecks.push(k);
		for (const c of ev.res.checks) for (const m of c.missing) missing.add(m);
		const shown = perLine[li];
		if (!shown || (ev.ratio !== null && (shown.ratio === null || ev.ratio > shown.ratio)) || (ev.ratio === null && shown.ratio === null && VERDICT_RANK[ev.res.verdict] > VERDICT_RANK[shown.res.verdict])) perLine[li] = ev;
		if (ev.ratio !== null) {
			const g = effectGroup(point.tissue, ev.res.wavelength);
			let entry = groups.get(g.id);
			if (!entry) groups.set(g.id, (entry = { label: g.label, ratios: new Map(), pointSource: new Map() }));
			if (ev.ratio > (entry.ratios.get(li) ?? -1)) entry.ratios.set(li, ev.ratio);
			if (ev.pointSourceRatio! > (entry.pointSource.get(li) ?? -1)) entry.pointSource.set(li, ev.pointSourceRatio!);
		}
	}
	const lines: LineAtPoint[] = [];
	perLine.forEach((ev, li) => {
		const res = ev!.res;
		const line = ctx.path.lines[li];
		if (line.wavelengthMax !== null) res.tuning = { from: line.wavelength, to: line.wavelengthMax, assessedAt: assessedAt[li] };
		lines.push(res);
		for (const step of ev!.steps) w.push(step);
	});

	// Lines that act alike add up: the point's ratio is the largest sum.
	const sums: EffectSum[] = [];
	let ratio: number | null = null;
	let pointSource: number | null = null;
	for (const [id, g] of groups) {
		let total = 0;
		const members: EffectSum['lines'] = [];
		for (const [line, r] of g.ratios) {
			total += r;
			members.push({ line, ratio: r });
		}
		let totalPointSource = 0;
		for (const r of g.pointSource.values()) totalPointSource += r;
		sums.push({ group: id, label: g.label, lines: members, ratio: total, verdict: exceeds(total) ? 'exceeds_limit' : 'within_limit' });
		if (ratio === null || total > ratio) ratio = total;
		if (pointSource === null || totalPointSource > pointSource) pointSource = totalPointSource;
		if (w.enabled && members.length > 1)
			w.add(`sum.${id}`, `Sum of the lines that act alike: ${g.label}`, 'Σ ratioᵢ', members.map((m) => [`ratio${subscriptOf(m.line + 1)}`, m.ratio, ''] as const), total, '', 'Each line’s worst check; exposures of lines acting on the same tissue in the same way add (Σ Hᵢ/ELᵢ ≤ 1).');
	}
	if (ratio !== null && exceeds(ratio)) verdict = 'exceeds_limit';
	const od = ratio === null ? null : requiredOpticalDensity(ratio);
	if (od && w.enabled) w.add('optical-density', 'Optical density needed', 'OD = log₁₀(ratio) (0 when ratio ≤ 1)', [['ratio', ratio!, '']], od.value, '', `Rounded up: ${od.roundedUpTenth} (one decimal), ${od.roundedUpWhole} (whole).`);

	// Per line, the OD that brings the largest sum it takes part in down to the limit.
	const requiredOpticalDensities: LineOpticalDensity[] = [];
	ctx.path.lines.forEach((line, li) => {
		let largest: number | null = null;
		for (const g of groups.values()) {
			const own = g.ratios.get(li);
			if (own === undefined || own <= 0) continue;
			let total = 0;
			for (const r of g.ratios.values()) total += r;
			if (largest === null || total > largest) largest = total;
		}
		if (largest !== null) requiredOpticalDensities.push({ line: li, wavelengthMin: line.wavelength, wavelengthMax: line.wavelengthMax ?? line.wavelength, od: requiredOpticalDensity(largest) });
	});

	let diffuseHazardDistance: DiffuseDistance | null = null;
	if (point.kind === 'diffuse') diffuseHazardDistance = diffuseDistance(point, pointSource, perLine, missingChecks, missingPoint, w);

	const warnings: string[] = [];
	for (const line of ctx.path.lines) {
		const warning = durationWarning(point.exposureDuration, line.wavelength, point.tissue, 'The exposure duration');
		if (warning && !warnings.includes(warning)) warnings.push(warning);
	}
	if (origin.note) warnings.push(origin.note);

	const skinHazardDistance = point.tissue === 'skin' && point.kind === 'intrabeam' ? hazardDistance(ctx, origin, 'skin', point.exposureDuration, w.enabled ? w : null, 'skin-hazard-distance') : null;

	const accessible = enclosedBy === null;
	const result: PointResult = {
		id: point.id,
		label: point.label,
		tissue: point.tissue,
		kind: point.kind,
		position: point.position,
		accessible,
		enclosedBy,
		beamAfterElement: origin.afterElement,
		verdict,
		reason: pointReason(verdict, lines, sums, accessible, enclosedBy),
		missing: [...missing],
		warnings,
		lines,
		sums,
		worstRatio: ratio,
		requiredOpticalDensity: od,
		requiredOpticalDensities,
		diffuseHazardDistance,
		skinHazardDistance,
		breakdown: w.steps
	};
	return { result, ratio, used };
}

const SUBSCRIPT_DIGITS = '₀₁₂₃₄₅₆₇₈₉';
const subscriptOf = (n: number) => String(n).replace(/\d/g, (d) => SUBSCRIPT_DIGITS[Number(d)]);

/**
 * r_h: within this distance of the reflecting spot the reflection exceeds the limits. Every ratio of a
 * diffuse reflection falls as 1/r², so r_h = r·√(Σ ratios at r), the sum taken as for a point source
 * (C_E = 1), which can only lengthen it. For one line this is √(ρ·X·cosθ/(π·EL)).
 */
function diffuseDistance(point: NormPoint, sum: number | null, perLine: (LineEval | null)[], missingChecks: CheckKind[], missingPoint: string[], w: Working): DiffuseDistance {
	const lacking = missingChecks.length ? ` No limit (or no pulse-train rule) for the ${missingChecks.map((k) => k.replace('_', ' ')).join(', ')} check: the distance may be understated.` : '';
	const none = { distance: null, decidingLimit: null, decidingCheck: null, decidingLine: null, missingChecks };
	if (missingPoint.length) return { ...none, status: 'incomplete', reason: `Needs ${missingPoint.map(pointFieldLabel).join(' and ')} of the reflection.` };
	if (sum === null) return { ...none, status: 'no_applicable_limit', reason: 'No entered limit applies to this reflection: no hazard distance can be given. Not shown as safe.' };
	const r = point.viewingDistance! * Math.sqrt(sum);
	// The line and limit that weigh most.
	let decidingLine = 0;
	for (let i = 0; i < perLine.length; i++) if ((perLine[i]?.pointSourceRatio ?? -1) > (perLine[decidingLine]?.pointSourceRatio ?? -1)) decidingLine = i;
	const deciding = perLine[decidingLine]!.deciding;
	if (w.enabled) w.add('diffuse-hazard-distance', 'Diffuse-reflection hazard distance', perLine.length > 1 ? 'r_h = r·√(Σ ratios at r)' : 'r_h = r·√(ratio at r)', [['r', point.viewingDistance!, 'm'], ['Σ ratio', sum, '']], r, 'm', 'Each ratio of a diffuse reflection falls as 1/r²; taken for a point source (C_E = 1), which can only lengthen the distance.');
	return {
		status: missingChecks.length ? 'partial' : 'finite',
		distance: r,
		decidingLimit: deciding ? deciding.limit : null,
		decidingCheck: deciding ? deciding.check : null,
		decidingLine,
		missingChecks,
		reason: `Within ${sig(r)} m of the reflecting spot the reflection exceeds ${deciding ? `“${deciding.label}”` : 'its limits'}.${lacking}`
	};
}

function pointReason(verdict: Verdict, lines: LineAtPoint[], sums: EffectSum[], accessible: boolean, enclosedBy: number | null): string {
	const lead = accessible ? '' : `Inside the enclosure (element ${enclosedBy! + 1}): not accessible, reported but left out of the overall verdict. `;
	let decisive: CheckResult | undefined;
	for (const l of lines) for (const c of l.checks) if (!decisive && c.verdict === verdict) decisive = c;
	const summed = sums.find((s) => s.lines.length > 1 && s.verdict === 'exceeds_limit');
	if (verdict === 'exceeds_limit' && summed && !lines.some((l) => l.verdict === 'exceeds_limit'))
		return lead + `No line exceeds its limits alone, but together they do: the lines acting on the ${summed.label} add up to more than the limit.`;
	switch (verdict) {
		case 'exceeds_limit':
		case 'incomplete':
			return lead + (decisive ? `${decisive.label}: ${decisive.reason}` : 'Input is missing.');
		case 'no_applicable_limit':
			return lead + (decisive ? `${decisive.label}: ${decisive.reason}` : 'No entered limit applies.') + ' Not shown as safe.';
		case 'within_limit':
			return lead + 'Every check is within its most restrictive applicable limit.';
	}
}
