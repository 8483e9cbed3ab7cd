// What changed between two assessment snapshots (the cleared one and the current one), in words
// the officer reads: "Line: Power: 5 W → 6 W", "Element 3 (lens, f = 100 mm) added",
// "Limit … version 1 → 2", and for the results "Verdict: within limit → exceeds limit".
import type { SnapshotInputs } from '$lib/server/assessments';
import { fieldQuantityKinds, formatQuantity } from '../units';

type Json = Record<string, unknown>;
export type Change = { where: string; before: string; after: string };

const names: Record<string, string> = {
	mode: 'Emission',
	wavelength: 'Wavelength',
	wavelengthMax: 'Upper end of the tuning range',
	power: 'Power',
	pulseEnergy: 'Energy per pulse',
	pulseDuration: 'Pulse duration',
	repetitionRate: 'Repetition rate',
	beamProfile: 'Beam profile',
	beamDiameter: 'Beam diameter',
	beamDiameterDefinition: 'Diameter definition',
	divergence: 'Divergence',
	divergenceDefinition: 'Divergence definition',
	beamQuality: 'M²',
	hotSpotFactor: 'Hot-spot factor',
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
	const kind = fieldQuantityKinds[key] ?? null;
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
	const empty = (x: unknown) => x === null || x === undefined || x === '';
	if (empty(a) && empty(b)) return true;
	if ((typeof a === 'string' || typeof a === 'number') && (typeof b === 'string' || typeof b === 'number') && String(a).trim() !== '' && String(b).trim() !== '') {
		const na = Number(a);
		const nb = Number(b);
		if (!Number.isNaN(na) && !Number.isNaN(nb)) return na === nb;
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

/**
 * Snapshot inputs in today's shape ({ path, limits }). Snapshots of the 1.x engine stored
 * { line, elements, points, limits, nohd }; they are read into the same shape, with the defaults the
 * fields added since then take (a Gaussian profile, no hot spot).
 */
export function normaliseInputs(raw: unknown): SnapshotInputs {
	const r = (raw ?? {}) as Json;
	if (r.path) return r as unknown as SnapshotInputs;
	const line = { beamProfile: 'gaussian', hotSpotFactor: null, wavelengthMax: null, ...((r.line ?? {}) as Json) };
	return {
		path: {
			lines: [line],
			elements: (r.elements ?? []) as Json[],
			points: (r.points ?? []) as Json[],
			nohdExposureDuration: ((r.nohd ?? {}) as Json).exposureDuration ?? null
		},
		limits: (r.limits ?? []) as Json[]
	} as unknown as SnapshotInputs;
}

/** Changes of the inputs: the path (lines, elements, points, duration) and the limit versions. */
export function diffInputs(beforeRaw: unknown, afterRaw: unknown): Change[] {
	const before = normaliseInputs(beforeRaw);
	const after = normaliseInputs(afterRaw);
	const out: Change[] = [];
	const bl = before.path.lines as unknown as Json[];
	const al = after.path.lines as unknown as Json[];
	for (let i = 0; i < Math.max(bl.length, al.length); i++) {
		const where = al.length > 1 || bl.length > 1 ? `Line ${i + 1}: ` : 'Line: ';
		if (!bl[i]) out.push({ where: where.slice(0, -2), before: 'not there', after: 'added' });
		else if (!al[i]) out.push({ where: where.slice(0, -2), before: 'present', after: 'removed' });
		// The line's id and name are not part of the hazard.
		else fields(where, bl[i], al[i], out, ['id', 'label']);
	}
	const be = before.path.elements as unknown as Json[];
	const ae = after.path.elements as unknown as Json[];
	for (let i = 0; i < Math.max(be.length, ae.length); i++) {
		if (!be[i]) out.push({ where: elementName(ae[i], i), before: 'not there', after: 'added' });
		else if (!ae[i]) out.push({ where: elementName(be[i], i), before: 'present', after: 'removed' });
		else fields(`${elementName(ae[i], i)}: `, be[i], ae[i], out);
	}
	const bp = new Map((before.path.points as unknown as Json[]).map((p) => [String(p.id), p]));
	const ap = new Map((after.path.points as unknown as Json[]).map((p) => [String(p.id), p]));
	for (const [id, p] of ap) {
		const old = bp.get(id);
		if (!old) out.push({ where: `Point “${String(p.label || id)}”`, before: 'not there', after: 'added' });
		else fields(`Point “${String(p.label || id)}”: `, old, p, out, ['id']);
	}
	for (const [id, p] of bp) if (!ap.has(id)) out.push({ where: `Point “${String(p.label || id)}”`, before: 'present', after: 'removed' });
	const bls = new Map((before.limits as unknown as Json[]).map((l) => [String(l.id), l]));
	const als = new Map((after.limits as unknown as Json[]).map((l) => [String(l.id), l]));
	for (const [id, l] of als) {
		const old = bls.get(id);
		if (!old) out.push({ where: `Limit “${String(l.label)}”`, before: 'not in force', after: `version ${String(l.version)}` });
		else if (String(old.version) !== String(l.version)) out.push({ where: `Limit “${String(l.label)}”`, before: `version ${String(old.version)}`, after: `version ${String(l.version)}` });
	}
	for (const [id, l] of bls) if (!als.has(id)) out.push({ where: `Limit “${String(l.label)}”`, before: `version ${String(l.version)}`, after: 'withdrawn' });
	if (!same(before.path.nohdExposureDuration, after.path.nohdExposureDuration))
		out.push({ where: 'Exposure duration for the hazard distances', before: show('exposureDuration', before.path.nohdExposureDuration), after: show('exposureDuration', after.path.nohdExposureDuration) });
	return out;
}

const verdictText: Record<string, string> = { within_limit: 'within limit', exceeds_limit: 'exceeds limit', no_applicable_limit: 'no applicable limit', incomplete: 'incomplete' };

/** Changes of the answer: engine version, verdict, worst ratio, the whole OD eyewear needs. */
export function diffResults(beforeRaw: unknown, afterRaw: unknown): Change[] {
	const b = (beforeRaw ?? {}) as Json;
	const a = (afterRaw ?? {}) as Json;
	const out: Change[] = [];
	if (b.engineVersion !== a.engineVersion) out.push({ where: 'Hazard engine', before: String(b.engineVersion ?? '—'), after: String(a.engineVersion ?? '—') });
	if (b.verdict !== a.verdict) out.push({ where: 'Verdict', before: verdictText[String(b.verdict)] ?? '—', after: verdictText[String(a.verdict)] ?? '—' });
	const ratio = (v: unknown) => (v === null || v === undefined ? '—' : String(Number(Number(v).toPrecision(3))));
	if (ratio(b.worstRatio) !== ratio(a.worstRatio)) out.push({ where: 'Worst ratio (exposure ÷ limit)', before: ratio(b.worstRatio), after: ratio(a.worstRatio) });
	const od = (r: Json) => ((r.requiredOpticalDensity as Json | null)?.roundedUpWhole ?? null) as number | string | null;
	if (!same(od(b), od(a))) out.push({ where: 'Optical density needed (whole)', before: od(b) === null ? '—' : String(od(b)), after: od(a) === null ? '—' : String(od(a)) });
	return out;
}
