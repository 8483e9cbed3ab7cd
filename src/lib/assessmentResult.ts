/**
 * What the hazard engine returns: plain JSON data, read by the server (snapshots, mails, reports)
 * and by the browser (the assessment panel, the plot).
 *
 * Every number is a float64 in SI units (m, W, J, s, rad, W/m², J/m²), kept at full precision;
 * screens round for display (src/lib/display.ts). A value that cannot be computed is null, never
 * NaN or Infinity; an unbounded distance is null with `status: 'unbounded'`.
 * Types, and one guard that tells a current result from an older engine's snapshot.
 */
import type { ElementKind, EmissionMode, BeamProfile, LimitQuantity, PointKind, Tissue, Verdict } from './enums';

export type { Verdict };
export type CheckKind = 'continuous' | 'single_pulse' | 'average_power' | 'pulse_train';

/** One step of the working: the formula, the values that went in, the value that came out. */
export interface StepInput {
	symbol: string;
	value: number;
	unit: string;
}
export interface Step {
	id: string;
	label: string;
	/** Plain text with Unicode symbols, e.g. 'E = P / (π·D²/4)'. */
	formula: string;
	inputs: StepInput[];
	value: number;
	unit: string;
	note?: string;
}

export interface LimitRef {
	id: string;
	version: string;
}
export interface CitedLimit extends LimitRef {
	label: string;
	citation: string;
}

export interface Comparison {
	limit: CitedLimit;
	quantity: LimitQuantity;
	unit: 'W/m²' | 'J/m²';
	/** Duration t at which the limit was evaluated, s. */
	duration: number;
	limitingAperture: number;
	/** Beam diameter at the point, m; null for a diffuse reflection. */
	beamDiameter: number | null;
	/** Diameter the exposure is averaged over, max(D, D_f), m; null for a diffuse reflection. */
	averagingDiameter: number | null;
	/** Exposure in the limit's quantity (hot-spot factor included). */
	exposure: number;
	/** The limit at t (× the train factor for the pulse-train check); null when it cannot be formed. */
	limitValue: number | null;
	/** C(λ) of the limit at this line's wavelength (1 without a factor). */
	wavelengthFactor: number;
	/** C_E(α) at the point's apparent source (1 for a point source and for direct viewing). */
	extendedSourceFactor: number;
	/** Duration the limit was evaluated at when pulses are grouped (T_i), and how many pulses count as one. */
	groupedPulses?: number;
	/** Pulse-train check only: N = f·T, the factor applied to the single-pulse limit, and how it was set. */
	pulseCount?: number;
	trainFactor?: number;
	trainRule?: 'exponent' | 'no_correction' | 'missing';
	ratio: number | null;
	verdict: 'within_limit' | 'exceeds_limit' | 'incomplete';
	/** The comparison with the highest ratio in its check (the most restrictive limit). */
	deciding: boolean;
	/** Why a comparison could not be made (e.g. no pulse-train rule on the limit). */
	reason?: string;
}

export interface CheckResult {
	kind: CheckKind;
	label: string;
	/** τ for single-pulse and pulse-train checks, T for continuous and average-power checks; null when T is missing. */
	duration: number | null;
	verdict: Verdict;
	reason: string;
	ratio: number | null;
	decidingLimit: LimitRef | null;
	comparisons: Comparison[];
	/** Fields whose absence made the check incomplete ('points.0.exposureDuration'). */
	missing: string[];
}

export interface OpticalDensity {
	/** log₁₀(ratio), 0 when the ratio is ≤ 1. */
	value: number;
	/** Rounded up to a tenth and to a whole number (eyewear is specified by the next whole OD). */
	roundedUpTenth: number;
	roundedUpWhole: number;
}

/** One emission line at a point (for a tunable line: at its worst wavelength). */
export interface LineAtPoint {
	line: number;
	wavelength: number;
	/** A tunable line: its range and every wavelength it was assessed at; null for a fixed line. */
	tuning: { from: number; to: number; assessedAt: number[] } | null;
	/** Where its ratio is summed with other lines' (see EffectSum). */
	effectGroup: string;
	/** Diffuse points: the apparent source's angular subtense α = 2·atan(D/(2r)), rad; null for direct viewing (α_min). */
	apparentSource: number | null;
	/** Product of the transmissions and reflectances before the point. */
	transmissionFactor: number;
	/** Power (continuous) or average power (repetitive) at the point, W; null for a single pulse. */
	power: number | null;
	pulseEnergy: number | null;
	/** Beam diameter and full divergence at the point (1/e for Gaussian beams, full width for flat-top). */
	beamDiameter: number;
	beamDivergence: number;
	/** Irradiance before aperture averaging (beam, hot spot included; or diffuse reflection at r), W/m²; null for a single pulse. */
	irradiance: number | null;
	/** Radiant exposure of one pulse before aperture averaging, J/m²; null for continuous lines. */
	pulseRadiantExposure: number | null;
	photonFluxDensity: number | null;
	photonFluencePerPulse: number | null;
	checks: CheckResult[];
	verdict: Verdict;
	worstRatio: number | null;
	requiredOpticalDensity: OpticalDensity | null;
}

export type DistanceStatus = 'finite' | 'unbounded' | 'partial' | 'no_applicable_limit' | 'incomplete';

export interface DistanceCandidate {
	line: number;
	check: CheckKind;
	limit: LimitRef;
	/** D_c = √(4·h·X/(π·EL)), m. */
	criticalDiameter: number;
	/** From the origin of the beam, m; null when unbounded. */
	distance: number | null;
	unbounded: boolean;
}

/**
 * How far a beam is hazardous if it went on unobstructed from where it starts (the aperture or an
 * element): the NOHD of that stretch of the path. 'partial': a check that applies has no limit, so
 * the distance is a lower bound.
 */
export interface HazardDistance {
	status: DistanceStatus;
	tissue: Tissue;
	/** Where the beam starts: the aperture (null) or the element it leaves (0-based index). */
	afterElement: number | null;
	elementKind: ElementKind | null;
	/** Position of that start along the path, m. */
	origin: number;
	/** Distance from the origin beyond which the beam is below every limit found, m; null unless finite or partial. */
	distance: number | null;
	/** After a lens: the focus along the path, and the distance measured from it. */
	focusPosition?: number;
	distanceFromFocus?: number | null;
	exposureDuration: number | null;
	decidingLimit: LimitRef | null;
	decidingCheck: CheckKind | null;
	decidingLine: number | null;
	/** Lines whose ratios were summed to find the distance (two or more lines acting alike); else empty. */
	summedLines: number[];
	/** Checks that apply but found no limit (or no pulse-train rule): the distance may be understated. */
	missingChecks: CheckKind[];
	reason: string;
	candidates: DistanceCandidate[];
}

/** r_h = √(ρ·X·cosθ/(π·EL)): within r_h of the reflecting spot the reflection exceeds the limit. */
export interface DiffuseDistance {
	status: DistanceStatus;
	distance: number | null;
	decidingLimit: LimitRef | null;
	decidingCheck: CheckKind | null;
	decidingLine: number | null;
	missingChecks: CheckKind[];
	reason: string;
}

/** A stretch of the path between elements, open or enclosed, with its worst exposure ratio. */
export interface StretchResult {
	index: number;
	from: number;
	to: number;
	afterElement: number | null;
	/** The enclosure element around it; null when open. */
	enclosedBy: number | null;
	/** Index into `hazardDistances` of the beam on this stretch. */
	beam: number;
	/** Open stretches: the highest eye exposure ratio anywhere on it (at the NOHD exposure duration) and where. */
	worstRatio: number | null;
	worstAt: number | null;
	verdict: Verdict | null;
	reason: string;
}

/** Lines acting on the same tissue in the same way add: Σ ratioᵢ (each line's worst check). */
export interface EffectSum {
	group: string;
	label: string;
	/** The lines summed (indices into the result's lines), and each one's ratio. */
	lines: { line: number; ratio: number }[];
	ratio: number;
	verdict: 'within_limit' | 'exceeds_limit';
}

/** The optical density eyewear needs at one line (over its tuning range). */
export interface LineOpticalDensity {
	line: number;
	wavelengthMin: number;
	wavelengthMax: number;
	od: OpticalDensity;
	/** The accessible point that needs it (result level only). */
	pointId?: string;
}

export interface PointResult {
	id: string;
	label: string;
	tissue: Tissue;
	kind: PointKind;
	position: number;
	/** False for points strictly inside an enclosure: reported, but left out of the overall verdict. */
	accessible: boolean;
	enclosedBy: number | null;
	/** The element whose beam the point sees (the worse side at an element); null = the aperture's beam. */
	beamAfterElement: number | null;
	verdict: Verdict;
	reason: string;
	missing: string[];
	/** Things the officer should know that do not change the verdict (e.g. a short exposure duration). */
	warnings: string[];
	lines: LineAtPoint[];
	/** The sums by effect; the point's worst ratio is the largest sum. */
	sums: EffectSum[];
	worstRatio: number | null;
	requiredOpticalDensity: OpticalDensity | null;
	/** Per line: OD = log₁₀ of the largest sum the line takes part in (so Σ ratioᵢ·10^−ODᵢ ≤ 1). */
	requiredOpticalDensities: LineOpticalDensity[];
	/** Diffuse points: how far from the reflecting spot the reflection exceeds the limits. */
	diffuseHazardDistance: DiffuseDistance | null;
	/** Intrabeam skin points: how far the beam they see is hazardous to skin (like the NOHD for the eye). */
	skinHazardDistance: HazardDistance | null;
	breakdown: Step[];
}

export interface LineResult {
	index: number;
	label: string;
	emissionGroup: string;
	wavelength: number;
	/** Upper end of a tunable line's range; null for a fixed line. */
	wavelengthMax: number | null;
	mode: EmissionMode;
	photonEnergy: number;
	photonEnergyEV: number;
	/** Continuous power or average power Q·f, W; null for a single pulse. */
	averagePower: number | null;
	peakPower: number | null;
	pulseEnergy: number | null;
	pulseDuration: number | null;
	repetitionRate: number | null;
	photonFlux: number | null;
	peakPhotonFlux: number | null;
	photonsPerPulse: number | null;
	profile: BeamProfile;
	/** Beam diameter and full divergence at the aperture as used (1/e for Gaussian, full width for flat-top). */
	beamDiameter: number;
	divergence: number;
	beamQuality: number;
	hotSpotFactor: number;
}

export interface AssessmentResult {
	engineVersion: string;
	/** Worst accessible point, precedence exceeds_limit > incomplete > no_applicable_limit > within_limit. */
	verdict: Verdict;
	reason: string;
	worstPointId: string | null;
	worstRatio: number | null;
	requiredOpticalDensity: OpticalDensity | null;
	/** The OD eyewear needs at every line (its whole tuning range), at the worst accessible point for that line. */
	requiredOpticalDensities: LineOpticalDensity[];
	lines: LineResult[];
	/** Total path length, m. */
	pathLength: number;
	/** The largest eye hazard distance over the path's stretches. */
	nohd: HazardDistance;
	/** One per beam: the aperture's and each element's. */
	hazardDistances: HazardDistance[];
	stretches: StretchResult[];
	points: PointResult[];
	warnings: string[];
	limitsUsed: LimitRef[];
	limitsConsidered: LimitRef[];
	breakdown: Step[];
	caution: string;
}

export interface InputError {
	/** Dotted path of the offending field, e.g. 'points.0.exposureDuration'. */
	field: string;
	/** A sentence a person can act on. */
	reason: string;
}

export type Outcome = { ok: true; result: AssessmentResult } | { ok: false; errors: InputError[] };

/** The inputs an accessible point still lacks ('points.1.reflectance', …): a path with any is a draft. */
export function draftGaps(result: AssessmentResult): string[] {
	const gaps = new Set<string>();
	for (const p of result.points) if (p.accessible) for (const m of p.missing) gaps.add(m);
	return [...gaps];
}

/** True for a result of this engine generation (2.x); snapshots of older engines have another shape. */
export function isCurrentResult(r: unknown): r is AssessmentResult {
	return typeof r === 'object' && r !== null && Array.isArray((r as AssessmentResult).lines) && typeof (r as AssessmentResult).engineVersion === 'string';
}

/** Exposure along the path for the plot (computed by $lib/server/alongPath). */
export type ProfileSample = {
	position: number;
	/** Exposure of the plotted check, in its unit; null where it cannot be computed. */
	exposure: number | null;
	/** The most restrictive applicable limit of that check, same unit; null = no applicable limit. */
	limit: number | null;
	accessible: boolean;
};

export type Profile = {
	check: CheckKind | null;
	checkLabel: string;
	unit: string | null;
	exposureDuration: number | null;
	samples: ProfileSample[];
	/**
	 * Several lines: each line's ratio (its worst check ÷ limit) at every sample, and the sum that
	 * decides (the largest sum of lines acting alike); null for a path of one line.
	 */
	ratios: { lines: { line: number; ratios: (number | null)[] }[]; sum: (number | null)[] } | null;
};

/** After each element (by its index in the form), the fraction of each line's power that is still there. */
export type ElementPowers = { element: number; factors: number[] }[];

/** POST /api/assessments/preview answers this. */
export type PreviewResponse = {
	result: AssessmentResult;
	profile: Profile | null;
	/** Each line's power factor after every element, for the editor's rows. */
	powers: ElementPowers | null;
	/** Where the limits came from: the library in force now, or the request body. */
	limitsSource: 'library' | 'request';
};
