/**
 * The checks an emission line needs, and the limits that apply to each. Limits are always inputs
 * (entered by the laser safety officer from the local code); no limit value is built in.
 *
 *   continuous   — E at the point (or H = E·T) against continuous-basis limits at t = T;
 *   single pulse — H of one pulse against single-pulse limits at t = τ;
 *   repetitive   — all three of: (1) the single pulse as above; (2) the average power Q·f against
 *                  continuous-basis limits at t = T; (3) the pulse train: H of one pulse against a
 *                  single-pulse limit × N^x, N = max(1, f·T). A single-pulse limit without an exponent
 *                  makes check 3 incomplete — never skipped — unless the officer marked it
 *                  "no train correction" (then N^0 = 1).
 * A limit applies when tissue, pulse basis, wavelength (inclusive range) and the check's duration
 * (inclusive range) match. Several applicable limits: each is compared and the most restrictive
 * (highest ratio) decides.
 */
import type { CheckKind, Step } from '$lib/assessmentResult';
import type { LimitQuantity, PulseBasis, Tissue } from '$lib/enums';
import type { NormLimit, NormLine } from './validate';

/** Ids, labels and formulas of one comparison's steps. */
export interface ComparisonTexts {
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

export const MEASURE_UNIT = { irradiance: 'W/m²', radiant_exposure: 'J/m²' } as const;
export const MEASURE_SYMBOL = { irradiance: 'E', radiant_exposure: 'H' } as const;

export const CHECK_LABEL: Record<CheckKind, string> = {
	continuous: 'Continuous exposure',
	single_pulse: 'Single pulse',
	average_power: 'Average power over T',
	pulse_train: 'Pulse train'
};

/** The limit as evaluated for one check of one line (its wavelength). */
export interface LimitAt {
	limit: NormLimit;
	/** Duration the limit is evaluated at: the check's τ or T, or T_i when pulses are grouped. */
	t: number;
	/** C(λ) at the line's wavelength (1 without a factor). */
	wavelengthFactor: number;
	/** The limiting aperture a·tᵇ at t. */
	aperture: number;
	/** Pulses that count as one under the T_i rule (the group's energy is Q × this); 1 otherwise. */
	grouped: number;
	/** Pulse-train check: the number of pulses (or pulse groups) N. */
	pulseCount?: number;
	/** k·C(λ)·tⁿ, in the limit's quantity (C_E is applied per point: it depends on the apparent source). */
	base: number;
	/** base × the train factor; null when the train rule is missing. */
	value: number | null;
	/** The same in the check's measure (what the exposure of the source is compared in). */
	natural: number | null;
	trainFactor?: number;
	trainRule?: 'exponent' | 'no_correction' | 'missing';
	/** Its working step, and the words of the comparison's steps, formed when first needed (see exposure.ts). */
	step?: Step;
	texts?: ComparisonTexts;
}

export interface Plan {
	kind: CheckKind;
	label: string;
	basis: PulseBasis;
	/** τ or T; null when T is needed and missing. */
	t: number | null;
	tSymbol: 'τ' | 'T';
	/** 'irradiance' when the source is a power, 'radiant_exposure' when it is a pulse energy. */
	measure: LimitQuantity;
	/** Power or energy at the aperture, and its symbol at a point. */
	source: number;
	symbol: 'P' | 'P_avg' | 'Q';
	unit: 'W' | 'J';
	/** Pulse-train check: N = max(1, f·T); null when T is missing. */
	pulseCount: number | null;
	/** Applicable limits per tissue, and each evaluated, once per assessment. */
	applicable: Partial<Record<Tissue, LimitAt[]>>;
}

/** One plan: a literal of one shape for every kind (keeps the engine's objects monomorphic). */
function plan(kind: CheckKind, basis: PulseBasis, t: number | null, tSymbol: 'τ' | 'T', measure: LimitQuantity, source: number, symbol: Plan['symbol'], unit: Plan['unit'], pulseCount: number | null): Plan {
	return { kind, label: CHECK_LABEL[kind], basis, t, tSymbol, measure, source, symbol, unit, pulseCount, applicable: {} };
}

export function planChecks(line: NormLine, T: number | null): Plan[] {
	if (line.mode === 'continuous') return [plan('continuous', 'continuous', T, 'T', 'irradiance', line.averagePower!, 'P', 'W', null)];
	const tau = line.pulseDuration!;
	const single = plan('single_pulse', 'single_pulse', tau, 'τ', 'radiant_exposure', line.pulseEnergy!, 'Q', 'J', null);
	if (line.mode === 'single_pulse') return [single];
	return [
		single,
		plan('average_power', 'continuous', T, 'T', 'irradiance', line.averagePower!, 'P_avg', 'W', null),
		plan('pulse_train', 'single_pulse', tau, 'τ', 'radiant_exposure', line.pulseEnergy!, 'Q', 'J', T === null ? null : Math.max(1, line.repetitionRate! * T))
	];
}

/** A pulse-train check needs T for N; the other checks need their t. */
export function planMissesT(plan: Plan): boolean {
	return plan.t === null || (plan.kind === 'pulse_train' && plan.pulseCount === null);
}

/** C(λ): 1, a constant, or 10^(s·(λ − λ₀)) with λ held within the factor's range. */
export function wavelengthFactorAt(limit: NormLimit, wavelength: number): number {
	const f = limit.wavelengthFactor;
	if (f === null) return 1;
	if (f.kind === 'constant') return f.value;
	const lambda = wavelength < f.from ? f.from : wavelength > f.to ? f.to : wavelength;
	return Math.pow(10, f.slope * (lambda - f.origin));
}

/** C_E(α): 1 up to α_min, (α/α_min)^e up to α_max, held above it; 1 without a rule (a point source). */
export function extendedSourceFactor(limit: NormLimit, alpha: number | null): number {
	const r = limit.extendedSource;
	if (r === null || alpha === null || alpha <= r.alphaMin) return 1;
	return Math.pow((alpha < r.alphaMax ? alpha : r.alphaMax) / r.alphaMin, r.exponent);
}

function evaluateLimit(limit: NormLimit, plan: Plan, line: NormLine): LimitAt {
	let t = plan.t!;
	let grouped = 1;
	let pulseCount = plan.pulseCount ?? undefined;
	// T_i: pulses closer together than T_i count as one pulse of T_i carrying their energy.
	if (plan.basis === 'single_pulse' && limit.groupingTime !== null && line.repetitionRate !== null && line.repetitionRate * limit.groupingTime > 1) {
		grouped = line.repetitionRate * limit.groupingTime;
		t = limit.groupingTime;
		if (pulseCount !== undefined) pulseCount = Math.max(1, pulseCount / grouped);
	}
	const wavelengthFactor = wavelengthFactorAt(limit, line.wavelength);
	const base = limit.k * wavelengthFactor * (limit.n === 0 ? 1 : Math.pow(t, limit.n));
	const aperture = limit.apertureExponent === 0 ? limit.limitingAperture : limit.limitingAperture * Math.pow(t, limit.apertureExponent);
	const out: LimitAt = { limit, t, wavelengthFactor, aperture, grouped, base, value: base, natural: null };
	if (plan.kind === 'pulse_train') {
		out.pulseCount = pulseCount;
		if (limit.trainExponent !== null) {
			out.trainFactor = Math.pow(pulseCount!, limit.trainExponent);
			out.trainRule = 'exponent';
			out.value = base * out.trainFactor;
		} else if (limit.noTrainCorrection) {
			out.trainFactor = 1;
			out.trainRule = 'no_correction';
		} else {
			out.trainRule = 'missing';
			out.value = null;
		}
	}
	if (out.value !== null) out.natural = limit.quantity === plan.measure ? out.value : plan.measure === 'irradiance' ? out.value / t : out.value * t;
	return out;
}

/** The limits that apply to a check of a line for a tissue, evaluated; once per assessment. */
export function applicableLimits(plan: Plan, line: NormLine, tissue: Tissue, limits: NormLimit[]): LimitAt[] {
	const hit = plan.applicable[tissue];
	if (hit) return hit;
	const out: LimitAt[] = [];
	const t = plan.t;
	if (t !== null && !(plan.kind === 'pulse_train' && plan.pulseCount === null)) {
		const lambda = line.wavelength;
		for (const l of limits) {
			if (l.tissue === tissue && l.pulseBasis === plan.basis && l.wavelengthMin <= lambda && lambda <= l.wavelengthMax && l.durationMin <= t && t <= l.durationMax) out.push(evaluateLimit(l, plan, line));
		}
	}
	plan.applicable[tissue] = out;
	return out;
}

/** Check plans of a line by exposure duration, shared by every point and distance of one assessment. */
export class Plans {
	private readonly byT = new Map<number | null, Plan[]>();
	constructor(readonly line: NormLine) {}
	for(T: number | null): Plan[] {
		let p = this.byT.get(T);
		if (!p) {
			p = planChecks(this.line, T);
			this.byT.set(T, p);
		}
		return p;
	}
}
