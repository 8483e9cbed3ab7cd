// Loading and saving the beam-path editor, shared by the "new path" and "edit path" pages.
import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { desc, eq } from 'drizzle-orm';
import { blankElement, pathFormSchema, type PathForm } from '$lib/schemas/register';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { failForm, readForm } from '$lib/server/http/forms';
import * as lasers from '$lib/server/lasers';
import * as paths from '$lib/server/paths';
import * as reviews from '$lib/server/reviews';
import { replySchema } from '$lib/schemas/reviews';
import { orError } from '$lib/server/http/pages';
import type { AssessmentResult } from '$lib/assessmentResult';
import type { EditorData } from '$lib/components/path-editor/editorData';
import type { LineColumns } from '$lib/schemas/assessment';
import { asEntered, type QuantityKind } from '$lib/units';

const shown = (v: string | null, kind: QuantityKind | null) => asEntered(v, kind, kind === 'angle' ? '°' : undefined);

/** The laser's lines as the editor needs them: the stored columns, which the preview maps with lineFromRow. */
function editorLines(detail: NonNullable<lasers.LaserDetail>): LineColumns[] {
	return detail.lines.map((l) => ({
		id: l.id,
		label: l.label,
		emissionGroup: l.emissionGroup,
		mode: l.mode,
		wavelength: l.wavelength,
		wavelengthMax: l.wavelengthMax,
		power: l.power,
		pulseEnergy: l.pulseEnergy,
		pulseDuration: l.pulseDuration,
		repetitionRate: l.repetitionRate,
		beamProfile: l.beamProfile,
		beamDiameter: l.beamDiameter,
		beamDiameterDefinition: l.beamDiameterDefinition,
		divergence: l.divergence,
		divergenceDefinition: l.divergenceDefinition,
		beamQuality: l.beamQuality,
		hotSpotFactor: l.hotSpotFactor
	}));
}

export async function loadNewPath(locals: App.Locals, laserId: string) {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const { detail, editable } = orError(await lasers.find(scope, laserId));
	if (!editable || detail.laser.status === 'retired') error(403, { message: 'Only members of this laser’s lab and laser safety officers can add beam paths to it.' });
	const visible = detail.lines[0]?.wavelength && Number(detail.lines[0].wavelength) >= 400e-9 && Number(detail.lines[0].wavelength) <= 700e-9;
	const start: PathForm = {
		// The first line and every line emitted together with it.
		lineIds: detail.lines.filter((l, _, all) => l.id === all[0].id || (l.emissionGroup !== '' && l.emissionGroup === all[0].emissionGroup)).map((l) => l.id),
		lineChoiceReason: '',
		name: '',
		purpose: '',
		// Common practice: 0.25 s (aversion response) for visible beams, 10 s for invisible ones.
		nohdExposureDuration: visible ? '0.25 s' : '10 s',
		elements: [blankElement('propagate', { length: '1 m' })],
		points: [{ key: 'new-1', label: 'End of the path', kind: 'intrabeam', tissue: 'eye', position: '1 m', exposureDuration: visible ? '0.25 s' : '10 s', reflectance: '', viewingAngle: '', viewingDistance: '' }],
		version: 0
	};
	return {
		laser: { id: detail.laser.id, name: `${detail.laser.maker} ${detail.laser.model}`, labCode: detail.lab.code },
		lines: editorLines(detail),
		form: await superValidate(start, zod4(pathFormSchema), { errors: false }),
		pathId: null,
		editable: true,
		latest: null,
		history: []
	} satisfies EditorData;
}

/** A stored path as the editor's form values: SI numbers written back with their units. */
export function formValues(detail: paths.PathDetail): PathForm {
	const p = detail.path;
	return {
		lineIds: detail.lines.map((l) => l.id),
		lineChoiceReason: p.lineChoiceReason,
		name: p.name,
		purpose: p.purpose,
		nohdExposureDuration: shown(p.nohdExposureDuration, 'time'),
		elements: detail.elements.map((e) => ({
			kind: e.kind,
			label: e.label,
			length: shown(e.length, 'length'),
			transmission: shown(e.transmission, null),
			reflectance: shown(e.reflectance, null),
			magnification: shown(e.magnification, null),
			focalLength: shown(e.focalLength, 'length'),
			coreDiameter: shown(e.coreDiameter, 'length'),
			numericalAperture: shown(e.numericalAperture, null),
			couplingTransmission: shown(e.couplingTransmission, null),
			bands: (e.bands ?? []).map((b) => ({ wavelengthMin: shown(b.wavelengthMin, 'wavelength'), wavelengthMax: shown(b.wavelengthMax, 'wavelength'), transmission: shown(b.transmission, null) }))
		})),
		points: detail.points.map((pt) => ({
			key: pt.id,
			label: pt.label,
			kind: pt.kind,
			tissue: pt.tissue,
			position: shown(pt.position, 'length'),
			exposureDuration: shown(pt.exposureDuration, 'time'),
			reflectance: shown(pt.reflectance, null),
			viewingAngle: shown(pt.viewingAngle, 'angle'),
			viewingDistance: shown(pt.viewingDistance, 'length')
		})),
		version: p.version
	};
}

export async function loadPath(locals: App.Locals, pathId: string) {
	const scope = await scopeOf(requireUser(locals));
	const { detail, editable } = orError(await paths.find(scope, pathId));
	const laser = orError(await lasers.find(scope, detail.laser.id));
	const p = detail.path;
	const values = formValues(detail);
	const history = await db
		.select({ id: table.assessment.id, createdAt: table.assessment.createdAt, verdict: table.assessment.verdict, cause: table.assessment.cause, worstRatio: table.assessment.worstRatio, stale: table.assessment.stale })
		.from(table.assessment)
		.where(eq(table.assessment.pathId, pathId))
		.orderBy(desc(table.assessment.createdAt))
		.limit(20);
	return {
		laser: { id: detail.laser.id, name: `${detail.laser.maker} ${detail.laser.model}`, labCode: detail.lab.code },
		lines: editorLines(laser.detail),
		form: await superValidate(values, zod4(pathFormSchema), { errors: false }),
		pathId,
		editable,
		path: { stale: p.stale, flagged: p.flagged, verdict: p.verdict, staleReason: detail.latest?.staleReason ?? null },
		latest: detail.latest ? { createdAt: detail.latest.createdAt, result: detail.latest.result as AssessmentResult | { errors: unknown[] }, cause: detail.latest.cause } : null,
		history,
		// Where the path stands with the officer: the researcher reads the decision here.
		review: await reviews.record(p, editable),
		replyForm: await superValidate(zod4(replySchema), { id: 'reply' })
	} satisfies EditorData;
}

export async function savePath(locals: App.Locals, request: Request, laserId: string | null, pathId: string | null) {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const form = await readForm(request, zod4(pathFormSchema));
	if (!form.valid) return fail(400, { form });
	let forLaser = laserId;
	if (pathId) {
		const found = await paths.find(scope, pathId);
		if (!found.ok) return failForm(form, found);
		forLaser = found.detail.laser.id;
	}
	const result = await paths.save(scope, forLaser!, pathId, form.data);
	if (!result.ok) return failForm(form, result);
	redirect(303, `/paths/${result.id}?saved=${result.verdict}`);
}
