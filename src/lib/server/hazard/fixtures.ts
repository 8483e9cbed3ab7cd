/**
 * Inputs shared by the specs. Not used by the engine.
 *
 * The limits below are DEMONSTRATION VALUES shaped like common exposure limits, recalled from
 * memory for tests only; they are not the values of any particular code and must never be used
 * for a real assessment (limits are always entered by the LSO from the applicable local code).
 */
import type { AssessmentResult } from '$lib/assessmentResult';
import type { BeamPath, ElementSI, LimitSI, LineSI, PointSI } from '$lib/schemas/assessment';
import { evaluate } from './evaluate';

const demo = 'Demonstration value for tests (from memory); not a code value.';

/** Eye, 400–700 nm, 18 µs – 10 s: H = 18·t^0.75 J/m², 7 mm aperture (shape of the ICNIRP 2013 / ANSI Z136.1 retinal limit; from memory). */
export const EYE_VISIBLE: LimitSI = {
	id: 'eye-vis',
	version: '3',
	label: 'Eye, visible, 18 µs – 10 s',
	citation: demo,
	tissue: 'eye',
	wavelengthMin: '400e-9',
	wavelengthMax: '700e-9',
	durationMin: '18e-6',
	durationMax: '10',
	quantity: 'radiant_exposure',
	k: '18',
	n: '0.75',
	limitingAperture: '7e-3',
	pulseBasis: 'continuous',
	pulseTrainExponent: null,
	noTrainCorrection: false,
	wavelengthFactorKind: 'none',
	wavelengthFactorValue: null,
	wavelengthFactorSlope: null,
	wavelengthFactorOrigin: null,
	wavelengthFactorFrom: null,
	wavelengthFactorTo: null,
	extendedAlphaMin: null,
	extendedAlphaMax: null,
	extendedExponent: null,
	limitingApertureExponent: '0',
	pulseGroupingTime: null
};

/** Eye, 400–700 nm, 10 s – 30 000 s: E = 10 W/m² (1 mW/cm², from memory, simplified). */
export const EYE_VISIBLE_LONG: LimitSI = { ...EYE_VISIBLE, id: 'eye-vis-long', version: '1', label: 'Eye, visible, 10 s – 30 000 s', durationMin: '10', durationMax: '30000', quantity: 'irradiance', k: '10', n: '0' };

/** Eye, 400–700 nm, single pulse 1 ns – 18 µs: H = 5e-3 J/m² (0.5 µJ/cm², from memory), pulse train N^−0.25 (from memory). */
export const EYE_VISIBLE_PULSE: LimitSI = {
	...EYE_VISIBLE,
	id: 'eye-vis-pulse',
	version: '2',
	label: 'Eye, visible, single pulse 1 ns – 18 µs',
	durationMin: '1e-9',
	durationMax: '18e-6',
	k: '5e-3',
	n: '0',
	pulseBasis: 'single_pulse',
	pulseTrainExponent: '-0.25'
};

/** Eye, 1050–1400 nm, single pulse 1 ns – 50 µs: H = 0.05 J/m² (5 µJ/cm², from memory); no pulse-train rule entered. */
export const EYE_1064_PULSE: LimitSI = { ...EYE_VISIBLE_PULSE, id: 'eye-1064-pulse', version: '1', label: 'Eye, 1050–1400 nm, single pulse 1 ns – 50 µs', wavelengthMin: '1050e-9', wavelengthMax: '1400e-9', durationMax: '50e-6', k: '0.05', pulseTrainExponent: null };

/** Eye, 1050–1400 nm, 10 s – 30 000 s: E = 50 W/m² (5 mW/cm², from memory, simplified). */
export const EYE_1064_LONG: LimitSI = { ...EYE_VISIBLE_LONG, id: 'eye-1064-long', label: 'Eye, 1050–1400 nm, 10 s – 30 000 s', wavelengthMin: '1050e-9', wavelengthMax: '1400e-9', k: '50' };

/** Skin, 400–1400 nm, 10 s – 30 000 s: E = 2000 W/m² (0.2 W/cm², from memory), 3.5 mm aperture. */
export const SKIN_LONG: LimitSI = {
	...EYE_VISIBLE_LONG,
	id: 'skin-long',
	version: '1',
	label: 'Skin, 400–1400 nm, 10 s – 30 000 s',
	tissue: 'skin',
	wavelengthMin: '400e-9',
	wavelengthMax: '1400e-9',
	k: '2000',
	limitingAperture: '3.5e-3'
};

export const DEMO_LIMITS: LimitSI[] = [EYE_VISIBLE, EYE_VISIBLE_LONG, EYE_VISIBLE_PULSE, EYE_1064_PULSE, SKIN_LONG];

export function cwLine(over: Partial<LineSI> = {}): LineSI {
	return {
		id: null,
		label: '',
		emissionGroup: '',
		mode: 'continuous',
		wavelength: '532e-9',
		wavelengthMax: null,
		power: '0.1',
		pulseEnergy: null,
		pulseDuration: null,
		repetitionRate: null,
		beamProfile: 'gaussian',
		beamDiameter: '1e-3',
		beamDiameterDefinition: '1/e',
		divergence: '1e-3',
		divergenceDefinition: '1/e',
		beamQuality: null,
		hotSpotFactor: null,
		...over
	};
}

export function pulsedLine(over: Partial<LineSI> = {}): LineSI {
	return cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-3', pulseDuration: '10e-9', repetitionRate: '1000', ...over });
}

export function el(kind: ElementSI['kind'], values: Partial<ElementSI> = {}): ElementSI {
	return { kind, label: '', length: null, transmission: null, reflectance: null, magnification: null, focalLength: null, coreDiameter: null, numericalAperture: null, couplingTransmission: null, bands: null, ...values };
}

export const free = (length: string | number) => el('propagate', { length: String(length) });

export function eyePoint(id: string, position: string | number, over: Partial<PointSI> = {}): PointSI {
	return { id, label: '', position: String(position), tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25', reflectance: null, viewingAngle: null, viewingDistance: null, ...over };
}

export interface Scenario {
	path: BeamPath;
	limits: LimitSI[];
}

export function scenario(over: { line?: LineSI; points?: PointSI[]; limits?: LimitSI[]; nohd?: string | null } = {}, elements: ElementSI[] = [free(10)]): Scenario {
	return {
		path: { lines: [over.line ?? cwLine()], elements, points: over.points ?? [eyePoint('p1', '5')], nohdExposureDuration: over.nohd === undefined ? '0.25' : over.nohd },
		limits: over.limits ?? DEMO_LIMITS
	};
}

export function run(s: Scenario, breakdown = true): AssessmentResult {
	const out = evaluate(s.path, s.limits, { breakdown });
	if (!out.ok) throw new Error(JSON.stringify(out.errors));
	return out.result;
}
