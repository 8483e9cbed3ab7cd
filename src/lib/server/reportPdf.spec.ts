import { describe, expect, it } from 'vitest';
import { pdfText } from './reportPdf';

describe('text for the PDF fonts', () => {
	it('writes super- and subscripts the fonts lack in plain characters, and keeps ², ³ and ¹ alone', () => {
		expect(pdfText('3.73 × 10⁻¹⁹ J')).toBe('3.73 × 10^-19 J');
		expect(pdfText('s⁻¹·m⁻²')).toBe('s^-1·m^-2');
		expect(pdfText('OD = log₁₀(ratio)')).toBe('OD = log10(ratio)');
		expect(pdfText('E = P / (π·D²/4), m³, 10¹')).toBe('E = P / (π·D²/4), m³, 10¹');
		expect(pdfText('k·tⁿ')).toBe('k·t^n');
	});
});
