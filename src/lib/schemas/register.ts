// Forms of the register, shared by browser and server. Physical values are typed with their unit
// ("5 W", "5000 mW", "532 nm") and kept as text in the form; toSI() turns them into SI decimal
// strings for the engine and the database, naming the field when one does not parse.
import { z } from 'zod';
import { parseFraction, parseQuantity, type QuantityKind } from '../units';
import { beamDefinitions, beamProfiles, elementKinds, emissionModes, laserClasses, laserStatuses, pointKinds, tissues, type ElementKind } from '../enums';
import type { ElementSI, LineColumns, PointSI } from './assessment';

export { beamDefinitions, beamProfiles, elementKinds, emissionModes, laserClasses, laserStatuses, pointKinds, tissues, type ElementKind };

/** A value with its unit, as typed. Empty is allowed here; whether it is required depends on the mode or kind. */
function quantity(kind: QuantityKind, opts: { defaultUnit?: string } = {}) {
	return z
		.string()
		.trim()
		.max(64, 'That is too long for a number with its unit.')
		.default('')
		.superRefine((text, ctx) => {
			if (text === '') return;
			const parsed = parseQuantity(text, kind, opts);
			if (!parsed.ok) ctx.addIssue({ code: 'custom', message: parsed.reason });
		});
}

const plainNumber = z
	.string()
	.trim()
	.max(32)
	.default('')
	.refine((t) => t === '' || /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t), 'Enter a plain number, like 0.5 or 2.');

/** A transmission or reflectance: a fraction, a percentage or an optical density ('0.5', '1 %', 'OD 2'). */
const fraction = z
	.string()
	.trim()
	.max(32)
	.default('')
	.refine((t) => t === '' || parseFraction(t).ok, 'Enter a fraction from 0 to 1 (0.5), a percentage (1 %) or an optical density (OD 2).');

const requiredText = (what: string, max = 200) => z.string().trim().min(1, `Enter ${what}.`).max(max, `At most ${max} characters.`);

export const lineFields = {
	label: z.string().trim().max(120).default(''),
	/** Lines of a laser with the same group name are emitted together (a harmonic and its fundamental). */
	emissionGroup: z.string().trim().max(60, 'At most 60 characters.').default(''),
	mode: z.enum(emissionModes, { error: 'Choose continuous, single pulse or repetitively pulsed.' }).default('continuous'),
	wavelength: quantity('wavelength'),
	wavelengthMax: quantity('wavelength'),
	power: quantity('power'),
	pulseEnergy: quantity('energy'),
	pulseDuration: quantity('time'),
	repetitionRate: quantity('frequency'),
	beamProfile: z.enum(beamProfiles, { error: 'Choose Gaussian or flat-top.' }).default('gaussian'),
	beamDiameter: quantity('length', { defaultUnit: 'mm' }),
	beamDiameterDefinition: z.enum(beamDefinitions).default('1/e2'),
	divergence: quantity('angle', { defaultUnit: 'mrad' }),
	divergenceDefinition: z.enum(beamDefinitions).default('1/e2'),
	beamQuality: plainNumber,
	hotSpotFactor: plainNumber
};

type LineForm = { [K in keyof typeof lineFields]: z.infer<(typeof lineFields)[K]> };

/** Which line fields each emission mode needs. */
export const lineFieldsByMode: Record<(typeof emissionModes)[number], (keyof LineForm)[]> = {
	continuous: ['wavelength', 'power', 'beamDiameter', 'divergence'],
	single_pulse: ['wavelength', 'pulseEnergy', 'pulseDuration', 'beamDiameter', 'divergence'],
	repetitive: ['wavelength', 'pulseEnergy', 'pulseDuration', 'repetitionRate', 'beamDiameter', 'divergence']
};

function requireLineFields(line: LineForm, ctx: z.RefinementCtx, prefix: (string | number)[] = []) {
	for (const f of lineFieldsByMode[line.mode])
		if (line[f] === '') ctx.addIssue({ code: 'custom', path: [...prefix, f], message: 'Needed for this emission mode.' });
}

export const lineSchema = z
	.object({ ...lineFields, version: z.coerce.number().int().nonnegative().default(0) })
	.strict()
	.superRefine((l, ctx) => requireLineFields(l, ctx));

export const laserFields = {
	labId: z.uuid({ error: 'Choose the lab.' }),
	maker: requiredText('the maker', 120),
	model: requiredText('the model', 120),
	serial: z.string().trim().max(120).default(''),
	laserClass: z.enum(laserClasses, { error: 'Choose the laser class.' }).default('4'),
	status: z.enum(laserStatuses, { error: 'Choose a status.' }).default('active'),
	notes: z.string().trim().max(2000).default('')
};

/** A new laser with its first emission line. */
export const newLaserSchema = z
	.object({ ...laserFields, line: z.object(lineFields).strict() })
	.strict()
	.superRefine((l, ctx) => requireLineFields(l.line, ctx, ['line']));

export const editLaserSchema = z.object({ ...laserFields, version: z.coerce.number().int().positive() }).strict();

/** One wavelength band of a transmission element or mirror, as typed. */
export const bandFormSchema = z
	.object({
		wavelengthMin: quantity('wavelength'),
		wavelengthMax: quantity('wavelength'),
		transmission: fraction
	})
	.strict();

export const elementFormSchema = z
	.object({
		kind: z.enum(elementKinds, { error: 'Choose an element kind.' }),
		label: z.string().trim().max(120).default(''),
		length: quantity('length', { defaultUnit: 'm' }),
		transmission: fraction,
		reflectance: fraction,
		magnification: plainNumber,
		focalLength: quantity('length', { defaultUnit: 'mm' }),
		coreDiameter: quantity('length', { defaultUnit: 'µm' }),
		numericalAperture: plainNumber,
		couplingTransmission: fraction,
		/** Transmission elements and mirrors: what they pass on per wavelength band (a dichroic, a harmonic separator). */
		bands: z.array(bandFormSchema).max(20, 'At most 20 bands.').default([])
	})
	.strict();

export const pointFormSchema = z
	.object({
		key: z.string().trim().min(1).max(64),
		label: requiredText('a name for the point', 120),
		kind: z.enum(pointKinds, { error: 'Choose intrabeam or diffuse.' }).default('intrabeam'),
		tissue: z.enum(tissues, { error: 'Choose eye or skin.' }).default('eye'),
		position: quantity('length', { defaultUnit: 'm' }),
		exposureDuration: quantity('time'),
		reflectance: plainNumber,
		viewingAngle: quantity('angle', { defaultUnit: '°' }),
		viewingDistance: quantity('length', { defaultUnit: 'm' })
	})
	.strict();

export const pathFormSchema = z
	.object({
		/** The lines the path carries: every line emitted together, or a subset with a reason. */
		lineIds: z.array(z.uuid({ error: 'Choose the emission lines.' })).min(1, 'Choose the emission lines the path carries.').max(12, 'At most 12 lines.'),
		lineChoiceReason: z.string().trim().max(500, 'At most 500 characters.').default(''),
		name: requiredText('a name for the path', 160),
		purpose: z.string().trim().max(2000).default(''),
		nohdExposureDuration: quantity('time'),
		elements: z.array(elementFormSchema).max(200, 'At most 200 elements.').default([]),
		points: z.array(pointFormSchema).min(1, 'Mark at least one point where a person could be exposed.').max(100, 'At most 100 points.').default([]),
		version: z.coerce.number().int().nonnegative().default(0)
	})
	.strict();

export type ElementForm = z.infer<typeof elementFormSchema>;

/** A new element of a kind, every value empty unless given. */
export function blankElement(kind: ElementKind, values: Partial<ElementForm> = {}): ElementForm {
	return { kind, label: '', length: '', transmission: '', reflectance: '', magnification: '', focalLength: '', coreDiameter: '', numericalAperture: '', couplingTransmission: '', bands: [], ...values };
}
export type PointForm = z.infer<typeof pointFormSchema>;
export type PathForm = z.infer<typeof pathFormSchema>;
export type NewLaserForm = z.infer<typeof newLaserSchema>;

/** The fields an element kind needs, with the unit kind each is read in (null = plain number). */
/** `fraction`: a power factor typed as 0.5, 1 % or OD 2 (see parseFraction). */
export const elementFieldsByKind: Record<ElementKind, { field: keyof ElementForm; unit: QuantityKind | null; optional?: boolean; defaultUnit?: string; fraction?: true }[]> = {
	propagate: [{ field: 'length', unit: 'length', defaultUnit: 'm' }],
	enclosure: [{ field: 'length', unit: 'length', defaultUnit: 'm' }],
	transmission: [{ field: 'transmission', unit: null, fraction: true }],
	mirror: [{ field: 'reflectance', unit: null, optional: true, fraction: true }],
	expander: [{ field: 'magnification', unit: null }],
	lens: [{ field: 'focalLength', unit: 'length', defaultUnit: 'mm' }],
	fibre: [
		{ field: 'coreDiameter', unit: 'length', defaultUnit: 'µm' },
		{ field: 'numericalAperture', unit: null },
		{ field: 'couplingTransmission', unit: null, optional: true, fraction: true }
	]
};

export type FieldErrors = Record<string, string>;

/** Text with a unit → SI decimal string; '' → null. Records a message under `path` when it does not parse. */
export function toSI(text: string, kind: QuantityKind | null | 'fraction', path: string, errors: FieldErrors, defaultUnit?: string): string | null {
	const t = text.trim();
	if (t === '') return null;
	if (kind === 'fraction') {
		const f = parseFraction(t);
		if (!f.ok) {
			errors[path] = f.reason;
			return null;
		}
		return f.value.toString();
	}
	if (kind === null) {
		if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) {
			errors[path] = 'Enter a plain number, like 0.5 or 2.';
			return null;
		}
		return t;
	}
	const parsed = parseQuantity(t, kind, { defaultUnit });
	if (!parsed.ok) {
		errors[path] = parsed.reason;
		return null;
	}
	return parsed.value.toString();
}

const lineUnits: Record<string, [QuantityKind | null, string?]> = {
	wavelength: ['wavelength'],
	wavelengthMax: ['wavelength'],
	power: ['power'],
	pulseEnergy: ['energy'],
	pulseDuration: ['time'],
	repetitionRate: ['frequency'],
	beamDiameter: ['length', 'mm'],
	divergence: ['angle', 'mrad'],
	beamQuality: [null],
	hotSpotFactor: [null]
};

/** A line as stored: the columns of an emission line (the SI shape of the engine, without its id). */
export type LineValues = Omit<LineColumns, 'id'>;

/** A line form in SI, with only the fields its mode uses (the others are cleared). */
export function lineToSI(line: LineForm, prefix = ''): { ok: true; value: LineValues } | { ok: false; errors: FieldErrors } {
	const errors: FieldErrors = {};
	const used = new Set<string>([...lineFieldsByMode[line.mode], 'wavelengthMax', 'beamQuality', 'hotSpotFactor']);
	const out: Record<string, string | null> = {};
	for (const [field, [kind, defaultUnit]] of Object.entries(lineUnits)) {
		const text = used.has(field) ? (line[field as keyof LineForm] as string) : '';
		out[field] = toSI(text, kind, prefix + field, errors, defaultUnit);
		if (used.has(field) && out[field] === null && lineFieldsByMode[line.mode].includes(field as keyof LineForm) && !errors[prefix + field])
			errors[prefix + field] = 'Needed for this emission mode.';
	}
	if (Object.keys(errors).length) return { ok: false, errors };
	return {
		ok: true,
		value: {
			label: line.label,
			emissionGroup: line.emissionGroup,
			mode: line.mode,
			beamProfile: line.beamProfile,
			beamDiameterDefinition: line.beamDiameterDefinition,
			divergenceDefinition: line.divergenceDefinition,
			wavelength: out.wavelength!,
			wavelengthMax: out.wavelengthMax,
			power: out.power,
			pulseEnergy: out.pulseEnergy,
			pulseDuration: out.pulseDuration,
			repetitionRate: out.repetitionRate,
			beamDiameter: out.beamDiameter!,
			divergence: out.divergence!,
			beamQuality: out.beamQuality,
			hotSpotFactor: out.hotSpotFactor
		}
	};
}

/** The element values a kind does not use are null. */
const NO_ELEMENT_VALUES = { length: null, transmission: null, reflectance: null, magnification: null, focalLength: null, coreDiameter: null, numericalAperture: null, couplingTransmission: null, bands: null };
/** Element kinds that may act per wavelength band. */
export const bandedKinds: readonly ElementKind[] = ['transmission', 'mirror'];

/**
 * Elements and points of a path form in the one SI shape (src/lib/schemas/assessment.ts). Errors are
 * keyed like the form: 'elements.2.length'.
 */
export function pathToSI(form: Pick<PathForm, 'elements' | 'points' | 'nohdExposureDuration'>):
	| { ok: true; value: { elements: ElementSI[]; points: PointSI[]; nohdExposureDuration: string | null } }
	| { ok: false; errors: FieldErrors } {
	const errors: FieldErrors = {};
	const elements = form.elements.map((e, i) => {
		const out: ElementSI = { kind: e.kind, label: e.label, ...NO_ELEMENT_VALUES };
		for (const spec of elementFieldsByKind[e.kind]) {
			const path = `elements.${i}.${spec.field}`;
			const v = toSI(e[spec.field] as string, spec.fraction ? 'fraction' : spec.unit, path, errors, spec.defaultUnit);
			if (v === null && !spec.optional && !errors[path]) errors[path] = 'Needed for this element.';
			(out as Record<string, unknown>)[spec.field] = v;
		}
		if (bandedKinds.includes(e.kind) && e.bands.length) {
			out.bands = e.bands.map((b, j) => {
				const at = (f: string) => `elements.${i}.bands.${j}.${f}`;
				const band = { wavelengthMin: toSI(b.wavelengthMin, 'wavelength', at('wavelengthMin'), errors), wavelengthMax: toSI(b.wavelengthMax, 'wavelength', at('wavelengthMax'), errors), transmission: toSI(b.transmission, 'fraction', at('transmission'), errors) };
				for (const [f, v] of Object.entries(band)) if (v === null && !errors[at(f)]) errors[at(f)] = 'Needed for the band.';
				return band as { wavelengthMin: string; wavelengthMax: string; transmission: string };
			});
		}
		return out;
	});
	const points = form.points.map((p, i) => {
		const at = (f: string) => `points.${i}.${f}`;
		const point: PointSI = {
			id: p.key,
			label: p.label,
			kind: p.kind,
			tissue: p.tissue,
			position: toSI(p.position, 'length', at('position'), errors, 'm') ?? '',
			exposureDuration: toSI(p.exposureDuration, 'time', at('exposureDuration'), errors),
			reflectance: p.kind === 'diffuse' ? toSI(p.reflectance, null, at('reflectance'), errors) : null,
			viewingAngle: p.kind === 'diffuse' ? toSI(p.viewingAngle, 'angle', at('viewingAngle'), errors, '°') : null,
			viewingDistance: p.kind === 'diffuse' ? toSI(p.viewingDistance, 'length', at('viewingDistance'), errors, 'm') : null
		};
		if (point.position === '' && !errors[at('position')]) errors[at('position')] = 'Enter the distance along the path.';
		return point;
	});
	const nohdExposureDuration = toSI(form.nohdExposureDuration, 'time', 'nohdExposureDuration', errors);
	if (Object.keys(errors).length) return { ok: false, errors };
	return { ok: true, value: { elements, points, nohdExposureDuration } };
}
