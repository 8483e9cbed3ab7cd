import { describe, expect, it } from 'vitest';
import { adequacy, controlShortfalls, type BandOnRecord, type EyewearControl, type Need, type Requirement } from './eyewearAdequacy';

const band = (eyewearId: string, min: string, max: string, od: string): BandOnRecord => ({ eyewearId, label: eyewearId, wavelengthMin: min, wavelengthMax: max, od });
const at = (wavelength: string, od: string, max = wavelength): Requirement => ({ wavelengthMin: wavelength, wavelengthMax: max, od, label: `OD ${od} at ${wavelength}` });

describe('eyewear adequacy', () => {
	const goggles = [band('A', '1e-6', '1.1e-6', '7'), band('A', '5.3e-7', '5.35e-7', '4')];

	it('counts both ends of a band as covered', () => {
		expect(adequacy(goggles, [at('1e-6', '7')]).status).toBe('adequate');
		expect(adequacy(goggles, [at('1.1e-6', '7')]).status).toBe('adequate');
	});

	it('is never adequate in a gap between bands, whatever the OD elsewhere', () => {
		expect(adequacy(goggles, [at('8e-7', '1')]).status).toBe('none_on_record');
		expect(adequacy(goggles, [at('1.1000001e-6', '1')]).status).toBe('none_on_record');
	});

	it('says inadequate when a band covers the wavelength at too low an OD', () => {
		const r = adequacy(goggles, [at('5.32e-7', '5')]);
		expect(r.status).toBe('inadequate');
		expect(r.best).toMatchObject({ eyewearId: 'A', uncovered: [at('5.32e-7', '5')] });
	});

	it('is adequate when one of several items meets the OD, and names each that does', () => {
		const shelf = [...goggles, band('B', '5e-7', '5.5e-7', '6'), band('C', '5.32e-7', '5.32e-7', '5')];
		const r = adequacy(shelf, [at('5.32e-7', '5')]);
		expect(r.status).toBe('adequate');
		expect(r.matching.sort()).toEqual(['B', 'C']);
	});

	it('asks one pair to cover every line: a pair for one line only is inadequate, naming the other', () => {
		// A doubled Nd:YAG path: 532 nm at OD 4 and the residual 1064 nm at OD 5. Green-only glasses don't do.
		const shelf = [band('green-only', '5.2e-7', '5.4e-7', '6'), band('ir-only', '1e-6', '1.1e-6', '7')];
		const needs = [at('5.32e-7', '4'), at('1.064e-6', '5')];
		const r = adequacy(shelf, needs);
		expect(r.status).toBe('inadequate');
		expect(r.best!.uncovered).toHaveLength(1);
		expect(adequacy([...shelf, band('both', '5.2e-7', '5.4e-7', '4'), band('both', '1.0e-6', '1.1e-6', '5')], needs)).toMatchObject({ status: 'adequate', matching: ['both'] });
	});

	it('covers a tunable line over its whole range, across adjacent bands but not across a gap', () => {
		const tunable = at('7e-7', '5', '9e-7');
		expect(adequacy([band('T', '6.9e-7', '8e-7', '5'), band('T', '8e-7', '9.1e-7', '6')], [tunable]).status).toBe('adequate');
		expect(adequacy([band('T', '6.9e-7', '7.9e-7', '5'), band('T', '8e-7', '9.1e-7', '6')], [tunable]).status).toBe('inadequate');
		expect(adequacy([band('T', '6.9e-7', '9.1e-7', '4')], [tunable]).status).toBe('inadequate');
	});

	it('has nothing on record without eyewear, and compares decimals exactly at the required OD', () => {
		expect(adequacy([], [at('1.064e-6', '5')])).toEqual({ status: 'none_on_record', best: null, matching: [] });
		expect(adequacy([band('D', '1e-6', '1.1e-6', '5.0')], [at('1.064e-6', '5')]).status).toBe('adequate');
		expect(adequacy([band('D', '1e-6', '1.1e-6', '4.99')], [at('1.064e-6', '5')]).status).toBe('inadequate');
	});
});

describe('eyewear controls of a clearance', () => {
	const need = (wavelength: string, od: number, odAssessed: number, label: string): Need => ({ wavelengthMin: wavelength, wavelengthMax: wavelength, od, odAssessed, label });
	const control = (index: number, wavelength: string, od: string, max = wavelength): EyewearControl => ({ index, wavelengthMin: wavelength, wavelengthMax: max, od, label: `OD ${od} at ${wavelength}` });
	const green = need('5.32e-7', 4, 3.31, '532 nm');
	const ir = need('1.064e-6', 7, 6.92, '1064 nm');

	it('refuses an OD below the rounded-up need, with both numbers', () => {
		expect(controlShortfalls([green], [control(0, '5.32e-7', '2')])).toEqual({ 'controls.0.minOd': 'The 532 nm line needs at least OD 4 (assessed 3.31, rounded up); this control gives OD 2 at 5.32e-7.' });
		expect(controlShortfalls([green], [control(0, '5.32e-7', '3.5')])).toHaveProperty(['controls.0.minOd']);
		expect(controlShortfalls([green], [control(0, '5.32e-7', '4')])).toEqual({});
	});

	it('refuses a control at a wavelength the path does not carry, and names the line left uncovered', () => {
		expect(controlShortfalls([green], [control(0, '5e-9', '4')])).toEqual({
			'controls.0.wavelength': 'OD 4 at 5e-9 concerns no line of this path (it carries 532 nm).',
			controls: 'The 532 nm line needs at least OD 4 (assessed 3.31, rounded up), and no eyewear control covers it.'
		});
	});

	it('asks every line that needs eyewear to be covered: a control for one line of two is not enough', () => {
		expect(controlShortfalls([green, ir], [control(0, '5.32e-7', '4')])).toEqual({ controls: 'The 1064 nm line needs at least OD 7 (assessed 6.92, rounded up), and no eyewear control covers it.' });
		expect(controlShortfalls([green, ir], [control(0, '5.32e-7', '4'), control(1, '1.064e-6', '7')])).toEqual({});
		// One control over a range covering both lines at the higher OD does too.
		expect(controlShortfalls([green, ir], [control(0, '5e-7', '7', '1.1e-6')])).toEqual({});
	});

	it('lets a line that needs no eyewear go without, but a control must still concern the path', () => {
		const safe = need('4.05e-7', 0, 0, '405 nm');
		expect(controlShortfalls([safe], [])).toEqual({});
		expect(controlShortfalls([safe], [control(0, '4.05e-7', '2')])).toEqual({});
		// No eyewear required at all (an enclosed beam): the officer's call, nothing to check.
		expect(controlShortfalls([green, ir], [])).toEqual({});
	});
});
