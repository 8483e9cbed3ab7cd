// The words of the beam-path form's fields, for every message a person reads: the editor's lists,
// the assessment panel and the engine's own reasons. 'elements.1.transmission' is "Element 2,
// Transmission (0–1)", as the form numbers and labels it. One mapping; nothing else names fields.
const lineFieldWords: Record<string, string> = {
	wavelength: 'wavelength',
	wavelengthMax: 'upper end of the tuning range',
	power: 'power',
	pulseEnergy: 'energy per pulse',
	pulseDuration: 'pulse duration',
	repetitionRate: 'repetition rate',
	beamDiameter: 'beam diameter',
	divergence: 'divergence',
	beamQuality: 'M²',
	hotSpotFactor: 'hot-spot factor'
};

const elementFieldWords: Record<string, string> = {
	length: 'Length',
	transmission: 'Transmission (0–1)',
	reflectance: 'Reflectance (0–1)',
	magnification: 'Magnification',
	focalLength: 'Focal length',
	coreDiameter: 'Core diameter',
	numericalAperture: 'Numerical aperture',
	couplingTransmission: 'Coupling transmission (0–1)',
	label: 'Label'
};
const pointFieldWords: Record<string, string> = {
	label: 'Name',
	position: 'Distance along the path',
	exposureDuration: 'Exposure duration',
	reflectance: 'Reflectance ρ (0–1)',
	viewingAngle: 'Viewing angle',
	viewingDistance: 'Viewing distance',
	tissue: 'Tissue',
	kind: 'Kind',
	id: 'Point'
};

export { elementFieldWords, pointFieldWords };

/** 'elements.1.transmission' → 'Element 2, Transmission (0–1)'; used in summary lists. */
export function fieldWords(key: string): string {
	const parts = key.split('.');
	if (parts[0] === 'elements' && parts.length >= 2) return `Element ${Number(parts[1]) + 1}${parts[2] ? `, ${elementFieldWords[parts[2]] ?? parts[2]}` : ''}`;
	if (parts[0] === 'points' && parts.length >= 2) return `Point ${Number(parts[1]) + 1}${parts[2] ? `, ${pointFieldWords[parts[2]] ?? parts[2]}` : ''}`;
	if (parts[0] === 'line' || parts[0] === 'lines') {
		const field = parts[0] === 'lines' ? parts[2] : parts[1];
		return `Emission line${field ? `, ${lineFieldWords[field] ?? field}` : ''}`;
	}
	if (parts[0] === 'nohd' || key === 'nohdExposureDuration') return 'Exposure duration for the NOHD';
	if (key === '(body)') return 'The assessment';
	return key;
}
