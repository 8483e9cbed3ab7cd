import { and, desc, eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as eyewear from '$lib/server/eyewear';
import * as paths from '$lib/server/paths';
import * as reviews from '$lib/server/reviews';
import type { Scope } from '$lib/server/auth/scope';
import type { DecisionForm } from '$lib/schemas/reviews';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

let lab: { id: string };
let researcher: Scope;
let officer: Scope;
let secondOfficer: Scope;

beforeAll(async () => {
	lab = await makeLab();
	researcher = await scopeFor(await makeUser('researcher', [lab.id]));
	officer = await scopeFor(await makeUser('officer'));
	secondOfficer = await scopeFor(await makeUser('officer'));
	await limits.create(officer.userId, limitForm({ label: `Review tests visible ${Date.now()}` }));
	await paths.reassessStale(1000);
});

async function flaggedPath(by: Scope = researcher) {
	const created = await lasers.create(by, laserForm(lab.id));
	if (!created.ok) throw new Error('laser');
	const found = await lasers.find(by, created.id);
	if (!found.ok) throw new Error('laser');
	const saved = await paths.save(by, created.id, null, pathForm(found.detail.lines[0].id));
	if (!saved.ok) throw new Error(JSON.stringify(saved));
	const p = await paths.find(by, saved.id);
	if (!p.ok) throw new Error('path');
	return { laserId: created.id, lineId: found.detail.lines[0].id, pathId: saved.id, detail: p.detail };
}

const clearance = (assessmentId: string, afterDecisionId = ''): DecisionForm => ({
	assessmentId,
	afterDecisionId,
	decision: 'cleared',
	comments: 'Enclose above bench height.',
	reviewBy: '',
	controls: [
		{ kind: 'eyewear', minOd: '5', wavelength: '532 nm', wavelengthMax: '', details: '' },
		{ kind: 'enclosure', minOd: '', wavelength: '', wavelengthMax: '', details: 'Tube from the splitter to the lens.' }
	]
});

describe('review decisions', () => {
	it('keeps a path with an incomplete point as a draft: saved, off the desk, not clearable until complete', async () => {
		const created = await lasers.create(researcher, laserForm(lab.id));
		if (!created.ok) throw new Error('laser');
		const found = await lasers.find(researcher, created.id);
		if (!found.ok) throw new Error('laser');
		const form = pathForm(found.detail.lines[0].id);
		form.points = [...form.points, { key: 'p3', label: 'Card', kind: 'diffuse', tissue: 'eye', position: '0.4 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '0.5 m' }];
		const saved = await paths.save(researcher, created.id, null, form);
		if (!saved.ok) throw new Error(JSON.stringify(saved));
		const draft = await paths.find(officer, saved.id);
		if (!draft.ok) throw new Error('path');
		expect(draft.detail.path).toMatchObject({ draft: true, flagged: false, reviewState: 'not_needed' });
		expect((await reviews.queue(officer)).map((q) => q.pathId)).not.toContain(saved.id);
		expect((await reviews.queue(officer, { state: 'draft' })).find((q) => q.pathId === saved.id)?.state).toBe('draft');
		const refused = await reviews.decide(officer, saved.id, clearance(draft.detail.latest!.id));
		expect(refused).toMatchObject({ ok: false, status: 409, message: reviews.draftReason });

		form.points[2].reflectance = '0.5';
		const completed = await paths.save(researcher, created.id, saved.id, { ...form, version: draft.detail.path.version });
		if (!completed.ok) throw new Error(JSON.stringify(completed));
		const done = await paths.find(officer, saved.id);
		if (!done.ok) throw new Error('path');
		expect(done.detail.path).toMatchObject({ draft: false, flagged: true, reviewState: 'awaiting_review' });
		expect((await reviews.queue(officer)).map((q) => q.pathId)).toContain(saved.id);
	});

	it('refuses eyewear that does not protect every line at the rounded-up OD, with the numbers, and saves nothing', async () => {
		const { pathId, detail } = await flaggedPath();
		const result = detail.latest!.result as { requiredOpticalDensities: { od: { value: number; roundedUpWhole: number } }[] };
		const need = result.requiredOpticalDensities[0].od;
		expect(need.roundedUpWhole).toBeGreaterThan(1);
		const weak = String(need.roundedUpWhole - 1);
		const before = await db.$count(table.reviewDecision, eq(table.reviewDecision.pathId, pathId));
		const tooLow = await reviews.decide(officer, pathId, { ...clearance(detail.latest!.id), controls: [{ kind: 'eyewear', minOd: weak, wavelength: '532 nm', wavelengthMax: '', details: '' }] });
		expect(tooLow).toMatchObject({ ok: false, status: 400, fields: { 'controls.0.minOd': [`The 532 nm line needs at least OD ${need.roundedUpWhole} (assessed ${need.value.toFixed(2)}, rounded up); this control gives OD ${weak} at 532 nm.`] } });
		const elsewhere = await reviews.decide(officer, pathId, { ...clearance(detail.latest!.id), controls: [{ kind: 'eyewear', minOd: '9', wavelength: '5 nm', wavelengthMax: '', details: '' }] });
		expect(elsewhere).toMatchObject({ ok: false, status: 400, fields: { 'controls.0.wavelength': [expect.stringMatching(/^OD 9 at 5 nm concerns no line of this path \(it carries 532 nm\)/)], controls: [expect.stringMatching(/no eyewear control covers it/)] } });
		expect(await db.$count(table.reviewDecision, eq(table.reviewDecision.pathId, pathId))).toBe(before);
		const enough = await reviews.decide(officer, pathId, { ...clearance(detail.latest!.id), controls: [{ kind: 'eyewear', minOd: String(need.roundedUpWhole), wavelength: '532 nm', wavelengthMax: '', details: '' }] });
		expect(enough.ok).toBe(true);
	});

	it('calls eyewear adequate only when it covers what the cleared assessment asks, even for a clearance recorded with less', async () => {
		const { pathId, detail } = await flaggedPath();
		const need = (detail.latest!.result as { requiredOpticalDensities: { od: { roundedUpWhole: number } }[] }).requiredOpticalDensities[0].od.roundedUpWhole;
		// A clearance from before the controls were checked: eyewear OD 1 at 532 nm (written as such a record was).
		const [decision] = await db.insert(table.reviewDecision).values({ pathId, assessmentId: detail.latest!.id, decision: 'cleared', decidedBy: officer.userId }).returning();
		await db.insert(table.requiredControl).values({ decisionId: decision.id, kind: 'eyewear', minOd: '1', wavelength: '5.32e-7' });
		const form = { labId: lab.id, location: 'door', frame: 'goggle', condition: 'good' as const, lastCheckedAt: '', version: 0 };
		const weak = await eyewear.save(officer, null, { ...form, label: `weak-${Date.now()}`, bands: [{ wavelengthMin: '530 nm', wavelengthMax: '535 nm', od: '1' }] });
		if (!weak.ok) throw new Error('save');
		const check = (await eyewear.checksForPaths([pathId])).get(pathId)!;
		expect(check.result.status).toBe('inadequate');
		expect(check.requirements.map((r) => r.label)).toEqual(['OD 1 at 532 nm', `OD ${need} at 532 nm (assessed)`]);
		expect(await eyewear.retire(officer, weak.id, 1)).toEqual({ ok: true }); // the lab's store as the next test expects it
	});

	it('a flagged path waits for review and the officers are told', async () => {
		const { pathId, detail } = await flaggedPath();
		expect(detail.path.reviewState).toBe('awaiting_review');
		const queue = await reviews.queue(officer);
		expect(queue.map((q) => q.pathId)).toContain(pathId);
		expect(queue.find((q) => q.pathId === pathId)?.wavelengths).toEqual(['0.000000532']);
		const told = await db.select().from(table.notification).where(eq(table.notification.pathId, pathId));
		expect(told.map((n) => n.userId)).toEqual(expect.arrayContaining([officer.userId, secondOfficer.userId]));
		expect(told.every((n) => n.kind === 'path.flagged')).toBe(true);
	});

	it('clears with controls, tells the researcher, and the eyewear check follows the lab’s store', async () => {
		const { pathId, detail } = await flaggedPath();
		const r = await reviews.decide(officer, pathId, clearance(detail.latest!.id));
		expect(r.ok).toBe(true);
		const after = await paths.find(officer, pathId);
		expect(after.ok && after.detail.path.reviewState).toBe('cleared');
		const [note] = await db.select().from(table.notification).where(eq(table.notification.kind, 'review.cleared')).orderBy(desc(table.notification.createdAt)).limit(1);
		expect(note.userId).toBe(researcher.userId);
		// The notice (and the mail made from it) lists each required control, not just how many.
		expect(note.body).toBe('Required controls:\n• Protective eyewear: at least OD 5 at 532 nm\n• Beam enclosure — Tube from the splitter to the lens.\n\nComments: Enclose above bench height.');

		expect((await eyewear.checksForPaths([pathId])).get(pathId)?.result.status).toBe('none_on_record');
		const form = { labId: lab.id, label: 'G-1', location: 'door', frame: 'goggle', condition: 'good' as const, lastCheckedAt: '', version: 0 };
		await eyewear.save(officer, null, { ...form, bands: [{ wavelengthMin: '520 nm', wavelengthMax: '540 nm', od: '4' }] });
		expect((await eyewear.checksForPaths([pathId])).get(pathId)?.result.status).toBe('inadequate');
		const g2 = await eyewear.save(officer, null, { ...form, label: 'G-2', bands: [{ wavelengthMin: '190 nm', wavelengthMax: '532 nm', od: '6' }] });
		expect((await eyewear.checksForPaths([pathId])).get(pathId)?.result.status).toBe('adequate');

		// Withdrawn from use (lost): kept on record, no longer counted; a stale version is a 409.
		if (!g2.ok) throw new Error('save');
		expect(await eyewear.retire(officer, g2.id, 2)).toMatchObject({ ok: false, status: 409 });
		expect(await eyewear.retire(researcher, g2.id, 1)).toMatchObject({ ok: false, status: 403 });
		expect(await eyewear.retire(officer, g2.id, 1)).toEqual({ ok: true });
		expect((await eyewear.checksForPaths([pathId])).get(pathId)?.result.status).toBe('inadequate');
		expect(must(await eyewear.find(officer, g2.id)).eyewear.retired).toBe(true);
		const [entry] = await db.select().from(table.auditLog).where(and(eq(table.auditLog.action, 'eyewear.retire'), eq(table.auditLog.entityId, g2.id)));
		expect(entry.actorId).toBe(officer.userId);
	});

	it('refuses self-clearance: the officer who registered or last changed the path', async () => {
		const mine = await flaggedPath(officer);
		expect(await reviews.decide(officer, mine.pathId, clearance(mine.detail.latest!.id))).toMatchObject({ ok: false, status: 403 });
		const theirs = await flaggedPath();
		const form = pathForm(theirs.lineId, { version: theirs.detail.path.version, name: 'touched by the officer' });
		const saved = await paths.save(secondOfficer, theirs.laserId, theirs.pathId, form);
		if (!saved.ok) throw new Error('save');
		const latest = await paths.find(secondOfficer, theirs.pathId);
		if (!latest.ok) throw new Error('path');
		expect(await reviews.decide(secondOfficer, theirs.pathId, clearance(latest.detail.latest!.id))).toMatchObject({ ok: false, status: 403 });
		expect((await reviews.decide(officer, theirs.pathId, clearance(latest.detail.latest!.id))).ok).toBe(true);
	});

	it('refuses a decision on a snapshot that is no longer the latest', async () => {
		const p = await flaggedPath();
		const again = await paths.save(researcher, p.laserId, p.pathId, pathForm(p.lineId, { version: p.detail.path.version, name: 'changed' }));
		expect(again.ok).toBe(true);
		expect(await reviews.decide(officer, p.pathId, clearance(p.detail.latest!.id))).toMatchObject({ ok: false, status: 409 });
	});

	it('only officers decide', async () => {
		const p = await flaggedPath();
		expect(await reviews.decide(researcher, p.pathId, clearance(p.detail.latest!.id))).toMatchObject({ ok: false, status: 403 });
	});

	it('a change after clearance puts the path back in the queue, and the diff names it', async () => {
		const p = await flaggedPath();
		await reviews.decide(officer, p.pathId, clearance(p.detail.latest!.id));
		const cleared = await paths.find(researcher, p.pathId);
		if (!cleared.ok) throw new Error('path');
		const form = pathForm(p.lineId, { version: cleared.detail.path.version });
		form.elements[1].transmission = '0.2';
		await paths.save(researcher, p.laserId, p.pathId, form);
		const now = await paths.find(officer, p.pathId);
		if (!now.ok) throw new Error('path');
		expect(now.detail.path.reviewState).toBe('awaiting_review');
		expect(now.detail.path.clearedAssessmentId).toBe(p.detail.latest!.id);
		const { diffInputs } = await import('$lib/server/snapshotDiff');
		const [old] = await db.select().from(table.assessment).where(eq(table.assessment.id, p.detail.latest!.id));
		const changes = diffInputs(old.inputs as Record<string, unknown>, now.detail.latest!.inputs as Record<string, unknown>);
		expect(changes).toContainEqual({ where: 'Element 2 (transmission, splitter, 10 % branch): Transmission', before: '0.1', after: '0.2' });
	});

	it('a returned path waits for its researcher, who answers and changes it', async () => {
		const p = await flaggedPath();
		const r = await reviews.decide(officer, p.pathId, { assessmentId: p.detail.latest!.id, afterDecisionId: '', decision: 'returned', comments: 'Add a beam stop after the lens.', reviewBy: '', controls: [] });
		expect(r.ok).toBe(true);
		expect((await reviews.reply(researcher, p.pathId, 'Beam stop added at 1.9 m.')).ok).toBe(true);
		await paths.reassessStale();
		let now = await paths.find(researcher, p.pathId);
		expect(now.ok && now.detail.path.reviewState).toBe('returned');
		if (!now.ok) throw new Error('path');
		await paths.save(researcher, p.laserId, p.pathId, pathForm(p.lineId, { version: now.detail.path.version }));
		now = await paths.find(researcher, p.pathId);
		expect(now.ok && now.detail.path.reviewState).toBe('awaiting_review');
		const h = await reviews.history(p.pathId);
		expect(h[0].replies.map((x) => x.body)).toEqual(['Beam stop added at 1.9 m.']);
	});

	it('a second officer deciding on what the first already decided gets 409; deciding after reading it works', async () => {
		const p = await flaggedPath();
		const first = await reviews.decide(officer, p.pathId, clearance(p.detail.latest!.id));
		if (!first.ok) throw new Error('decide');
		const returning = { assessmentId: p.detail.latest!.id, afterDecisionId: '', decision: 'returned' as const, comments: 'Needs a beam stop.', reviewBy: '', controls: [] };
		expect(await reviews.decide(secondOfficer, p.pathId, returning)).toMatchObject({ ok: false, status: 409 });
		expect((await reviews.history(p.pathId)).map((d) => d.decision)).toEqual(['cleared']);
		expect((await reviews.decide(secondOfficer, p.pathId, { ...returning, afterDecisionId: first.decisionId })).ok).toBe(true);
		expect((await reviews.history(p.pathId)).map((d) => d.decision)).toEqual(['returned', 'cleared']);
	});

	it('a decision cannot be altered after the fact, only superseded', async () => {
		const p = await flaggedPath();
		const r = await reviews.decide(officer, p.pathId, clearance(p.detail.latest!.id));
		if (!r.ok) throw new Error('decide');
		const code = (q: Promise<unknown>) => q.then(() => 'allowed', (e: { cause?: { code?: string } }) => e.cause?.code);
		expect(await code(db.execute(sql`UPDATE review_decision SET decision = 'returned' WHERE id = ${r.decisionId}`))).toBe('42501');
		expect(await code(db.execute(sql`DELETE FROM review_decision WHERE id = ${r.decisionId}`))).toBe('42501');
		expect(await code(db.execute(sql`UPDATE required_control SET min_od = 1 WHERE decision_id = ${r.decisionId}`))).toBe('42501');
		const h = await reviews.history(p.pathId);
		expect(h[0].controls.map((c) => [c.kind, c.minOd])).toContainEqual(['eyewear', '5']);
	});
});
