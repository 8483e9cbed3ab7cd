/**
 * Exposure at a point of concern and its comparison with every applicable limit.
 *
 * Averaging (conservative common practice): the exposure is averaged over the larger of the beam
 * diameter D (1/e) and the limit's limiting aperture D_f:
 *     A = π·max(D, D_f)²/4,   E = P/A (irradiance),   H = Q/A (radiant exposure of one pulse),
 * and H = E·T over the exposure duration T for continuous beams.
 *
 * Diffuse (Lambertian) reflection: at distance r from the reflecting spot, viewed at θ from the
 * surface normal, E = ρ·P·cosθ/(π·r²) (and H = ρ·Q·cosθ/(π·r²) per pulse). The reflected field is
 * spread wide compared with any limiting aperture, so no aperture averaging is applied.
 *
 * Checks by emission mode:
 *   continuous   — continuous exposure: E (or H = E·T) against continuous-basis limits at t = T;
 *   single pulse — H of the pulse against single-pulse limits at t = τ;
 *   repetitive   — (1) single pulse as above; (2) average power Q·f over T against continuous-basis
 *                  limits at t = T; (3) pulse train: H of one pulse against a single-pulse limit
 *                  × N^x, N = f·T pulses (at least 1), for single-pulse limits that give x.
 *                  Checks 1 and 2 are required; check 3 is made wherever a limit gives an exponent.
 * A limit applies when tissue, wavelength (inclusive range) and the check's duration (inclusive
 * range) match and its pulse basis fits the check. Several applicable limits: each is compared and
 * reported, and the highest ratio (the most restrictive limit) decides the check.
 */
import type Decimal from 'decimal.js';
import { numbersOf, type Numbers } from './constants';
import { diameterFromSquare, diameterSquaredAt, spreadsAt } from './beam';
import { compare } from './digits';
import { cosAcute, compareClear, roughSqrt, ROUGH_SQRT_ERROR, sqrt } from './fastmath';
import { Working, type StepInput } from './breakdown';
import { requiredOpticalDensity, writeOd } from './density';
import { beamsAt, enclosureAt, type BeamSnapshot, type PathModel } from './elements';
import { clearText, fmt, toSignificantString } from './format';
import { limitReciprocal, limitRef, limitValueAt, memoPow, pulseCount, type LimitIndex } from './limits';
import type { NormLimit, NormLine, NormPoint } from './validate';
import type { CheckKind, CheckResult, Comparison, DiffuseDistance, LimitQuantity, PointResult, PulseBasis, Tissue, Verdict } from './types';

export const VERDICT_RANK: Record<Verdict, number> = {
	within_limit: 0,
	no_applicable_limit: 1,
	incomplete: 2,
	exceeds_limit: 3
};

export function worseVerdict(a: Verdict, b: Verdict): Verdict {
	return VERDICT_RANK[a] >= VERDICT_RANK[b] ? a : b;
}

export interface CheckPlan {
	kind: CheckKind;
	label: string;
	basis: PulseBasis;
	/** τ or T; null when T is needed but missing. */
	duration: Decimal | null;
	durationSymbol: 'τ' | 'T';
	/** 'irradiance' when the source is a power, 'radiant_exposure' when it is a pulse energy. */
	measure: LimitQuantity;
	/** Power or energy at the aperture. */
	source: Decimal;
	sourceSymbol: string;
	pointSymbol: string;
	sourceUnit: 'W' | 'J';
	/** Pulse-train check: N = max(1, f·T); null when T is missing. */
	pulseCount: Decimal | null;
	needsTrainExponent: boolean;
	/** Optional checks are only reported when a limit for them exists. */
	optional: boolean;
	/** The check needs the exposure duration T and it is missing. */
	missingT: boolean;
	/**
	 * Per-assessment memos (the points and hazard distances of an assessment share its plans): the
	 * applicable limits by tissue, each limit evaluated for the plan, the written duration and 1/t.
	 */
	applicable?: Partial<Record<Tissue, NormLimit[]>>;
	/** By limit index (the limits of one assessment). */
	evaluated?: (LimitInPlan | undefined)[];
	durationText?: string;
	pulseCountText?: string;
	perDuration?: Decimal;
	stepTexts?: (StepTexts | undefined)[];
}

export function planChecks(line: NormLine, T: Decimal | null): CheckPlan[] {
	const missingT = T === null;
	if (line.mode === 'continuous') {
		return [
			{ kind: 'continuous', label: 'Continuous exposure', basis: 'continuous', duration: T, durationSymbol: 'T', measure: 'irradiance', source: line.power!, sourceSymbol: 'P₀', pointSymbol: 'P', sourceUnit: 'W', pulseCount: null, needsTrainExponent: false, optional: false, missingT }
		];
	}
	const single: CheckPlan = { kind: 'single_pulse', label: 'Single pulse', basis: 'single_pulse', duration: line.pulseDuration!, durationSymbol: 'τ', measure: 'radiant_exposure', source: line.pulseEnergy!, sourceSymbol: 'Q₀', pointSymbol: 'Q', sourceUnit: 'J', pulseCount: null, needsTrainExponent: false, optional: false, missingT: false };
	if (line.mode === 'single_pulse') return [single];
	const count = T === null ? null : pulseCount(line.repetitionRate!, T);
	return [
		single,
		{ kind: 'average_power', label: 'Average power over T', basis: 'continuous', duration: T, durationSymbol: 'T', measure: 'irradiance', source: line.averagePower!, sourceSymbol: 'P_avg,0', pointSymbol: 'P_avg', sourceUnit: 'W', pulseCount: null, needsTrainExponent: false, optional: false, missingT },
		{ kind: 'pulse_train', label: 'Pulse train', basis: 'single_pulse', duration: line.pulseDuration!, durationSymbol: 'τ', measure: 'radiant_exposure', source: line.pulseEnergy!, sourceSymbol: 'Q₀', pointSymbol: 'Q', sourceUnit: 'J', pulseCount: count, needsTrainExponent: true, optional: true, missingT }
	];
}

export const MEASURE_UNIT: Record<LimitQuantity, 'W/m²' | 'J/m²'> = { irradiance: 'W/m²', radiant_exposure: 'J/m²' };
export const MEASURE_SYMBOL: Record<LimitQuantity, 'E' | 'H'> = { irradiance: 'E', radiant_exposure: 'H' };

/** Limit expressed in the plan's measure, × the pulse-train factor where it applies. */
export interface LimitInPlan {
	/** In the limit's own quantity. */
	value: Decimal;
	/** In the plan's measure (for hazard distances). */
	natural: Decimal;
	trainFactor: Decimal | null;
	/** 1/value, so that ratios are products. */
	inverse: Decimal;
	/** 1/natural (hazard distances), formed when first needed. */
	inverseNatural?: Decimal;
	/** 1/(π·D_f²/4) × t (or ÷ t): exposure over the aperture and in the limit's quantity in one product. */
	apertureFactor?: Decimal;
	/** Written value and train factor, once per assessment. */
	valueText?: string;
	trainFactorText?: string;
}

/** The limit for a plan, once per assessment: memoised on the plan (see CheckPlan). */
export function evaluateLimit(limit: NormLimit, plan: CheckPlan, t: Decimal): LimitInPlan {
	const memo = (plan.evaluated ??= []);
	let lim = memo[limit.index];
	if (lim) return lim;
	const base = limitValueAt(limit, t);
	let value = base;
	let trainFactor: Decimal | null = null;
	let inverse: Decimal;
	if (plan.needsTrainExponent && plan.pulseCount && limit.pulseTrainExponent) {
		trainFactor = memoPow(plan.pulseCount, limit.pulseTrainExponent);
		value = base.times(trainFactor);
		inverse = numbersOf(value).ONE.div(value);
	} else {
		inverse = limitReciprocal(limit, t, base);
	}
	const natural = limit.quantity === plan.measure ? value : plan.measure === 'irradiance' ? value.times(perDuration(plan, t)) : value.times(t);
	lim = { value, natural, trainFactor, inverse };
	memo[limit.index] = lim;
	return lim;
}

/** 1/(π·D_f²/4) × factor (t or 1/t), once per assessment and limit. */
function apertureFactor(lim: LimitInPlan, limit: NormLimit, factor: Decimal): Decimal {
	return (lim.apertureFactor ??= limit.perApertureArea!.times(factor));
}

/** 1/t of the plan, once per assessment. */
function perDuration(plan: CheckPlan, t: Decimal): Decimal {
	return (plan.perDuration ??= numbersOf(t).ONE.div(t));
}

/** 1/EL in the plan's measure. */
export function inverseNatural(lim: LimitInPlan, plan: CheckPlan, limit: NormLimit, t: Decimal): Decimal {
	if (lim.inverseNatural) return lim.inverseNatural;
	// EL_nat = EL/t (irradiance plan, radiant-exposure limit) or EL·t (the other way round).
	const inv = limit.quantity === plan.measure ? lim.inverse : plan.measure === 'irradiance' ? lim.inverse.times(t) : lim.inverse.times(perDuration(plan, t));
	lim.inverseNatural = inv;
	return inv;
}

/** Ids, labels and formulas of the steps of one comparison: the same for every point of an assessment. */
interface StepTexts {
	averaging: string;
	exposure: string;
	convert: string;
	limit: string;
	ratio: string;
	averagingLabel: string;
	averagedLabel: string;
	averagedFormula: string;
	diffuseLabel: string;
	diffuseFormula: string;
	convertLabel: string;
	convertFormula: string;
	ratioLabel: string;
	ratioFormula: string;
}
function stepTexts(plan: CheckPlan, limit: NormLimit): StepTexts {
	const byLimit = (plan.stepTexts ??= []);
	let st = byLimit[limit.index];
	if (!st) {
		const sid = `${plan.kind}.limit${limit.index}`;
		const nat = MEASURE_SYMBOL[plan.measure];
		const xs = plan.pointSymbol;
		st = {
			averaging: `${sid}.averaging`,
			exposure: `${sid}.exposure`,
			convert: `${sid}.convert`,
			limit: `${sid}.limit`,
			ratio: `${sid}.ratio`,
			averagingLabel: `${plan.label}: averaging diameter`,
			averagedLabel: `${plan.label}: exposure averaged over D_avg`,
			averagedFormula: `${nat} = ${xs} / (π·D_avg²/4)`,
			diffuseLabel: `${plan.label}: exposure at the viewer`,
			diffuseFormula: `${nat} = ρ·${xs}·cosθ / (π·r²)`,
			convertLabel: plan.measure === 'irradiance' ? `${plan.label}: radiant exposure over ${plan.durationSymbol}` : `${plan.label}: irradiance during the pulse`,
			convertFormula: `H = E·${plan.durationSymbol}`,
			ratioLabel: `${plan.label}: ratio to “${limit.label}”`,
			ratioFormula: `ratio = ${MEASURE_SYMBOL[limit.quantity]} / EL`
		};
		byLimit[limit.index] = st;
	}
	return st;
}

/** Written forms of values that recur in every comparison (formed once, then shared). */
export function limitTexts(limit: NormLimit) {
	const t = limit.texts;
	return {
		k: (t.k ??= fmt(limit.k)),
		n: (t.n ??= fmt(limit.n)),
		aperture: (t.aperture ??= fmt(limit.limitingAperture))
	};
}
function apertureText(limit: NormLimit): string {
	return (limit.texts.aperture ??= fmt(limit.limitingAperture));
}
function valueText(lim: LimitInPlan): string {
	return (lim.valueText ??= fmt(lim.value));
}

/** The limit for the plan, with its breakdown step when `w` is given. */
export function limitForPlan(limit: NormLimit, plan: CheckPlan, t: Decimal, w: Working | null, stepId: string): LimitInPlan {
	const lim = evaluateLimit(limit, plan, t);
	if (w?.enabled) {
		const unit = MEASURE_UNIT[limit.quantity];
		const texts = limitTexts(limit);
		const tText = durationText(plan, t);
		if (lim.trainFactor) {
			w.add(stepId, `Limit “${limit.label}” for the pulse train`, 'EL = k·tⁿ·N^x', [['k', texts.k, unit], ['t', tText, 's'], ['n', texts.n, ''], ['N', (plan.pulseCountText ??= fmt(plan.pulseCount!)), ''], ['x', (limit.texts.trainExponent ??= fmt(limit.pulseTrainExponent!)), '']], valueText(lim), unit, limit.citation);
		} else {
			w.add(stepId, `Limit “${limit.label}”`, 'EL = k·tⁿ', [['k', texts.k, unit], ['t', tText, 's'], ['n', texts.n, '']], valueText(lim), unit, limit.citation);
		}
	}
	return lim;
}

export interface PointContext {
	line: NormLine;
	limits: LimitIndex;
	photonEnergy: Decimal;
	/** 1/E_ph, so that photon counts are products. */
	perPhoton: Decimal;
	/** Check plans by exposure duration (interned), shared by the points and distances of the assessment. */
	plans: Map<Decimal | null, CheckPlan[]>;
	breakdown: boolean;
	used: Set<NormLimit>;
	K: Numbers;
	/** E_ph as written. */
	photonEnergyText: string;
}

export function plansFor(ctx: PointContext, T: Decimal | null): CheckPlan[] {
	let plans = ctx.plans.get(T);
	if (!plans) {
		plans = planChecks(ctx.line, T);
		ctx.plans.set(T, plans);
	}
	return plans;
}

/** The limits that apply to a plan for a tissue, once per assessment. */
export function applicableLimits(ctx: PointContext, plan: CheckPlan, tissue: Tissue): NormLimit[] {
	const t = plan.duration;
	if (t === null) return [];
	const byTissue = (plan.applicable ??= {});
	return (byTissue[tissue] ??= ctx.limits.find(tissue, plan.basis, t, plan.needsTrainExponent));
}

function durationText(plan: CheckPlan, t: Decimal): string {
	return (plan.durationText ??= fmt(t));
}

interface Evaluated {
	result: PointResult;
	ratio: Decimal | null;
	verdict: Verdict;
	used: NormLimit[];
}

export function evaluatePoint(ctx: PointContext, point: NormPoint, path: PathModel): { result: PointResult; ratio: Decimal | null } {
	const enclosure = enclosureAt(path, point.position);
	let best: Evaluated | null = null;
	for (const beam of beamsAt(path, point.position)) {
		const ev = evaluateWithBeam(ctx, point, beam, enclosure ? enclosure.index : null);
		// The worse side decides; sides whose worst ratios are written alike (the same beam on both
		// sides of a neutral element, or of two that cancel) are a tie, kept as the earlier beam, so
		// that arithmetic noise below the written digits cannot choose.
		if (!best || VERDICT_RANK[ev.verdict] > VERDICT_RANK[best.verdict] || (ev.verdict === best.verdict && ev.ratio && (!best.ratio || (ev.result.worstRatio !== best.result.worstRatio && compare(ev.ratio, best.ratio) > 0)))) {
			best = ev;
		}
	}
	// Only the chosen beam's limits count as used.
	for (const l of best!.used) ctx.used.add(l);
	return { result: best!.result, ratio: best!.ratio };
}

const NO_MISSING: string[] = [];

function diffuseInputs(texts: [string, string, string], sym: string, v: string, u: string): StepInput[] {
	return [['ρ', texts[0], ''], [sym, v, u], ['θ', texts[1], 'rad'], ['r', texts[2], 'm']];
}

function evaluateWithBeam(ctx: PointContext, point: NormPoint, beam: BeamSnapshot, enclosedBy: number | null): Evaluated {
	const { line, K } = ctx;
	const w = new Working(ctx.breakdown);
	const z = point.position;
	const T = point.exposureDuration;
	const diffuse = point.kind === 'diffuse';
	let missingPoint = NO_MISSING;
	if (diffuse && (point.reflectance === null || point.viewingDistance === null)) {
		missingPoint = [];
		if (point.reflectance === null) missingPoint.push(`points.${point.index}.reflectance`);
		if (point.viewingDistance === null) missingPoint.push(`points.${point.index}.viewingDistance`);
	}
	// Every value is written once (12 digits) and the text reused wherever it appears again.

	// Beam at the point.
	const tPath = beam.transmission;
	const tPathText = fmt(tPath);
	const unattenuated = beam.factors.length === 0;
	if (w.enabled) {
		if (!unattenuated) w.add('transmission', 'Transmission of the path up to the point', (beam.transmissionFormula ??= `T_path = ${beam.factors.map((f) => f.symbol).join('·')}`), beam.factors.map((f) => [f.symbol, f.value, ''] as const), tPathText, '');
		else w.add('transmission', 'Transmission of the path up to the point', 'T_path = 1 (no attenuating element before the point)', [], tPathText, '');
	}
	const s = beam.state;
	const D2 = diameterSquaredAt(s, z);
	// D is only written and compared with apertures: its 15-digit root does when its text and those
	// comparisons are certain (see roughSqrt); the full root is formed otherwise.
	const rough = spreadsAt(s, z) ? roughSqrt(D2) : null;
	const roughText = rough && clearText(rough, ROUGH_SQRT_ERROR);
	const D = roughText ? rough! : diameterFromSquare(s, z, D2);
	const dText = roughText || fmt(D);
	let exactD: Decimal | null = roughText ? null : D;
	const zText = fmt(z);
	const divergenceText = fmt(s.divergence);
	if (w.enabled) w.add('diameter', 'Beam diameter at the point (1/e)', 'D = √(D_w² + (φ·(z − z_w))²)', [['D_w', s.waistDiameter, 'm'], ['φ', divergenceText, 'rad'], ['z', zText, 'm'], ['z_w', s.waistPosition, 'm']], dText, 'm', (beam.afterElement === null ? 'Beam as it leaves the aperture.' : `Beam after element ${beam.afterElement}.`) + (beam.modelNote ? ` ${beam.modelNote}` : ''));

	// T_path = 1 exactly when no element attenuates: the source itself reaches the point.
	const powerAtPoint = line.averagePower ? (unattenuated ? line.averagePower : tPath.times(line.averagePower)) : null;
	const energyAtPoint = line.pulseEnergy ? (unattenuated ? line.pulseEnergy : tPath.times(line.pulseEnergy)) : null;
	const powerText = powerAtPoint && fmt(powerAtPoint);
	const energyText = energyAtPoint && fmt(energyAtPoint);
	if (powerText && w.enabled) w.add('power', line.mode === 'continuous' ? 'Power at the point' : 'Average power at the point', line.mode === 'continuous' ? 'P = T_path·P₀' : 'P_avg = T_path·P_avg,0', [['T_path', tPathText, ''], [line.mode === 'continuous' ? 'P₀' : 'P_avg,0', line.averagePower!, 'W']], powerText, 'W');
	if (energyText && w.enabled) w.add('energy', 'Pulse energy at the point', 'Q = T_path·Q₀', [['T_path', tPathText, ''], ['Q₀', line.pulseEnergy!, 'J']], energyText, 'J');

	// Diffuse geometry: G = ρ·cosθ/(π·r²), m⁻², and G·r² = ρ·cosθ/π for the hazard distance.
	let geometry: Decimal | null = null;
	let geometryR2: Decimal | null = null;
	let diffuseTexts: [string, string, string] | null = null;
	if (diffuse && missingPoint.length === 0) {
		const r = point.viewingDistance!;
		geometryR2 = point.reflectance!.times(cosAcute(point.viewingAngle)).times(K.INV_PI);
		geometry = geometryR2.div(r.times(r));
		if (w.enabled) diffuseTexts = [fmt(point.reflectance!), fmt(point.viewingAngle), fmt(r)];
	}

	// Unaveraged irradiance / radiant exposure at the point and photon quantities.
	let irradiance: Decimal | null = null;
	let pulseH: Decimal | null = null;
	let irradianceText: string | null = null;
	let pulseHText: string | null = null;
	if (!diffuse) {
		// 1/(π·D²/4), from D² itself.
		const perArea = K.FOUR_OVER_PI.div(D2);
		if (powerAtPoint) {
			irradiance = powerAtPoint.times(perArea);
			irradianceText = fmt(irradiance);
			if (w.enabled) w.add('irradiance', 'Irradiance of the beam at the point (1/e, no aperture averaging)', 'E_beam = P / (π·D²/4)', [['P', powerText!, 'W'], ['D', dText, 'm']], irradianceText, 'W/m²');
		}
		if (energyAtPoint) {
			pulseH = energyAtPoint.times(perArea);
			pulseHText = fmt(pulseH);
			if (w.enabled) w.add('pulse-exposure', 'Radiant exposure of one pulse at the point (1/e, no aperture averaging)', 'H_beam = Q / (π·D²/4)', [['Q', energyText!, 'J'], ['D', dText, 'm']], pulseHText, 'J/m²');
		}
	} else if (geometry) {
		if (powerAtPoint) {
			irradiance = geometry.times(powerAtPoint);
			irradianceText = fmt(irradiance);
			if (w.enabled) w.add('irradiance', 'Irradiance of the diffuse reflection at the viewer', 'E = ρ·P·cosθ / (π·r²)', diffuseInputs(diffuseTexts!, 'P', powerText!, 'W'), irradianceText, 'W/m²', 'Lambertian surface.');
		}
		if (energyAtPoint) {
			pulseH = geometry.times(energyAtPoint);
			pulseHText = fmt(pulseH);
			if (w.enabled) w.add('pulse-exposure', 'Radiant exposure of one pulse of the diffuse reflection at the viewer', 'H = ρ·Q·cosθ / (π·r²)', diffuseInputs(diffuseTexts!, 'Q', energyText!, 'J'), pulseHText, 'J/m²', 'Lambertian surface.');
		}
	}
	let photonFluxDensity: string | null = null;
	let photonFluence: string | null = null;
	if (irradiance) {
		photonFluxDensity = fmt(irradiance.times(ctx.perPhoton));
		if (w.enabled) w.add('photon-flux-density', 'Photon flux density at the point', 'Φ_A = E / E_ph', [['E', irradianceText!, 'W/m²'], ['E_ph', ctx.photonEnergyText, 'J']], photonFluxDensity, 's⁻¹·m⁻²');
	}
	if (pulseH) {
		photonFluence = fmt(pulseH.times(ctx.perPhoton));
		if (w.enabled) w.add('photon-fluence', 'Photons per pulse per area at the point', 'N_A = H / E_ph', [['H', pulseHText!, 'J/m²'], ['E_ph', ctx.photonEnergyText, 'J']], photonFluence, 'm⁻²');
	}

	// Checks.
	const checks: CheckResult[] = [];
	let verdict: Verdict = 'within_limit';
	let worstRatio: Decimal | null = null;
	let worstRatioText: string | null = null;
	let diffuseDistance: { r: Decimal; text: string; limit: NormLimit; check: CheckKind; xText: string; xs: string; sourceUnit: string; natural: Decimal; natUnit: string } | null = null;
	let allMissing: string[] = missingPoint;
	const used: NormLimit[] = [];

	for (const plan of plansFor(ctx, T)) {
		const t = plan.duration;
		const limits = applicableLimits(ctx, plan, point.tissue);
		// The optional pulse-train check is made only where a limit asks for it (τ is always known).
		if (plan.optional && limits.length === 0) continue;
		const missing = plan.missingT ? [`points.${point.index}.exposureDuration`, ...missingPoint] : missingPoint;
		if (missing.length > 0 || t === null) {
			for (const m of missing) if (!allMissing.includes(m)) allMissing = [...allMissing, m];
			checks.push({ kind: plan.kind, label: plan.label, duration: t === null ? null : durationText(plan, t), verdict: 'incomplete', reason: `Needs ${missing.join(', ')}.`, ratio: null, decidingLimit: null, comparisons: [], missing: [...missing] });
			verdict = worseVerdict(verdict, 'incomplete');
			continue;
		}
		if (limits.length === 0) {
			checks.push({ kind: plan.kind, label: plan.label, duration: durationText(plan, t), verdict: 'no_applicable_limit', reason: `No entered limit covers ${point.tissue} exposure at λ = ${fmt(line.wavelength)} m for ${plan.durationSymbol} = ${durationText(plan, t)} s (${plan.basis.replace('_', '-')} basis).`, ratio: null, decidingLimit: null, comparisons: [], missing: [] });
			verdict = worseVerdict(verdict, 'no_applicable_limit');
			continue;
		}

		// Power or energy at the point (T_path × the source of the plan) and, for a diffuse point or
		// a beam at least as wide as the aperture, the exposure itself: already formed above.
		const byPower = plan.sourceUnit === 'W';
		const x = byPower ? powerAtPoint! : energyAtPoint!;
		const xText = byPower ? powerText! : energyText!;
		const atBeam = byPower ? irradiance : pulseH;
		const atBeamText = byPower ? irradianceText : pulseHText;
		const xs = plan.pointSymbol;
		const natUnit = MEASURE_UNIT[plan.measure];
		const tText = durationText(plan, t);
		const comparisons: Comparison[] = [];
		let best: { ratio: Decimal; text: string; limit: NormLimit; index: number } | null = null;

		for (const limit of limits) {
			const st = w.enabled ? stepTexts(plan, limit) : null;
			// The exposure in the plan's measure (E or H, for the breakdown) and in the limit's quantity.
			const converts = limit.quantity !== plan.measure;
			let exposureNat: Decimal | null;
			let exposureNatText: string | null;
			let averagingText: string | null = null;
			let overAperture = false;
			if (diffuse) {
				exposureNat = atBeam!;
				exposureNatText = atBeamText!;
				if (st) w.add(st.exposure, st.diffuseLabel, st.diffuseFormula, [['ρ', diffuseTexts![0], ''], [xs, xText, plan.sourceUnit], ['θ', diffuseTexts![1], 'rad'], ['r', diffuseTexts![2], 'm']], exposureNatText, natUnit, 'Lambertian surface; no aperture averaging.');
			} else {
				const df = limit.limitingAperture;
				let side = exactD ? 0 : compareClear(D, df, ROUGH_SQRT_ERROR);
				if (side === 0) side = compare((exactD ??= sqrt(D2)), df);
				const overBeam = side >= 0;
				averagingText = overBeam ? dText : apertureText(limit);
				if (st) w.add(st.averaging, st.averagingLabel, 'D_avg = max(D, D_f)', [['D', dText, 'm'], ['D_f', apertureText(limit), 'm']], averagingText, 'm');
				// Over D itself the exposure is the beam's own; over D_f, X × 1/(π·D_f²/4) of the limit
				// (with a conversion to the limit's quantity, X × that × t in one product below).
				overAperture = !overBeam;
				if (overBeam) {
					exposureNat = atBeam!;
					exposureNatText = atBeamText!;
				} else if (!converts || w.enabled) {
					exposureNat = x.times(limit.perApertureArea!);
					exposureNatText = fmt(exposureNat);
				} else {
					exposureNat = null;
					exposureNatText = null;
				}
				if (st) w.add(st.exposure, st.averagedLabel, st.averagedFormula, [[xs, xText, plan.sourceUnit], ['D_avg', averagingText, 'm']], exposureNatText!, natUnit);
			}
			let exposure: Decimal;
			let exposureText: string;
			if (!converts) {
				exposure = exposureNat!;
				exposureText = exposureNatText!;
			} else {
				const toIrradiance = plan.measure !== 'irradiance';
				const factor = toIrradiance ? perDuration(plan, t) : t;
				exposure = overAperture ? x.times(apertureFactor(evaluateLimit(limit, plan, t), limit, factor)) : exposureNat!.times(factor);
				exposureText = fmt(exposure);
				if (st) {
					if (!toIrradiance) w.add(st.convert, st.convertLabel, st.convertFormula, [['E', exposureNatText!, 'W/m²'], [plan.durationSymbol, tText, 's']], exposureText, 'J/m²');
					else w.add(st.convert, st.convertLabel, 'E = H / τ', [['H', exposureNatText!, 'J/m²'], ['τ', tText, 's']], exposureText, 'W/m²');
				}
			}
			const lim = limitForPlan(limit, plan, t, w, st ? st.limit : '');
			const ratio = exposure.times(lim.inverse);
			const ratioText = fmt(ratio);
			const q = MEASURE_SYMBOL[limit.quantity];
			const unit = MEASURE_UNIT[limit.quantity];
			if (st) w.add(st.ratio, st.ratioLabel, st.ratioFormula, [[q, exposureText, unit], ['EL', valueText(lim), unit]], ratioText, '');

			const exceeds = compare(ratio, K.ONE) > 0;
			const cmp: Comparison = {
				limit: { id: limit.id, version: limit.version, label: limit.label, citation: limit.citation },
				quantity: limit.quantity,
				unit,
				duration: tText,
				limitingAperture: apertureText(limit),
				beamDiameter: diffuse ? null : dText,
				averagingDiameter: averagingText,
				exposure: exposureText,
				limitValue: valueText(lim),
				ratio: ratioText,
				verdict: exceeds ? 'exceeds_limit' : 'within_limit',
				deciding: false
			};
			if (lim.trainFactor) {
				cmp.pulseCount = plan.pulseCountText ??= fmt(plan.pulseCount!);
				cmp.trainFactor = lim.trainFactorText ??= fmt(lim.trainFactor);
			}
			comparisons.push(cmp);
			used.push(limit);
			// The most restrictive limit decides; limits whose ratios are written alike tie (the first is
			// kept), so that arithmetic noise below the written digits cannot choose.
			if (!best || (ratioText !== best.text && compare(ratio, best.ratio) > 0)) best = { ratio, text: ratioText, limit, index: comparisons.length - 1 };

			if (geometryR2) {
				// r_h = √(ρ·X·cosθ/(π·EL)) with EL in the plan's measure.
				const r = sqrt(geometryR2.times(x).times(inverseNatural(lim, plan, limit, t)));
				const rText = fmt(r);
				if (!diffuseDistance || (rText !== diffuseDistance.text && compare(r, diffuseDistance.r) > 0)) {
					diffuseDistance = { r, text: rText, limit, check: plan.kind, xText, xs, sourceUnit: plan.sourceUnit, natural: lim.natural, natUnit };
				}
			}
		}
		const b = best!;
		const decidingRatioText = comparisons[b.index].ratio;
		comparisons[b.index].deciding = true;
		const checkVerdict: Verdict = compare(b.ratio, K.ONE) > 0 ? 'exceeds_limit' : 'within_limit';
		verdict = worseVerdict(verdict, checkVerdict);
		if (!worstRatio || (decidingRatioText !== worstRatioText && compare(b.ratio, worstRatio) > 0)) {
			worstRatio = b.ratio;
			worstRatioText = decidingRatioText;
		}
		checks.push({
			kind: plan.kind,
			label: plan.label,
			duration: tText,
			verdict: checkVerdict,
			reason: `${checkVerdict === 'exceeds_limit' ? 'Exceeds' : 'Within'} “${b.limit.label}”: exposure is ${toSignificantString(b.ratio, 4)} × the limit.`,
			ratio: decidingRatioText,
			decidingLimit: limitRef(b.limit),
			comparisons,
			missing: []
		});
	}

	if (checks.length === 0) verdict = 'no_applicable_limit';
	const od = worstRatio ? requiredOpticalDensity(worstRatio) : null;
	const odWritten = od ? writeOd(od) : null;
	if (odWritten && w.enabled) w.add('optical-density', 'Optical density needed', 'OD = log₁₀(ratio) (0 when ratio ≤ 1)', [['ratio', worstRatioText!, '']], odWritten.value, '', `Rounded up: ${odWritten.roundedUpTenth} (one decimal), ${odWritten.roundedUpWhole} (whole).`);

	let diffuseHazardDistance: DiffuseDistance | null = null;
	if (diffuseDistance) {
		const distanceText = diffuseDistance.text;
		if (w.enabled) w.add('diffuse-hazard-distance', 'Diffuse-reflection hazard distance', 'r_h = √(ρ·X·cosθ / (π·EL))', [['ρ', diffuseTexts![0], ''], [diffuseDistance.xs, diffuseDistance.xText, diffuseDistance.sourceUnit], ['θ', diffuseTexts![1], 'rad'], ['EL', diffuseDistance.natural, diffuseDistance.natUnit]], distanceText, 'm', `Most restrictive: “${diffuseDistance.limit.label}” (${diffuseDistance.check.replace('_', ' ')} check).`);
		diffuseHazardDistance = { distance: distanceText, decidingLimit: limitRef(diffuseDistance.limit), check: diffuseDistance.check };
	}

	const accessible = enclosedBy === null;
	const result: PointResult = {
		id: point.id,
		label: point.label,
		tissue: point.tissue,
		kind: point.kind,
		position: zText,
		accessible,
		enclosedBy,
		beamAfterElement: beam.afterElement,
		verdict,
		reason: pointReason(verdict, checks, accessible, enclosedBy),
		missing: [...allMissing],
		transmissionFactor: tPathText,
		power: powerText,
		pulseEnergy: energyText,
		beamDiameter: dText,
		beamDivergence: divergenceText,
		irradiance: irradianceText,
		pulseRadiantExposure: pulseHText,
		photonFluxDensity,
		photonFluencePerPulse: photonFluence,
		checks,
		worstRatio: worstRatioText,
		requiredOpticalDensity: odWritten,
		diffuseHazardDistance,
		breakdown: w.steps
	};
	return { result, ratio: worstRatio, verdict, used };
}

function pointReason(verdict: Verdict, checks: CheckResult[], accessible: boolean, enclosedBy: number | null): string {
	const lead = accessible ? '' : `Inside the enclosure (element ${enclosedBy}): not accessible, reported but left out of the overall verdict. `;
	const decisive = checks.find((c) => c.verdict === verdict);
	switch (verdict) {
		case 'exceeds_limit':
			return lead + (decisive ? `${decisive.label}: ${decisive.reason}` : 'Exceeds a limit.');
		case 'incomplete':
			return lead + (decisive ? `${decisive.label}: ${decisive.reason}` : 'Input is missing.');
		case 'no_applicable_limit':
			return lead + (decisive ? `${decisive.label}: ${decisive.reason}` : 'No entered limit applies.') + ' Not shown as safe.';
		case 'within_limit':
			return lead + 'Every check is within its most restrictive applicable limit.';
	}
}
