import { redirect } from '@sveltejs/kit';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { addYears, format } from 'date-fns';
import { approveSchema, confirmSchema, coverSchema, draftSchema, returnDraftSchema, signSchema, submitSchema } from '$lib/schemas/procedures';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { fieldsNeedAttention, reloadAndRetry, unreadableUpload } from '$lib/server/http/failure';
import { failForm, formFields, readForm } from '$lib/server/http/forms';
import { nudge, queues } from '$lib/server/jobs/queues';
import { orError } from '$lib/server/http/pages';
import * as procedures from '$lib/server/procedures';
import { readUploads } from '$lib/server/uploads';
import { todayISO } from '$lib/inspectionState';
import { day } from '$lib/dates';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const detail = orError(await procedures.find(scope, params.procedureId, today));
	const { procedure: proc, current, draft } = detail;

	// The diff shown: as asked, else the draft against the version in force, else the last two versions.
	const numbers = detail.versions.filter((v) => v.id).map((v) => String(v.number));
	const defaultTo = draft ? 'draft' : (numbers[0] ?? '');
	const defaultFrom = draft ? (numbers[0] ?? '') : (numbers[1] ?? '');
	const from = url.searchParams.get('from') ?? defaultFrom;
	const to = url.searchParams.get('to') ?? defaultTo;
	const diff = procedures.compare(detail, from, to);

	const paths = detail.can.edit ? await procedures.pathOptions(proc) : [];
	return {
		today,
		procedure: { id: proc.id, title: proc.title, kind: proc.kind, laserId: proc.laserId, areaId: proc.areaId, reviewNeeded: proc.reviewNeeded, reviewNeededReason: proc.reviewNeededReason, version: proc.version },
		labCode: detail.labCode,
		labName: detail.labName,
		targetLabel: detail.targetLabel,
		laserClass: detail.laserClass,
		ownerName: detail.ownerName,
		state: detail.state,
		current: current
			? { id: current.id, number: current.number, approvedAt: current.approvedAt, reviewBy: current.reviewBy, approvalComment: current.approvalComment, changeNote: current.changeNote, html: current.html, document: current.document, documentSha256: current.documentSha256 }
			: null,
		draft: draft ? { state: draft.state, returnedComment: draft.returnedComment, editorName: draft.editorName, updatedAt: draft.updatedAt, html: draft.html, document: draft.document, version: draft.version, hasBody: draft.body.trim() !== '' } : null,
		versions: detail.versions,
		covered: detail.covered,
		signers: detail.signers,
		mine: detail.mine,
		intervalMonths: detail.intervalMonths,
		can: detail.can,
		diff,
		compareChoices: [...(draft ? [{ value: 'draft', label: `Draft of version ${(current?.number ?? 0) + 1}` }] : []), ...numbers.map((n) => ({ value: n, label: `Version ${n}` }))],
		paths: paths.map((p) => ({ value: p.id, label: p.name, detail: proc.areaId ? `${p.laserMaker} ${p.laserModel}` : undefined })),
		draftForm: detail.can.edit
			? await superValidate({ body: draft?.body ?? current?.body ?? '', changeNote: draft?.changeNote ?? '', version: draft?.version ?? 0 }, zod4(draftSchema), { id: 'draft', errors: false })
			: null,
		submitForm: await superValidate({ version: draft?.version ?? 0 }, zod4(submitSchema), { id: 'submit', errors: false }),
		approveForm: await superValidate({ reviewBy: format(addYears(new Date(`${today}T00:00:00Z`), 1), 'yyyy-MM-dd'), comment: '', version: draft?.version ?? 0 }, zod4(approveSchema), { id: 'approve', errors: false }),
		returnForm: await superValidate({ comment: '', version: draft?.version ?? 0 }, zod4(returnDraftSchema), { id: 'return', errors: false }),
		signForm: await superValidate({ versionId: current?.id ?? '', understood: false as unknown as true }, zod4(signSchema), { id: 'sign', errors: false }),
		coverForm: await superValidate({ pathIds: detail.covered.map((c) => c.id), version: proc.version }, zod4(coverSchema), { id: 'cover', errors: false }),
		confirmForm: await superValidate({ note: '', version: proc.version }, zod4(confirmSchema), { id: 'confirm', errors: false })
	};
};

/** The officers' mail about a submitted draft goes out now rather than at the next sweep. */
const mailSoon = () => nudge(queues.mailDeliver);

export const actions: Actions = {
	save: async function saveDraft({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(draftSchema), { id: 'draft' });
		if (!form.valid) return fail(400, { draftForm: form });
		const r = await procedures.saveDraft(scope, params.procedureId, form.data);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/procedures/${params.procedureId}?saved=1#next-version`);
	},
	attach: async function attachPdf({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const data = await formFields(request);
		const attach = { action: 'attach' };
		if (!data) return failForm(attach, unreadableUpload());
		const version = Number(data.get('version'));
		if (!Number.isInteger(version) || version < 1) return failForm(attach, reloadAndRetry());
		const files = await readUploads(data, 'pdf', 1, 'application/pdf');
		if (!files.ok) return failForm(attach, files);
		if (files.files.length === 0) return failForm(attach, fieldsNeedAttention({ pdf: 'Choose a PDF file to attach.' }));
		const r = await procedures.attachPdf(scope, params.procedureId, files.files[0], version);
		if (!r.ok) return failForm(attach, r);
		redirect(303, `/procedures/${params.procedureId}?attached=1#next-version`);
	},
	detach: async function detachPdf({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(submitSchema), { id: 'submit' });
		if (!form.valid) return fail(400, { submitForm: form });
		const r = await procedures.detachPdf(scope, params.procedureId, form.data.version);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/procedures/${params.procedureId}#next-version`);
	},
	submit: async function submitDraft({ locals, params, request }) {
		const user = requireAbility(locals, 'workWithLasers');
		const scope = await scopeOf(user);
		const form = await readForm(request, zod4(submitSchema), { id: 'submit' });
		if (!form.valid) return fail(400, { submitForm: form });
		const r = await procedures.submit(scope, params.procedureId, form.data.version, { id: user.id, name: user.name });
		if (!r.ok) return failForm(form, r);
		await mailSoon();
		redirect(303, `/procedures/${params.procedureId}?submitted=1#next-version`);
	},
	approve: async function approveDraft({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(approveSchema), { id: 'approve' });
		if (!form.valid) return fail(400, { approveForm: form });
		const r = await procedures.approve(scope, params.procedureId, form.data, todayISO());
		if (!r.ok) return failForm(form, r);
		redirect(303, `/procedures/${params.procedureId}?approved=${r.number}`);
	},
	return: async function returnDraft({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(returnDraftSchema), { id: 'return' });
		if (!form.valid) return fail(400, { returnForm: form });
		const r = await procedures.returnDraft(scope, params.procedureId, form.data.comment, form.data.version);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/procedures/${params.procedureId}?returned=1#next-version`);
	},
	sign: async function signProcedure({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(signSchema), { id: 'sign' });
		if (!form.valid) return fail(400, { signForm: form });
		const r = await procedures.sign(scope, params.procedureId, form.data.versionId, todayISO());
		if (!r.ok) return failForm(form, r);
		return message(form, `Signed on ${day(r.signedAt)}. Thank you.`);
	},
	cover: async function coverPaths({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(coverSchema), { id: 'cover' });
		if (!form.valid) return fail(400, { coverForm: form });
		const r = await procedures.cover(scope, params.procedureId, form.data.pathIds, form.data.version);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Saved the beam paths it covers.');
	},
	confirm: async function confirmProcedure({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(confirmSchema), { id: 'confirm' });
		if (!form.valid) return fail(400, { confirmForm: form });
		const r = await procedures.confirmCurrent(scope, params.procedureId, form.data.note, form.data.version);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Confirmed: the version in force still matches the set-up.');
	}
};
