import { describe, expect, it } from 'vitest';
import { adequacy, type BandOnRecord } from './eyewearAdequacy';

const band = (eyewearId: string, min: string, max: string, od: string): BandOnRecord => ({ eyewearId, label: eyewearId, wavelengthMin: min, wavelengthMax: max, od });

describe('eyewear adequacy', () => {
	const goggles = [band('A', '1e-6', '1.1e-6', '7'), band('A', '5.3e-7', '5.35e-7', '4')];

	it('counts both ends of a band as covered', () => {
		expect(adequacy(goggles, '1e-6', '7').status).toBe('adequate');
		expect(adequacy(goggles, '1.1e-6', '7').status).toBe('adequate');
	});

	it('is never adequate in a gap between bands, whatever the OD elsewhere', () => {
		expect(adequacy(goggles, '8e-7', '1').status).toBe('none_on_record');
		expect(adequacy(goggles, '1.1000001e-6', '1').status).toBe('none_on_record');
	});

	it('says inadequate when a band covers the wavelength at too low an OD', () => {
		const r = adequacy(goggles, '5.32e-7', '5');
		expect(r.status).toBe('inadequate');
		expect(r.best).toMatchObject({ eyewearId: 'A', od: '4' });
	});

	it('is adequate when one of several items meets the OD, and names each that does', () => {
		const shelf = [...goggles, band('B', '5e-7', '5.5e-7', '6'), band('C', '5.32e-7', '5.32e-7', '5')];
		const r = adequacy(shelf, '5.32e-7', '5');
		expect(r.status).toBe('adequate');
		expect(r.best?.eyewearId).toBe('B');
		expect(r.matching.sort()).toEqual(['B', 'C']);
	});

	it('has nothing on record without eyewear', () => {
		expect(adequacy([], '1.064e-6', '5')).toEqual({ status: 'none_on_record', best: null, matching: [] });
	});

	it('compares decimals exactly at the required OD', () => {
		expect(adequacy([band('D', '1e-6', '1.1e-6', '5.0')], '1.064e-6', '5').status).toBe('adequate');
		expect(adequacy([band('D', '1e-6', '1.1e-6', '4.99')], '1.064e-6', '5').status).toBe('inadequate');
	});
});
