/**
 * Public input and result types of the hazard engine.
 *
 * Inputs are in SI units (m, W, J, s, Hz, rad). Numbers may be given as JSON numbers, numeric
 * strings (as PostgreSQL `numeric` arrives) or Decimal instances. Results carry every number as a
 * decimal string with 12 significant digits, so the whole result is plain, JSON-serialisable data.
 */
import type Decimal from 'decimal.js';
import type { HazardInputError } from './errors';

export type NumericInput = Decimal.Value;
/** A decimal number written as a string, e.g. '2.33050670716' or '1.5e-7'. */
export type DecimalString = string;

/** How a beam diameter or divergence was measured on a Gaussian profile. */
export type BeamDefinition = '1/e' | '1/e2' | 'fwhm';
export type EmissionMode = 'continuous' | 'single_pulse' | 'repetitive';
export type Tissue = 'eye' | 'skin';
export type Verdict = 'within_limit' | 'exceeds_limit' | 'no_applicable_limit' | 'incomplete';
export type LimitQuantity = 'irradiance' | 'radiant_exposure';
export type PulseBasis = 'single_pulse' | 'continuous';

export interface LineInput {
	/** Emission wavelength λ, m (180 nm – 1 mm). */
	wavelength: NumericInput;
	mode: EmissionMode;
	/** Continuous power P, W (mode 'continuous'). */
	power?: NumericInput | null;
	/** Energy per pulse Q, J (pulsed modes). */
	pulseEnergy?: NumericInput | null;
	/** Pulse duration τ, s (pulsed modes). */
	pulseDuration?: NumericInput | null;
	/** Pulse repetition frequency f, Hz (mode 'repetitive'). */
	repetitionRate?: NumericInput | null;
	/** Beam diameter at the aperture D₀, m. */
	beamDiameter: NumericInput;
	beamDiameterDefinition: BeamDefinition;
	/** Full-angle divergence φ, rad. */
	divergence: NumericInput;
	divergenceDefinition: BeamDefinition;
	/** Beam quality M² (≥ 1, default 1). */
	beamQuality?: NumericInput | null;
}

interface ElementBase {
	label?: string | null;
}
export interface PropagateElement extends ElementBase {
	kind: 'propagate';
	/** Free path length L, m. */
	length: NumericInput;
}
export interface TransmissionElement extends ElementBase {
	/** Window, attenuator, splitter branch or filter. */
	kind: 'transmission';
	/** Power transmission T, 0–1. */
	transmission: NumericInput;
}
export interface MirrorElement extends ElementBase {
	kind: 'mirror';
	/** Power reflectance R, 0–1 (default 1). */
	reflectance?: NumericInput | null;
}
export interface ExpanderElement extends ElementBase {
	kind: 'expander';
	/** Magnification M > 0 (diameter × M, divergence ÷ M; M < 1 reduces). */
	magnification: NumericInput;
}
export interface LensElement extends ElementBase {
	kind: 'lens';
	/** Focal length f > 0, m. */
	focalLength: NumericInput;
}
export interface FibreElement extends ElementBase {
	kind: 'fibre';
	/** Core diameter, m, taken as the output beam diameter. */
	coreDiameter: NumericInput;
	/** Numerical aperture NA, 0 < NA ≤ 1; output full divergence 2·asin(NA). */
	numericalAperture: NumericInput;
	/** Coupling transmission, 0–1 (default 1). */
	couplingTransmission?: NumericInput | null;
}
export interface EnclosureElement extends ElementBase {
	/** An enclosed stretch of the path: the beam propagates, points strictly inside are not accessible. */
	kind: 'enclosure';
	length: NumericInput;
}
export type ElementInput =
	| PropagateElement
	| TransmissionElement
	| MirrorElement
	| ExpanderElement
	| LensElement
	| FibreElement
	| EnclosureElement;
export type ElementKind = ElementInput['kind'];

export interface PointInput {
	id: string;
	label?: string | null;
	/** Distance along the path from the aperture, m (the sum of the propagation lengths before it). */
	position: NumericInput;
	tissue: Tissue;
	/** Exposure duration T, s. Needed for continuous and average-power checks. */
	exposureDuration?: NumericInput | null;
	kind: 'intrabeam' | 'diffuse';
	/** Diffuse: reflectance ρ of the surface, 0–1. */
	reflectance?: NumericInput | null;
	/** Diffuse: viewing angle θ from the surface normal, rad, 0 ≤ θ < π/2 (default 0, the worst case). */
	viewingAngle?: NumericInput | null;
	/** Diffuse: distance r from the reflecting spot to the viewer, m. */
	viewingDistance?: NumericInput | null;
}

/** An exposure limit as entered by the laser safety officer from the local code. */
export interface LimitInput {
	id: string;
	version: string | number;
	label: string;
	tissue: Tissue;
	/** Wavelength range, m (inclusive at both ends). */
	wavelengthMin: NumericInput;
	wavelengthMax: NumericInput;
	/** Exposure-duration range, s (inclusive at both ends). */
	durationMin: NumericInput;
	durationMax: NumericInput;
	quantity: LimitQuantity;
	/** Limit value = k·tⁿ in W/m² (irradiance) or J/m² (radiant exposure), t in s. */
	k: NumericInput;
	n: NumericInput;
	/** Limiting aperture D_f, m. */
	limitingAperture: NumericInput;
	/** 'single_pulse': applies to one pulse at t = τ. 'continuous': applies to continuous exposure and to average power over T. */
	pulseBasis: PulseBasis;
	/** For single-pulse limits: the pulse-train check multiplies the limit by N^exponent (N = f·T). */
	pulseTrainExponent?: NumericInput | null;
	citation: string;
}

export interface AssessmentInput {
	line: LineInput;
	/** Path elements in order from the aperture. */
	elements?: ElementInput[] | null;
	points: PointInput[];
	limits: LimitInput[];
	/** Exposure duration assumed for the NOHD (e.g. 0.25 s for accidental visible viewing). */
	nohd?: { exposureDuration?: NumericInput | null } | null;
	options?: {
		/** Include the step-by-step working (default true). */
		breakdown?: boolean;
	} | null;
}

// ---------------------------------------------------------------- results

export interface BreakdownInput {
	symbol: string;
	value: DecimalString;
	unit: string;
}
export interface BreakdownStep {
	id: string;
	label: string;
	/** Plain text with Unicode symbols, e.g. 'E = P / (π·D²/4)'. */
	formula: string;
	inputs: BreakdownInput[];
	value: DecimalString;
	unit: string;
	note?: string;
}

export interface LimitRef {
	id: string;
	version: string;
}

export type CheckKind = 'continuous' | 'single_pulse' | 'average_power' | 'pulse_train';

export interface Comparison {
	limit: LimitRef & { label: string; citation: string };
	quantity: LimitQuantity;
	unit: 'W/m²' | 'J/m²';
	/** Duration t at which the limit k·tⁿ was evaluated, s. */
	duration: DecimalString;
	limitingAperture: DecimalString;
	/** Beam diameter at the point (1/e), m; null for diffuse viewing. */
	beamDiameter: DecimalString | null;
	/** Diameter the exposure is averaged over, max(D, D_f), m; null for diffuse viewing. */
	averagingDiameter: DecimalString | null;
	exposure: DecimalString;
	limitValue: DecimalString;
	/** Pulse-train check only: N = f·T and the factor N^exponent applied to the single-pulse limit. */
	pulseCount?: DecimalString;
	trainFactor?: DecimalString;
	ratio: DecimalString;
	verdict: 'within_limit' | 'exceeds_limit';
	/** True for the comparison with the highest ratio in its check (the most restrictive limit). */
	deciding: boolean;
}

export interface CheckResult {
	kind: CheckKind;
	label: string;
	/** Duration of the check: τ for single-pulse and pulse-train checks, T for continuous and average-power checks. */
	duration: DecimalString | null;
	verdict: Verdict;
	reason: string;
	ratio: DecimalString | null;
	decidingLimit: LimitRef | null;
	comparisons: Comparison[];
	/** Fields whose absence made the check incomplete. */
	missing: string[];
}

export interface OpticalDensity {
	/** log₁₀(ratio), 0 when the ratio is ≤ 1. */
	value: DecimalString;
	roundedUpTenth: DecimalString;
	/** The next whole optical density (common practice when specifying eyewear). */
	roundedUpWhole: DecimalString;
}

export interface DiffuseDistance {
	/** Distance from the reflecting spot within which the diffuse reflection exceeds the limit, m. */
	distance: DecimalString;
	decidingLimit: LimitRef;
	check: CheckKind;
}

export interface PointResult {
	id: string;
	label: string;
	tissue: Tissue;
	kind: 'intrabeam' | 'diffuse';
	position: DecimalString;
	/** False for points strictly inside an enclosure: reported, but left out of the overall verdict. */
	accessible: boolean;
	/** Index of the enclosure element that encloses the point, else null. */
	enclosedBy: number | null;
	/** Index of the last path element applied to the beam the point sees; null = the beam as it leaves the aperture. */
	beamAfterElement: number | null;
	verdict: Verdict;
	reason: string;
	missing: string[];
	/** Product of the transmissions and reflectances before the point. */
	transmissionFactor: DecimalString;
	/** Power (continuous) or average power (repetitive) at the point, W; null for a single pulse. */
	power: DecimalString | null;
	pulseEnergy: DecimalString | null;
	/** Beam diameter (1/e) and full divergence (1/e) at the point. */
	beamDiameter: DecimalString;
	beamDivergence: DecimalString;
	/** Irradiance at the point before any aperture averaging (beam, or diffuse reflection at r), W/m²; null for a single pulse. */
	irradiance: DecimalString | null;
	/** Radiant exposure of one pulse before aperture averaging, J/m²; null for continuous lines. */
	pulseRadiantExposure: DecimalString | null;
	/** Irradiance / photon energy, s⁻¹·m⁻²; null for a single pulse. */
	photonFluxDensity: DecimalString | null;
	/** Photons per pulse per area, m⁻²; null for continuous lines. */
	photonFluencePerPulse: DecimalString | null;
	checks: CheckResult[];
	/** Highest exposure/limit ratio among the checks made. */
	worstRatio: DecimalString | null;
	requiredOpticalDensity: OpticalDensity | null;
	diffuseHazardDistance: DiffuseDistance | null;
	breakdown: BreakdownStep[];
}

export interface NohdCandidate {
	check: CheckKind;
	limit: LimitRef;
	/** Critical diameter D_c = √(4X/(π·EL)), m. */
	criticalDiameter: DecimalString;
	/** √(D_c² − D₀²)/φ, m (null when unbounded). */
	distance: DecimalString | null;
	/** The linear handbook form (D_c − D₀)/φ, m, for comparison (null when unbounded). */
	linearFormDistance: DecimalString | null;
	unbounded: boolean;
}

export interface NohdResult {
	status: 'finite' | 'unbounded' | 'no_applicable_limit' | 'incomplete';
	unbounded: boolean;
	/** Distance from the aperture (or, after a lens, from the focus), m; null unless status is 'finite'. */
	distance: DecimalString | null;
	linearFormDistance: DecimalString | null;
	exposureDuration: DecimalString | null;
	decidingLimit: LimitRef | null;
	decidingCheck: CheckKind | null;
	reason: string;
	/** Checks that needed a limit but found none: the NOHD may be understated. */
	checksWithoutLimit: CheckKind[];
	candidates: NohdCandidate[];
}

export interface LensNohdResult extends NohdResult {
	elementIndex: number;
	/** Position of the focus along the path, m. */
	focusPosition: DecimalString;
	/** Diffraction-limited focal spot (1/e), m. */
	focalSpotDiameter: DecimalString;
	/** Post-focus full divergence φ = D_lens/f, rad. */
	divergenceAfterFocus: DecimalString;
	/** The handbook lens form (f/D_lens)·D_c, m from the focus, for comparison. */
	handbookFormDistance: DecimalString | null;
}

export interface LineResult {
	wavelength: DecimalString;
	mode: EmissionMode;
	photonEnergy: DecimalString;
	photonEnergyEV: DecimalString;
	/** Continuous power or average power Q·f, W; null for a single pulse. */
	averagePower: DecimalString | null;
	/** Q/τ, W; null for continuous lines. */
	peakPower: DecimalString | null;
	pulseEnergy: DecimalString | null;
	pulseDuration: DecimalString | null;
	repetitionRate: DecimalString | null;
	/** Average photon flux P/E, s⁻¹; null for a single pulse. */
	photonFlux: DecimalString | null;
	/** Photon flux during a pulse, s⁻¹; null for continuous lines. */
	peakPhotonFlux: DecimalString | null;
	photonsPerPulse: DecimalString | null;
	/** Beam diameter and full divergence at the aperture on the 1/e basis. */
	beamDiameter: DecimalString;
	divergence: DecimalString;
	beamQuality: DecimalString;
}

export interface AssessmentResult {
	engineVersion: string;
	/** Worst accessible point, precedence exceeds_limit > incomplete > no_applicable_limit > within_limit. */
	verdict: Verdict;
	reason: string;
	/** Accessible point with the highest ratio (or, with no ratio anywhere, the first with the worst verdict). */
	worstPointId: string | null;
	worstRatio: DecimalString | null;
	requiredOpticalDensity: OpticalDensity | null;
	line: LineResult;
	/** Total path length (sum of propagation and enclosure lengths), m. */
	pathLength: DecimalString;
	nohd: NohdResult;
	lensNohd: LensNohdResult[];
	points: PointResult[];
	/** Every limit used in a comparison or a hazard distance. */
	limitsUsed: LimitRef[];
	/** Every limit offered to the engine. */
	limitsConsidered: LimitRef[];
	breakdown: BreakdownStep[];
	caution: string;
}

export type AssessmentOutcome = { ok: true; result: AssessmentResult } | { ok: false; errors: HazardInputError[] };
