// What changed between two assessment snapshots (the cleared one and the current one), in words
// the officer reads: "Power: 5 W → 6 W", "Element 3 (Focusing lens) added", "Limit … version 1 → 2".
import { formatQuantity, type QuantityKind } from '../units';

type Json = Record<string, unknown>;
export type Change = { where: string; before: string; after: string };

const kinds: Record<string, QuantityKind | null> = {
	wavelength: 'wavelength',
	power: 'power',
	pulseEnergy: 'energy',
	pulseDuration: 'time',
	repetitionRate: 'frequency',
	beamDiameter: 'length',
	divergence: 'angle',
	length: 'length',
	focalLength: 'length',
	coreDiameter: 'length',
	position: 'length',
	exposureDuration: 'time',
	viewingAngle: 'angle',
	viewingDistance: 'length'
};

const names: Record<string, string> = {
	mode: 'Emission',
	wavelength: 'Wavelength',
	power: 'Power',
	pulseEnergy: 'Energy per pulse',
	pulseDuration: 'Pulse duration',
	repetitionRate: 'Repetition rate',
	beamDiameter: 'Beam diameter',
	beamDiameterDefinition: 'Diameter definition',
	divergence: 'Divergence',
	divergenceDefinition: 'Divergence definition',
	beamQuality: 'M²',
	kind: 'Kind',
	label: 'Label',
	length: 'Length',
	transmission: 'Transmission',
	reflectance: 'Reflectance',
	magnification: 'Magnification',
	focalLength: 'Focal length',
	coreDiameter: 'Core diameter',
	numericalAperture: 'Numerical aperture',
	couplingTransmission: 'Coupling transmission',
	position: 'Distance along the path',
	tissue: 'Tissue',
	exposureDuration: 'Exposure duration',
	viewingAngle: 'Viewing angle',
	viewingDistance: 'Viewing distance'
};

function show(key: string, v: unknown): string {
	if (v === null || v === undefined || v === '') return '—';
	const kind = kinds[key];
	if (kind && (typeof v === 'string' || typeof v === 'number')) {
		try {
			return formatQuantity(String(v), kind, { significantDigits: 6 });
		} catch {
			return String(v);
		}
	}
	return String(v);
}

function same(a: unknown, b: unknown): boolean {
	if ((a === null || a === undefined || a === '') && (b === null || b === undefined || b === '')) return true;
	if (typeof a === typeof b && typeof a !== 'object') {
		const na = Number(a);
		const nb = Number(b);
		if (typeof a === 'string' && !Number.isNaN(na) && !Number.isNaN(nb) && a.trim() !== '' && String(b).trim() !== '') return na === nb;
	}
	return JSON.stringify(a) === JSON.stringify(b);
}

function fields(where: string, a: Json, b: Json, out: Change[], skip: string[] = []) {
	for (const key of new Set([...Object.keys(a), ...Object.keys(b)])) {
		if (skip.includes(key) || same(a[key], b[key])) continue;
		out.push({ where: `${where}${names[key] ?? key}`, before: show(key, a[key]), after: show(key, b[key]) });
	}
}

const elementName = (e: Json, i: number) => `Element ${i + 1} (${String(e.kind)}${e.label ? `, ${e.label}` : ''})`;

export function diffInputs(before: Json, after: Json): Change[] {
	const out: Change[] = [];
	fields('Line: ', (before.line ?? {}) as Json, (after.line ?? {}) as Json, out);
	const be = (before.elements ?? []) as Json[];
	const ae = (after.elements ?? []) as Json[];
	for (let i = 0; i < Math.max(be.length, ae.length); i++) {
		if (!be[i]) out.push({ where: elementName(ae[i], i), before: 'not there', after: 'added' });
		else if (!ae[i]) out.push({ where: elementName(be[i], i), before: 'present', after: 'removed' });
		else fields(`${elementName(ae[i], i)}: `, be[i], ae[i], out);
	}
	const bp = new Map(((before.points ?? []) as Json[]).map((p) => [String(p.id), p]));
	const ap = new Map(((after.points ?? []) as Json[]).map((p) => [String(p.id), p]));
	for (const [id, p] of ap) {
		const old = bp.get(id);
		if (!old) out.push({ where: `Point “${String(p.label ?? id)}”`, before: 'not there', after: 'added' });
		else fields(`Point “${String(p.label ?? id)}”: `, old, p, out, ['id']);
	}
	for (const [id, p] of bp) if (!ap.has(id)) out.push({ where: `Point “${String(p.label ?? id)}”`, before: 'present', after: 'removed' });
	const bl = new Map(((before.limits ?? []) as Json[]).map((l) => [String(l.id), l]));
	const al = new Map(((after.limits ?? []) as Json[]).map((l) => [String(l.id), l]));
	for (const [id, l] of al) {
		const old = bl.get(id);
		if (!old) out.push({ where: `Limit “${String(l.label)}”`, before: 'not in force', after: `version ${String(l.version)}` });
		else if (String(old.version) !== String(l.version)) out.push({ where: `Limit “${String(l.label)}”`, before: `version ${String(old.version)}`, after: `version ${String(l.version)}` });
	}
	for (const [id, l] of bl) if (!al.has(id)) out.push({ where: `Limit “${String(l.label)}”`, before: `version ${String(l.version)}`, after: 'withdrawn' });
	const bn = ((before.nohd ?? {}) as Json).exposureDuration;
	const an = ((after.nohd ?? {}) as Json).exposureDuration;
	if (!same(bn, an)) out.push({ where: 'Exposure duration for the NOHD', before: show('exposureDuration', bn), after: show('exposureDuration', an) });
	return out;
}
