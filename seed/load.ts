// Loads the demo scenario through the app's own data modules, so demo rows are validated,
// assessed and audited like any other. Safe to run twice: rows are keyed by lab code, e-mail,
// area name, laser serial and limit label.
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { db, client } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { hashPassword } from '$lib/server/auth/password';
import { scopeOf } from '$lib/server/auth/scope';
import * as lasers from '$lib/server/lasers';
import * as limits from '$lib/server/limits';
import * as paths from '$lib/server/paths';
import { demoAreas, demoAuthorisations, demoChecklist, demoClearances, demoEyewear, demoInspections, demoLabs, demoLasers, demoLimits, demoProcedures, demoSignoffs, demoTraining, demoUsers, demoVisits } from './demo';
import * as inspections from '$lib/server/inspections';
import * as training from '$lib/server/training';
import { addDays, format } from 'date-fns';
import { createHash } from 'node:crypto';
import { png } from './png';
import * as eyewear from '$lib/server/eyewear';
import * as reviews from '$lib/server/reviews';
import { isCurrentResult } from '$lib/assessmentResult';
import { loadIncidents } from './incidents';
import * as areas from '$lib/server/areas';
import * as authorisations from '$lib/server/authorisations';
import * as procedures from '$lib/server/procedures';

async function loadPeople() {
	const hashes = await Promise.all(demoUsers.map((u) => hashPassword(u.password)));
	return db.transaction(async (tx) => {
		const labs = await tx.insert(table.lab).values([...demoLabs]).onConflictDoNothing({ target: table.lab.code }).returning();
		const labRows = await tx.select().from(table.lab).where(inArray(table.lab.code, demoLabs.map((l) => l.code)));
		const labId = new Map(labRows.map((l) => [l.code, l.id]));
		const people = await tx
			.insert(table.user)
			.values(demoUsers.map((u, i) => ({ email: u.email, name: u.name, role: u.role, passwordHash: hashes[i] })))
			.onConflictDoNothing({ target: table.user.email })
			.returning({ id: table.user.id, email: table.user.email });
		for (const p of people) {
			const u = demoUsers.find((d) => d.email === p.email)!;
			if (u.labs.length) await tx.insert(table.labMember).values(u.labs.map((c) => ({ labId: labId.get(c)!, userId: p.id }))).onConflictDoNothing();
			await tx.insert(table.auditLog).values({ actorId: null, action: 'seed.user', entity: 'user', entityId: p.id, after: { email: u.email, role: u.role } });
		}
		return { labs: labs.length, users: people.length };
	});
}

async function userByEmail(email: string) {
	const [u] = await db.select().from(table.user).where(eq(table.user.email, email));
	return u;
}

async function loadLimits(officerId: string) {
	const existing = new Set((await limits.list()).map((l) => l.label));
	let added = 0;
	for (const l of demoLimits) {
		if (existing.has(l.label)) continue;
		const created = await limits.create(officerId, { ...l, noTrainCorrection: false, demonstration: true, validFrom: '', validUntil: '', version: 0 });
		if (!created.ok) throw new Error(`demo limit “${l.label}”: ${created.message} ${JSON.stringify(created.fields)}`);
		added++;
	}
	return added;
}

async function loadRegister() {
	const labRows = await db.select().from(table.lab);
	const labId = new Map(labRows.map((l) => [l.code, l.id]));
	const areaId = new Map<string, string>();
	for (const a of demoAreas) {
		const [found] = await db.select().from(table.area).where(eq(table.area.name, a.name));
		if (found) {
			areaId.set(a.name, found.id);
			continue;
		}
		const [created] = await db.transaction(async (tx) => {
			const responsible = demoUsers.find((u) => u.role === 'researcher' && u.labs.includes(a.lab));
			const [person] = responsible ? await tx.select({ id: table.user.id }).from(table.user).where(eq(table.user.email, responsible.email)) : [];
			const rows = await tx
				.insert(table.area)
				.values({ labId: labId.get(a.lab)!, name: a.name, building: a.building, room: a.room, interlockNotes: a.interlockNotes, signageNotes: a.signageNotes, responsibleId: person?.id ?? null })
				.returning();
			await tx.insert(table.auditLog).values({ actorId: null, action: 'seed.area', entity: 'area', entityId: rows[0].id, after: rows[0] });
			return rows;
		});
		areaId.set(a.name, created.id);
	}
	let added = 0;
	for (const d of demoLasers) {
		const [exists] = await db.select({ id: table.laser.id }).from(table.laser).where(eq(table.laser.serial, d.laser.serial));
		if (exists) continue;
		const owner = await userByEmail(d.owner);
		const scope = await scopeOf({ id: owner.id, email: owner.email, name: owner.name, role: owner.role, disabled: false });
		const created = await lasers.create(scope, { ...d.laser, labId: labId.get(d.lab)! });
		if (!created.ok) throw new Error(`demo laser ${d.laser.model}: ${JSON.stringify(created)}`);
		await db.update(table.laser).set({ areaId: areaId.get(d.area)! }).where(eq(table.laser.id, created.id));
		const lineIds = [(await db.select({ id: table.emissionLine.id }).from(table.emissionLine).where(eq(table.emissionLine.laserId, created.id)))[0].id];
		for (const l of d.moreLines ?? []) {
			const more = await lasers.saveLine(scope, created.id, null, l);
			if (!more.ok) throw new Error(`demo line ${l.label}: ${JSON.stringify(more)}`);
			lineIds.push(more.id);
		}
		for (const p of d.paths) {
			const saved = await paths.save(scope, created.id, null, { ...p, lineIds, lineChoiceReason: '', version: 0 });
			if (!saved.ok) throw new Error(`demo path ${p.name}: ${JSON.stringify(saved)}`);
		}
		added++;
	}
	return added;
}

async function loadEyewearAndClearance(officerId: string) {
	const scope = await scopeOf({ id: officerId, email: '', name: '', role: 'officer', disabled: false });
	const labRows = await db.select().from(table.lab);
	const labId = new Map(labRows.map((l) => [l.code, l.id]));
	const existing = new Set((await eyewear.list(scope)).map((e) => e.label));
	for (const { lab, ...e } of demoEyewear) if (!existing.has(e.label)) await eyewear.save(scope, null, { ...e, labId: labId.get(lab)!, version: 0 });
	for (const c of demoClearances) {
		const [path] = await db.select().from(table.beamPath).where(eq(table.beamPath.name, c.path));
		if (!path || path.reviewState !== 'awaiting_review') continue;
		const [latest] = await db.select().from(table.assessment).where(eq(table.assessment.pathId, path.id)).orderBy(desc(table.assessment.createdAt)).limit(1);
		const fromResult = c.eyewearFromResult && isCurrentResult(latest.result) ? reviews.eyewearControls(latest.result) : [];
		const r = await reviews.decide(scope, path.id, { assessmentId: latest.id, afterDecisionId: '', decision: 'cleared', comments: c.comments, reviewBy: '2027-06-30', controls: [...fromResult, ...c.controls] });
		if (!r.ok) throw new Error(`demo clearance ${c.path}: ${JSON.stringify(r)}`);
	}
}

async function loadInspections(officerId: string) {
	const existing = await inspections.templates();
	if (!existing.some((t) => t.name === demoChecklist.name)) await inspections.createTemplate(officerId, demoChecklist.name, demoChecklist.items);
	const [template] = (await inspections.templates()).filter((t) => t.name === demoChecklist.name);
	const day = (offset: number) => format(addDays(new Date(), offset), 'yyyy-MM-dd');
	for (const d of demoInspections) {
		const [area] = await db.select().from(table.area).where(eq(table.area.name, d.area));
		const [any] = await db.select({ id: table.inspection.id }).from(table.inspection).where(eq(table.inspection.areaId, area.id)).limit(1);
		if (any) continue;
		await db.transaction(async (tx) => {
			await tx.update(table.area).set({ inspectionIntervalMonths: d.interval, inspectorId: officerId }).where(eq(table.area.id, area.id));
			if (d.lastDoneDaysAgo !== null) {
				const [past] = await tx
					.insert(table.inspection)
					.values({ areaId: area.id, inspectorId: officerId, dueOn: day(-d.lastDoneDaysAgo), completedOn: day(-d.lastDoneDaysAgo), completedBy: officerId, templateId: template.id })
					.returning();
				await tx.insert(table.inspectionResult).values(template.items.map((i, sequence) => ({ inspectionId: past.id, sequence, itemText: i.text, outcome: 'pass' as const })));
				const photo = png(96, 64, (x, y) => 120 + ((x * 3 + y * 5) % 100));
				await tx.insert(table.document).values({ entity: 'inspection', entityId: past.id, fileName: 'door-sign.png', mediaType: 'image/png', size: photo.length, sha256: createHash('sha256').update(photo).digest('hex'), width: 96, height: 64, data: photo, uploadedBy: officerId });
			}
			const [open] = await tx.insert(table.inspection).values({ areaId: area.id, inspectorId: officerId, dueOn: day(d.dueInDays) }).returning();
			await tx.insert(table.auditLog).values({ actorId: null, action: 'seed.inspection', entity: 'inspection', entityId: open.id, after: open });
		});
	}
}

async function loadTraining(officerId: string) {
	const [any] = await db.select({ id: table.trainingRecord.id }).from(table.trainingRecord).limit(1);
	if (any) return;
	const day = (offset: number) => format(addDays(new Date(), offset), 'yyyy-MM-dd');
	for (const t of demoTraining) {
		const person = await userByEmail(t.person);
		const result = await training.record(officerId, { userId: person.id, topic: t.topic, completedOn: day(-t.completedDaysAgo), expiresOn: t.validDays === null ? '' : day(t.validDays - t.completedDaysAgo), notes: t.notes }, day(0));
		if (!result.ok) throw new Error(`demo training: ${JSON.stringify(result)}`);
	}
}

// ---------------------------------------------------------------------------------------------
// Procedures, sign-offs, authorisations and visits. Drafts, submissions, grants, requests and visits
// go through the data modules; the history behind them (versions approved months ago, sign-offs
// and decisions in the past) is written as it would have been then.

const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000);
const dayFromNow = (offset: number) => format(addDays(new Date(), offset), 'yyyy-MM-dd');
const must = <T extends { ok: boolean }>(what: string, r: T): Extract<T, { ok: true }> => {
	if (!r.ok) throw new Error(`${what}: ${JSON.stringify(r)}`);
	return r as Extract<T, { ok: true }>;
};

async function scopeOfEmail(email: string) {
	const u = await userByEmail(email);
	return { user: u, scope: await scopeOf({ id: u.id, email: u.email, name: u.name, role: u.role, disabled: false }) };
}

async function targetOf(t: { laser?: string; area?: string }) {
	if (t.laser) {
		const [l] = await db.select({ id: table.laser.id }).from(table.laser).where(eq(table.laser.serial, t.laser));
		return `laser:${l.id}`;
	}
	const [a] = await db.select({ id: table.area.id }).from(table.area).where(eq(table.area.name, t.area!));
	return `area:${a.id}`;
}

async function loadProceduresAndAuthorisations() {
	const [any] = await db.select({ id: table.procedure.id }).from(table.procedure).limit(1);
	if (any) return;
	const [helen, ines] = await Promise.all(demoUsers.filter((u) => u.role === 'officer').map((u) => scopeOfEmail(u.email)));
	const procedureIds = new Map<string, string>();
	for (const p of demoProcedures) {
		const owner = await scopeOfEmail(p.owner);
		const pathRows = p.paths.length ? await db.select({ id: table.beamPath.id }).from(table.beamPath).where(inArray(table.beamPath.name, p.paths)) : [];
		const first = p.versions[0]?.body ?? p.draft!.body;
		const { id } = must(`demo procedure ${p.title}`, await procedures.create(owner.scope, { target: await targetOf(p), kind: p.kind, title: p.title, pathIds: pathRows.map((r) => r.id), body: first }));
		procedureIds.set(p.title, id);
		if (p.versions.length)
			await db.transaction(async (tx) => {
				await tx.delete(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
				const rows = await tx
					.insert(table.procedureVersion)
					.values(
						p.versions.map((v, i) => ({
							procedureId: id,
							number: i + 1,
							body: v.body,
							changeNote: v.changeNote,
							draftedBy: owner.user.id,
							submittedBy: owner.user.id,
							submittedAt: daysAgo(v.approvedDaysAgo + 2),
							approvedBy: helen.user.id,
							approvedAt: daysAgo(v.approvedDaysAgo),
							reviewBy: dayFromNow(v.reviewInDays)
						}))
					)
					.returning({ id: table.procedureVersion.id, number: table.procedureVersion.number });
				await tx.insert(table.auditLog).values({ actorId: null, action: 'seed.procedure_versions', entity: 'procedure', entityId: id, after: rows });
			});
		if (p.draft) {
			const [d] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
			must('demo draft', await procedures.saveDraft(owner.scope, id, { body: p.draft.body, changeNote: p.draft.changeNote, version: d?.version ?? 0 }));
			const [saved] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
			if (p.draft.submitted) must('demo submission', await procedures.submit(owner.scope, id, saved.version, { id: owner.user.id, name: owner.user.name }));
		}
		if (p.toReview) await db.update(table.procedure).set({ reviewNeeded: true, reviewNeededReason: p.toReview, reviewNeededSince: daysAgo(2) }).where(eq(table.procedure.id, id));
	}
	for (const s of demoSignoffs) {
		const procedureId = procedureIds.get(s.procedure)!;
		const [v] = await db.select({ id: table.procedureVersion.id }).from(table.procedureVersion).where(and(eq(table.procedureVersion.procedureId, procedureId), eq(table.procedureVersion.number, s.version)));
		const person = await userByEmail(s.person);
		await db.insert(table.procedureSignoff).values({ versionId: v.id, procedureId, userId: person.id, signedAt: daysAgo(s.daysAgo) });
	}
	for (const a of demoAuthorisations) {
		const person = await scopeOfEmail(a.person);
		const officer = person.user.id === helen.user.id ? ines : helen;
		const target = await targetOf(a);
		const conditions = { trainingTopics: a.trainings, procedureIds: a.procedures.map((t) => procedureIds.get(t)!), expiresOn: '' };
		let id: string;
		if (a.state === 'granted' || a.state === 'withdrawn') {
			id = must('demo grant', await authorisations.grant(officer.scope, { userId: person.user.id, target, ...conditions, reason: '' }, dayFromNow(0))).id;
			if (a.state === 'withdrawn') must('demo withdrawal', await authorisations.withdraw(officer.scope, id, a.reason!, 1));
		} else {
			id = must('demo request', await authorisations.request(person.scope, { target, note: a.note ?? '' })).id;
			if (a.state === 'refused') must('demo refusal', await authorisations.decide(officer.scope, id, { decision: 'refused', ...conditions, reason: a.reason!, version: 1 }, dayFromNow(0)));
		}
		// Dated as it happened; a past decision is what makes a later failure a lapse.
		await db
			.update(table.authorisation)
			.set({ requestedAt: daysAgo(a.askedDaysAgo), ...(a.decidedDaysAgo !== undefined ? { decidedAt: daysAgo(a.decidedDaysAgo) } : {}) })
			.where(eq(table.authorisation.id, id));
	}
	for (const v of demoVisits) {
		const [area] = await db.select({ id: table.area.id }).from(table.area).where(eq(table.area.name, v.area));
		must('demo visit', await areas.recordVisit(helen.scope, area.id, { visitorName: v.visitorName, organisation: v.organisation, kind: v.kind, startsOn: dayFromNow(v.startsInDays), endsOn: dayFromNow(v.startsInDays + v.days - 1), escortName: v.escort, briefing: v.briefing }));
	}
}

export async function loadDemo(): Promise<{ labs: number; users: number; limits: number; lasers: number }> {
	const people = await loadPeople();
	const officer = await userByEmail(demoUsers.find((u) => u.role === 'officer')!.email);
	const limitCount = await loadLimits(officer.id);
	const laserCount = await loadRegister();
	// Demo paths were saved after the limits: nothing is left stale.
	await paths.reassessStale(1000);
	await loadEyewearAndClearance(officer.id);
	await loadInspections(officer.id);
	await loadTraining(officer.id);
	await loadIncidents(officer.email);
	await loadProceduresAndAuthorisations();
	return { ...people, limits: limitCount, lasers: laserCount };
}

export async function isEmpty(): Promise<boolean> {
	const [{ n }] = await db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM "user"`);
	return n === 0;
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const onlyIfEmpty = process.argv.includes('--if-empty');
	if (!onlyIfEmpty || (await isEmpty())) {
		const added = await loadDemo();
		console.log(`Demo data: ${added.labs} labs, ${added.users} people, ${added.limits} limits, ${added.lasers} lasers added.`);
	} else console.log('Database already holds data: demo data not loaded.');
	await client.end();
}
