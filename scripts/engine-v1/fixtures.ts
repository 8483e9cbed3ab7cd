/**
 * Inputs shared by the specs and the documentation examples. Not used by the engine.
 *
 * The limits below are DEMONSTRATION VALUES shaped like common exposure limits, recalled from
 * memory for tests only; they are not the values of any particular code and must never be used
 * for a real assessment (limits are always entered by the LSO from the applicable local code).
 */
import type { AssessmentInput, ElementInput, LimitInput, LineInput, PointInput } from './types';

const demo = 'Demonstration value for tests (from memory); not a code value.';

/** Eye, 400–700 nm, 18 µs – 10 s: H = 18·t^0.75 J/m², 7 mm aperture (shape of the ICNIRP 2013 / ANSI Z136.1 retinal limit; from memory). */
export const EYE_VISIBLE: LimitInput = {
	id: 'eye-vis',
	version: 3,
	label: 'Eye, visible, 18 µs – 10 s',
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
	citation: demo
};

/** Eye, 400–700 nm, 10 s – 30 000 s: E = 10 W/m² (1 mW/cm², from memory, simplified). */
export const EYE_VISIBLE_LONG: LimitInput = {
	...EYE_VISIBLE,
	id: 'eye-vis-long',
	version: 1,
	label: 'Eye, visible, 10 s – 30 000 s',
	durationMin: '10',
	durationMax: '30000',
	quantity: 'irradiance',
	k: '10',
	n: '0'
};

/** Eye, 400–700 nm, single pulse 1 ns – 18 µs: H = 5e-3 J/m² (0.5 µJ/cm², from memory), pulse train N^−0.25 (from memory). */
export const EYE_VISIBLE_PULSE: LimitInput = {
	id: 'eye-vis-pulse',
	version: 2,
	label: 'Eye, visible, single pulse 1 ns – 18 µs',
	tissue: 'eye',
	wavelengthMin: '400e-9',
	wavelengthMax: '700e-9',
	durationMin: '1e-9',
	durationMax: '18e-6',
	quantity: 'radiant_exposure',
	k: '5e-3',
	n: '0',
	limitingAperture: '7e-3',
	pulseBasis: 'single_pulse',
	pulseTrainExponent: '-0.25',
	citation: demo
};

/** Eye, 1050–1400 nm, single pulse 1 ns – 50 µs: H = 0.05 J/m² (5 µJ/cm², from memory). */
export const EYE_1064_PULSE: LimitInput = {
	...EYE_VISIBLE_PULSE,
	id: 'eye-1064-pulse',
	version: 1,
	label: 'Eye, 1050–1400 nm, single pulse 1 ns – 50 µs',
	wavelengthMin: '1050e-9',
	wavelengthMax: '1400e-9',
	durationMax: '50e-6',
	k: '0.05',
	pulseTrainExponent: null
};

/** Skin, 400–1400 nm, 10 s – 30 000 s: E = 2000 W/m² (0.2 W/cm², from memory), 3.5 mm aperture. */
export const SKIN_LONG: LimitInput = {
	id: 'skin-long',
	version: 1,
	label: 'Skin, 400–1400 nm, 10 s – 30 000 s',
	tissue: 'skin',
	wavelengthMin: '400e-9',
	wavelengthMax: '1400e-9',
	durationMin: '10',
	durationMax: '30000',
	quantity: 'irradiance',
	k: '2000',
	n: '0',
	limitingAperture: '3.5e-3',
	pulseBasis: 'continuous',
	citation: demo
};

export const DEMO_LIMITS: LimitInput[] = [EYE_VISIBLE, EYE_VISIBLE_LONG, EYE_VISIBLE_PULSE, EYE_1064_PULSE, SKIN_LONG];

export function cwLine(over: Partial<LineInput> = {}): LineInput {
	return {
		wavelength: '532e-9',
		mode: 'continuous',
		power: '0.1',
		beamDiameter: '1e-3',
		beamDiameterDefinition: '1/e',
		divergence: '1e-3',
		divergenceDefinition: '1/e',
		...over
	};
}

export function eyePoint(id: string, position: string | number, over: Partial<PointInput> = {}): PointInput {
	return { id, position, tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25', ...over };
}

export function scenario(over: Partial<AssessmentInput> = {}, elements: ElementInput[] = [{ kind: 'propagate', length: '10' }]): AssessmentInput {
	return {
		line: cwLine(),
		elements,
		points: [eyePoint('p1', '5')],
		limits: DEMO_LIMITS,
		nohd: { exposureDuration: '0.25' },
		...over
	};
}
