// Procedures against the real database: drafts, submission, approval by another officer into an
// append-only version, sign-offs, the covered paths' review reopening the procedure, PDFs, the
// sanitised text, the diff, the interval setting, and what the app's role may not change.
import { and, desc, eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as paths from '$lib/server/paths';
import * as procedures from '$lib/server/procedures';
import * as reviews from '$lib/server/reviews';
import type { Scope } from '$lib/server/auth/scope';
import type { StoredUpload } from '$lib/server/uploads';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, pathForm, scopeFor } from './factories';

const today = '2026-06-01';
let lab: { id: string };
let otherLab: { id: string };
let researcher: Scope;
let colleague: Scope;
let stranger: Scope;
let officer: Scope;
let secondOfficer: Scope;
let manager: Scope;
let laserId: string;
let lineId: string;

beforeAll(async () => {
	lab = await makeLab();
	otherLab = await makeLab();
	researcher = await scopeFor(await makeUser('researcher', [lab.id]));
	colleague = await scopeFor(await makeUser('researcher', [lab.id]));
	stranger = await scopeFor(await makeUser('researcher', [otherLab.id]));
	officer = await scopeFor(await makeUser('officer'));
	secondOfficer = await scopeFor(await makeUser('officer'));
	manager = await scopeFor(await makeUser('manager'));
	await limits.create(officer.userId, limitForm({ label: `Procedure tests visible ${Date.now()}` }));
	await paths.reassessStale(1000);
	const created = await lasers.create(researcher, laserForm(lab.id));
	if (!created.ok) throw new Error('laser');
	laserId = created.id;
	const found = await lasers.find(researcher, laserId);
	if (!found.ok) throw new Error('laser');
	lineId = found.detail.lines[0].id;
});

const auditOf = (id: string) => db.select().from(table.auditLog).where(and(eq(table.auditLog.entity, 'procedure'), eq(table.auditLog.entityId, id))).orderBy(table.auditLog.id);
const ledgerOf = (kind: string, recordId: string) => db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, kind), eq(table.mailOutbox.recordId, recordId)));

async function draftProcedure(body = '# Alignment\n\n1. Goggles on\n2. Lowest power\n', pathIds: string[] = []) {
	const r = await procedures.create(researcher, { target: `laser:${laserId}`, kind: 'alignment', title: 'Alignment of the green laser', pathIds, body });
	if (!r.ok) throw new Error(JSON.stringify(r));
	return r.id;
}

async function draftVersion(id: string) {
	const [d] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
	return d.version;
}

/** Draft → submitted (by the researcher) → approved by the officer. */
async function approved(body?: string, pathIds: string[] = []) {
	const id = await draftProcedure(body, pathIds);
	expect(await procedures.submit(researcher, id, await draftVersion(id), { id: researcher.userId, name: 'R' })).toEqual({ ok: true });
	const r = await procedures.approve(officer, id, { reviewBy: '2027-06-01', comment: '', version: await draftVersion(id) }, today);
	if (!r.ok) throw new Error(JSON.stringify(r));
	return id;
}

describe('drafting and approval', () => {
	it('a lab member drafts a procedure for a laser of their lab; it is audited', async () => {
		const id = await draftProcedure();
		const found = await procedures.find(researcher, id, today);
		expect(found.ok && found.state).toBe('draft');
		expect(found.ok && found.versions.map((v) => [v.number, v.state])).toEqual([[1, 'draft']]);
		expect((await auditOf(id)).map((a) => a.action)).toEqual(['procedure.create']);
	});

	it('refuses a laser of another lab, a manager, and paths of another laser, writing nothing', async () => {
		const before = await db.$count(table.procedure);
		expect(await procedures.create(stranger, { target: `laser:${laserId}`, kind: 'operating', title: 'Not mine', pathIds: [], body: 'x' })).toMatchObject({ ok: false, status: 400, fields: { target: expect.any(Array) } });
		expect(await procedures.create(manager, { target: `laser:${laserId}`, kind: 'operating', title: 'Read only', pathIds: [], body: 'x' })).toMatchObject({ ok: false, status: 400 });
		const other = await lasers.create(stranger, laserForm(otherLab.id));
		if (!other.ok) throw new Error('laser');
		const found = await lasers.find(stranger, other.id);
		if (!found.ok) throw new Error('laser');
		const foreignPath = await paths.save(stranger, other.id, null, pathForm(found.detail.lines[0].id));
		if (!foreignPath.ok) throw new Error('path');
		expect(await procedures.create(researcher, { target: `laser:${laserId}`, kind: 'operating', title: 'Wrong path', pathIds: [foreignPath.id], body: 'x' })).toMatchObject({ ok: false, status: 400, fields: { pathIds: expect.any(Array) } });
		expect(await db.$count(table.procedure)).toBe(before);
		// Another lab's procedure reads as unknown.
		const id = await draftProcedure();
		expect(await procedures.find(stranger, id, today)).toMatchObject({ ok: false, status: 404 });
	});

	it('a stale draft save is a 409 and loses nothing; an empty draft cannot be submitted', async () => {
		const id = await draftProcedure('');
		const v = await draftVersion(id);
		expect(await procedures.saveDraft(colleague, id, { body: 'Step one', changeNote: '', version: v })).toEqual({ ok: true });
		expect(await procedures.saveDraft(researcher, id, { body: 'Other text', changeNote: '', version: v })).toMatchObject({ ok: false, status: 409 });
		const [d] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
		expect(d.body).toBe('Step one');
		expect(await procedures.saveDraft(colleague, id, { body: '', changeNote: '', version: d.version })).toEqual({ ok: true });
		expect(await procedures.submit(researcher, id, d.version + 1, { id: researcher.userId, name: 'R' })).toMatchObject({ ok: false, status: 400, fields: { body: expect.any(Array) } });
	});

	it('submission tells every officer by mail; only another officer than the drafter approves', async () => {
		const id = await draftProcedure();
		await procedures.saveDraft(officer, id, { body: 'Edited by the officer', changeNote: 'LSO edit', version: await draftVersion(id) });
		await procedures.submit(researcher, id, await draftVersion(id), { id: researcher.userId, name: 'R' });
		const mails = await ledgerOf('procedure.submitted', id);
		expect(mails.map((m) => m.recipientId)).toEqual(expect.arrayContaining([officer.userId, secondOfficer.userId]));
		expect(mails.every((m) => m.recipientId !== researcher.userId)).toBe(true);

		const v = await draftVersion(id);
		expect(await procedures.approve(researcher, id, { reviewBy: '2027-06-01', comment: '', version: v }, today)).toMatchObject({ ok: false, status: 403 });
		expect(await procedures.approve(officer, id, { reviewBy: '2027-06-01', comment: '', version: v }, today)).toMatchObject({ ok: false, status: 403 }); // edited the draft
		expect(await procedures.approve(secondOfficer, id, { reviewBy: today, comment: '', version: v }, today)).toMatchObject({ ok: false, status: 400, fields: { reviewBy: expect.any(Array) } });
		expect(await procedures.approve(secondOfficer, id, { reviewBy: '2027-06-01', comment: '', version: v - 1 }, today)).toMatchObject({ ok: false, status: 409 });
		const r = await procedures.approve(secondOfficer, id, { reviewBy: '2027-06-01', comment: 'Fine', version: v }, today);
		expect(r).toEqual({ ok: true, number: 1 });
		const found = await procedures.find(researcher, id, today);
		if (!found.ok) throw new Error('find');
		expect(found.state).toBe('approved');
		expect(found.draft).toBeNull();
		expect(found.current).toMatchObject({ number: 1, reviewBy: '2027-06-01', body: 'Edited by the officer', approvedBy: secondOfficer.userId });
		expect((await auditOf(id)).map((a) => a.action)).toEqual(['procedure.create', 'procedure.draft', 'procedure.submit', 'procedure.approve']);
	});

	it('a draft sent back returns to draft with the comment; a new version supersedes the old and the diff shows the change', async () => {
		const id = await approved();
		expect(await procedures.saveDraft(researcher, id, { body: '# Alignment\n\n1. Goggles on\n2. Lowest power the diode allows\n3. Beam block\n', changeNote: 'Beam block', version: 0 })).toEqual({ ok: true });
		expect(await procedures.saveDraft(researcher, id, { body: 'again', changeNote: '', version: 0 })).toMatchObject({ ok: false, status: 409 });
		await procedures.submit(researcher, id, await draftVersion(id), { id: researcher.userId, name: 'R' });
		expect(await procedures.returnDraft(officer, id, 'Say which beam block', await draftVersion(id))).toEqual({ ok: true });
		let found = await procedures.find(researcher, id, today);
		expect(found.ok && found.draft).toMatchObject({ state: 'draft', returnedComment: 'Say which beam block' });
		await procedures.submit(researcher, id, await draftVersion(id), { id: researcher.userId, name: 'R' });
		await procedures.approve(officer, id, { reviewBy: '2027-06-01', comment: '', version: await draftVersion(id) }, today);
		found = await procedures.find(researcher, id, today);
		if (!found.ok) throw new Error('find');
		expect(found.versions.map((v) => [v.number, v.state])).toEqual([
			[2, 'approved'],
			[1, 'superseded']
		]);
		const diff = procedures.compare(found, '1', '2')!;
		expect(diff).toMatchObject({ added: 2, removed: 1 });
		expect(diff.blocks).toContainEqual({ kind: 'removed', lines: ['2. Lowest power'] });
		expect(diff.blocks).toContainEqual({ kind: 'added', lines: ['2. Lowest power the diode allows', '3. Beam block'] });
	});

	it('the text is sanitised whenever it is shown', async () => {
		const id = await approved('# Steps\n\n<script>alert(1)</script>\n\n<img src=x onerror=alert(2)>\n\n- [x](javascript:alert(3))\n- **keep**');
		const found = await procedures.find(researcher, id, today);
		if (!found.ok) throw new Error('find');
		expect(found.current!.html).toContain('<h2>Steps</h2>');
		expect(found.current!.html).toContain('<strong>keep</strong>');
		expect(found.current!.html).not.toMatch(/<script|onerror|<img|javascript:/);
	});
});

describe('approved versions and sign-offs cannot be changed by the app', () => {
	it('the app role may not update or delete approved versions, sign-offs, conditions or lapses', async () => {
		const id = await approved();
		await procedures.sign(researcher, id, (await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, id)))[0].id, today);
		for (const statement of [
			sql`UPDATE procedure_version SET body = 'rewritten' WHERE procedure_id = ${id}`,
			sql`DELETE FROM procedure_version WHERE procedure_id = ${id}`,
			sql`UPDATE procedure_signoff SET signed_at = now() - interval '1 day' WHERE procedure_id = ${id}`,
			sql`DELETE FROM procedure_signoff WHERE procedure_id = ${id}`,
			sql`UPDATE authorisation_condition SET training_topic = 'x'`,
			sql`DELETE FROM authorisation_lapse`,
			sql`TRUNCATE procedure_signoff`
		])
			await expect(db.execute(statement), String(statement.queryChunks[0])).rejects.toMatchObject({ cause: { code: '42501' } });
		const [v] = await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, id));
		expect(v.body).toContain('Goggles on');
	});
});

describe('sign-offs', () => {
	it('a lab member signs the version in force once; a stale version, another lab and a manager are refused', async () => {
		const id = await approved();
		const [v1] = await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, id));
		expect(await procedures.sign(researcher, id, '00000000-0000-4000-8000-000000000000', today)).toMatchObject({ ok: false, status: 409 });
		expect(await procedures.sign(stranger, id, v1.id, today)).toMatchObject({ ok: false, status: 404 });
		expect(await procedures.sign(manager, id, v1.id, today)).toMatchObject({ ok: false, status: 403 });
		const signed = await procedures.sign(researcher, id, v1.id, today);
		expect(signed.ok).toBe(true);
		expect(await procedures.sign(researcher, id, v1.id, today)).toMatchObject({ ok: false, status: 409 });
		const found = await procedures.find(researcher, id, today);
		expect(found.ok && found.mine).toMatchObject({ state: 'signed', validUntil: expect.any(String) });
		expect((await auditOf(id)).map((a) => a.action)).toContain('procedure.sign');
	});

	it('a sign-off older than the interval may be signed again, as a new row', async () => {
		const id = await approved();
		const [v1] = await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, id));
		// The app may insert a sign-off dated in the past (never change one): as if signed 13 months ago.
		await db.insert(table.procedureSignoff).values({ versionId: v1.id, procedureId: id, userId: colleague.userId, signedAt: new Date('2025-04-01T10:00:00Z') });
		const found = await procedures.find(colleague, id, today);
		expect(found.ok && found.mine.state).toBe('signoff_lapsed');
		expect((await procedures.sign(colleague, id, v1.id, today)).ok).toBe(true);
		expect(await db.$count(table.procedureSignoff, and(eq(table.procedureSignoff.userId, colleague.userId), eq(table.procedureSignoff.procedureId, id)))).toBe(2);
	});
});

describe('a covered path that goes back to review', () => {
	it('marks the procedure to be reviewed, tells its owner and the officers once, and a new approval answers it', async () => {
		const saved = await paths.save(researcher, laserId, null, pathForm(lineId, { name: `Covered path ${Date.now()}` }));
		if (!saved.ok) throw new Error(JSON.stringify(saved));
		const found = await paths.find(officer, saved.id);
		if (!found.ok) throw new Error('path');
		expect(found.detail.path.reviewState).toBe('awaiting_review');
		expect((await reviews.decide(officer, saved.id, { assessmentId: found.detail.latest!.id, afterDecisionId: '', decision: 'cleared', comments: 'ok', reviewBy: '', controls: [] })).ok).toBe(true);

		const id = await approved(undefined, [saved.id]);
		const uncovered = await approved();
		let detail = await procedures.find(researcher, id, today);
		expect(detail.ok && detail.state).toBe('approved');

		// The researcher changes the path: the clearance no longer matches, the review reopens.
		const again = await paths.find(researcher, saved.id);
		if (!again.ok) throw new Error('path');
		const changed = await paths.save(researcher, laserId, saved.id, pathForm(lineId, { name: again.detail.path.name, purpose: 'moved the lens', version: again.detail.path.version }));
		expect(changed.ok).toBe(true);
		detail = await procedures.find(researcher, id, today);
		if (!detail.ok) throw new Error('find');
		expect(detail.state).toBe('to_be_reviewed');
		expect(detail.procedure.reviewNeededReason).toContain(again.detail.path.name);
		const mails = await ledgerOf('procedure.review', id);
		expect(mails.map((m) => m.recipientId)).toEqual(expect.arrayContaining([researcher.userId, officer.userId, secondOfficer.userId]));
		expect((await auditOf(id)).map((a) => a.action)).toContain('procedure.review_needed');
		const other = await procedures.find(researcher, uncovered, today);
		expect(other.ok && other.state).toBe('approved');

		// Reopened again while already marked: nothing new.
		const count = (await ledgerOf('procedure.review', id)).length;
		await db.transaction((tx) => procedures.pathReviewReopened(tx, { id: saved.id, name: 'again' }));
		expect((await ledgerOf('procedure.review', id)).length).toBe(count);

		// The officer confirms it still matches: the mark goes, with an audit row; a stale version is a 409.
		expect(await procedures.confirmCurrent(officer, id, 'Checked against the new lens position', detail.procedure.version - 1)).toMatchObject({ ok: false, status: 409 });
		expect(await procedures.confirmCurrent(researcher, id, 'Checked', detail.procedure.version)).toMatchObject({ ok: false, status: 403 });
		expect(await procedures.confirmCurrent(officer, id, 'Checked against the new lens position', detail.procedure.version)).toEqual({ ok: true });
		detail = await procedures.find(researcher, id, today);
		expect(detail.ok && detail.state).toBe('approved');

		// Marked again, it is answered by approving a new version too.
		await db.transaction((tx) => procedures.pathReviewReopened(tx, { id: saved.id, name: 'later change' }));
		detail = await procedures.find(researcher, id, today);
		expect(detail.ok && detail.state).toBe('to_be_reviewed');
		await procedures.saveDraft(researcher, id, { body: 'New lens position: step 3 changed.', changeNote: 'lens', version: 0 });
		await procedures.submit(researcher, id, await draftVersion(id), { id: researcher.userId, name: 'R' });
		expect(await procedures.approve(officer, id, { reviewBy: '2027-06-01', comment: '', version: await draftVersion(id) }, today)).toEqual({ ok: true, number: 2 });
		detail = await procedures.find(researcher, id, today);
		expect(detail.ok && [detail.state, detail.procedure.reviewNeeded]).toEqual(['approved', false]);
	});

	it('the covered paths are edited with a version check and must belong to the laser', async () => {
		const id = await draftProcedure();
		const [p] = await db.select().from(table.procedure).where(eq(table.procedure.id, id));
		const saved = await paths.save(researcher, laserId, null, pathForm(lineId, { name: 'Second covered path' }));
		if (!saved.ok) throw new Error('path');
		expect(await procedures.cover(researcher, id, [saved.id], p.version)).toEqual({ ok: true });
		expect(await procedures.cover(researcher, id, [], p.version)).toMatchObject({ ok: false, status: 409 });
		expect(await procedures.cover(researcher, id, ['00000000-0000-4000-8000-000000000000'], p.version + 1)).toMatchObject({ ok: false, status: 400 });
		const found = await procedures.find(researcher, id, today);
		expect(found.ok && found.covered.map((c) => c.id)).toEqual([saved.id]);
	});
});

describe('PDFs', () => {
	const pdf = (name: string, data = Buffer.from('%PDF-1.4\n%test\n')): StoredUpload => ({ fileName: name, mediaType: 'application/pdf', size: data.length, sha256: 'a'.repeat(64), width: null, height: null, data });

	it('attaches a PDF to the draft, readable by the lab and not by another lab; an approved version keeps its hash', async () => {
		const id = await draftProcedure();
		const png = { ...pdf('photo.png'), mediaType: 'image/png' as const };
		expect(await procedures.attachPdf(researcher, id, png, await draftVersion(id))).toMatchObject({ ok: false, status: 400 });
		expect(await procedures.attachPdf(researcher, id, pdf('sop.pdf'), await draftVersion(id))).toEqual({ ok: true });
		const [d] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
		expect(await procedures.documentFor(colleague, d.documentId!)).toMatchObject({ fileName: 'sop.pdf' });
		expect(await procedures.documentFor(stranger, d.documentId!)).toBeNull();
		await procedures.submit(researcher, id, d.version, { id: researcher.userId, name: 'R' });
		await procedures.approve(officer, id, { reviewBy: '2027-06-01', comment: '', version: d.version + 1 }, today);
		const [v] = await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, id));
		expect(v).toMatchObject({ documentId: d.documentId, documentSha256: 'a'.repeat(64) });
	});
});

describe('the sign-off interval', () => {
	it('officers set it with a version check; others may not', async () => {
		const before = await procedures.signoffInterval();
		expect(await procedures.setSignoffInterval(researcher, 6, before.version)).toMatchObject({ ok: false, status: 403 });
		expect(await procedures.setSignoffInterval(officer, 24, before.version)).toEqual({ ok: true });
		expect(await procedures.setSignoffInterval(officer, 6, before.version)).toMatchObject({ ok: false, status: 409 });
		const after = await procedures.signoffInterval();
		expect(after.months).toBe(24);
		await procedures.setSignoffInterval(officer, 12, after.version);
		const [entry] = await db.select().from(table.auditLog).where(eq(table.auditLog.action, 'programme.signoff_interval')).orderBy(desc(table.auditLog.id)).limit(1);
		expect(entry.after).toEqual({ months: 12 });
	});
});
