// The beam-path form → the body of POST /api/assessments/preview. The same mapping as the server's
// engine input (line as stored in SI, elements and points from pathToSI), written for the browser.
import { elementFieldsByKind, lineFieldsByMode, pathToSI, type ElementSI, type FieldErrors, type PathForm, type PointSI } from '$lib/schemas/register';
import type { AssessmentPreviewRequest } from '$lib/schemas/assessment';
import type { EditorLine } from '$lib/server/pathForms';
import type { loadNewPath, loadPath } from '$lib/server/pathForms';

/** What both editor pages receive from their load function. */
export type EditorData = Awaited<ReturnType<typeof loadPath>> | Awaited<ReturnType<typeof loadNewPath>>;
export type { EditorLine };

type Body = AssessmentPreviewRequest;
type LineBody = Body['line'];
type ElementBody = NonNullable<Body['elements']>[number];
type PointBody = Body['points'][number];

const lineFieldWords: Record<string, string> = {
	wavelength: 'wavelength',
	power: 'power',
	pulseEnergy: 'energy per pulse',
	pulseDuration: 'pulse duration',
	repetitionRate: 'repetition rate',
	beamDiameter: 'beam diameter',
	divergence: 'divergence'
};

/** The stored line with only the fields of its emission mode. */
export function lineBody(line: EditorLine): { ok: true; value: LineBody } | { ok: false; missing: string[] } {
	const missing = lineFieldsByMode[line.mode].filter((f) => line[f as keyof EditorLine] === null || line[f as keyof EditorLine] === '');
	if (missing.length) return { ok: false, missing: missing.map((f) => lineFieldWords[f] ?? f) };
	const beam = {
		wavelength: line.wavelength!,
		beamDiameter: line.beamDiameter!,
		beamDiameterDefinition: line.beamDiameterDefinition,
		divergence: line.divergence!,
		divergenceDefinition: line.divergenceDefinition,
		beamQuality: line.beamQuality === null || line.beamQuality === '' ? null : line.beamQuality
	};
	switch (line.mode) {
		case 'continuous':
			return { ok: true, value: { mode: 'continuous', power: line.power!, ...beam } };
		case 'single_pulse':
			return { ok: true, value: { mode: 'single_pulse', pulseEnergy: line.pulseEnergy!, pulseDuration: line.pulseDuration!, ...beam } };
		case 'repetitive':
			return {
				ok: true,
				value: { mode: 'repetitive', pulseEnergy: line.pulseEnergy!, pulseDuration: line.pulseDuration!, repetitionRate: line.repetitionRate!, ...beam }
			};
	}
}

/** An element in SI without its empty optional fields. */
export function elementBody(e: ElementSI): ElementBody {
	const out: Record<string, string> = { kind: e.kind };
	if (e.label && e.label.trim()) out.label = e.label.trim();
	for (const spec of elementFieldsByKind[e.kind]) {
		const v = e[spec.field as keyof ElementSI];
		if (typeof v === 'string' && v !== '') out[spec.field] = v;
	}
	return out as unknown as ElementBody;
}

export function pointBody(p: PointSI): PointBody {
	const out: PointBody = { id: p.key, position: p.position ?? '', tissue: p.tissue, kind: p.kind };
	if (p.label.trim()) out.label = p.label.trim();
	if (p.exposureDuration !== null) out.exposureDuration = p.exposureDuration;
	if (p.kind === 'diffuse') {
		if (p.reflectance !== null) out.reflectance = p.reflectance;
		if (p.viewingAngle !== null) out.viewingAngle = p.viewingAngle;
		if (p.viewingDistance !== null) out.viewingDistance = p.viewingDistance;
	}
	return out;
}

export type BodyOutcome =
	| { ok: true; body: Body }
	/** Values in the form that do not read yet: keyed like the form ('elements.2.length'). */
	| { ok: false; kind: 'unfinished'; errors: FieldErrors }
	/** The chosen emission line cannot be assessed as stored. */
	| { ok: false; kind: 'line'; message: string };

export function previewBody(form: PathForm, lines: EditorLine[]): BodyOutcome {
	const si = pathToSI(form);
	if (!si.ok) return { ok: false, kind: 'unfinished', errors: si.errors };
	const line = lines.find((l) => l.id === form.lineId);
	if (!line) return { ok: false, kind: 'line', message: lines.length ? 'Choose the emission line to see the assessment.' : 'This laser has no emission line yet: add one on the laser’s page.' };
	const lb = lineBody(line);
	if (!lb.ok) return { ok: false, kind: 'line', message: `The emission line lacks its ${lb.missing.join(', ')}: complete it on the laser’s page to see the assessment.` };
	return {
		ok: true,
		body: {
			line: lb.value,
			elements: si.value.elements.map(elementBody),
			points: si.value.points.map(pointBody),
			nohd: { exposureDuration: si.value.nohdExposureDuration }
		}
	};
}

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
	if (parts[0] === 'line') return `Emission line${parts[1] ? `, ${lineFieldWords[parts[1]] ?? parts[1]}` : ''}`;
	if (parts[0] === 'nohd' || key === 'nohdExposureDuration') return 'Exposure duration for the NOHD';
	if (key === '(body)') return 'The assessment';
	return key;
}
