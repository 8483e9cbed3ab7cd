// Limit sets out and in. Out: every limit in force as one file (limitSetFormat.ts). In: a file that passed every check is kept as a draft; the officer sees which
// rows are new, changed or unchanged against the library, then publishes (one transaction: each
// change through the ordinary create/revise path, so paths go stale exactly as for an edit by hand)
// or discards it. Publishing never withdraws a limit the file leaves out.
import { createHash } from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { nudge, queues } from '$lib/server/jobs/queues';
import * as limits from '$lib/server/limits';
import { lockLimitLibrary } from '$lib/server/limits';
import { isUuid } from '$lib/server/db/ids';
import { failure, notFound, type Failure } from '$lib/server/http/failure';
import { limitFieldNames, limitToSI } from '$lib/schemas/limits';
import type { LimitSetRow } from '$lib/schemas/limitSet';
import { changedFields, limitSetDocument } from './limitSetFormat';

export type RowPlan = {
	row: number;
	label: string;
	status: 'new' | 'changed' | 'unchanged';
	limitId: string | null;
	/** The version the row would replace. */
	currentVersion: number | null;
	/** Names of the fields that differ (changed rows). */
	changes: string[];
	/** The matched limit was withdrawn; publishing brings it back. */
	restores: boolean;
};
export type ImportPlan = { rows: RowPlan[]; counts: Record<RowPlan['status'], number>; untouched: number; stamp: string };

/** Every limit in force, as a limit-set file (withdrawn limits stay out). */
export async function document(at = new Date()) {
	const library = await limits.list();
	return limitSetDocument(
		library.filter((l) => !l.retired).map((l) => ({ limitId: l.limitId, stored: l })),
		at
	);
}

/** Keep a checked file as a draft. */
export async function stage(actorId: string, fileName: string, rows: LimitSetRow[]): Promise<{ ok: true; id: string }> {
	return db.transaction(async (tx) => {
		const [draft] = await tx.insert(table.limitImport).values({ fileName, rows, createdBy: actorId }).returning({ id: table.limitImport.id });
		await audit.record(tx, { actorId, action: 'limit_import.stage', entity: 'limit_import', entityId: draft.id, after: { fileName, rows: rows.length } });
		return { ok: true, id: draft.id } as const;
	});
}

export async function listDrafts() {
	return db
		.select({ id: table.limitImport.id, fileName: table.limitImport.fileName, createdAt: table.limitImport.createdAt, creator: table.user.name })
		.from(table.limitImport)
		.leftJoin(table.user, eq(table.user.id, table.limitImport.createdBy))
		.where(eq(table.limitImport.state, 'draft'))
		.orderBy(desc(table.limitImport.createdAt))
		.limit(50);
}

/** A draft (or a decided import) with its rows compared against the library as it is now. */
export async function find(importId: string) {
	if (!isUuid(importId)) return notFound('limit-set import');
	const [found] = await db.select().from(table.limitImport).where(eq(table.limitImport.id, importId));
	if (!found) return notFound('limit-set import');
	return { ok: true as const, limitImport: { ...found, plan: await plan(db, found.id, found.rows) } };
}

/**
 * Each row against the library: by the limit id the file names, else by a label that exactly one
 * limit in force carries; otherwise the row is a new limit. The stamp changes whenever the library or
 * the draft does, so a publish of what the officer reviewed can be told from a publish of something else.
 */
async function plan(ex: Tx | typeof db, importId: string, rows: LimitSetRow[]): Promise<ImportPlan> {
	const library = await limits.list(ex);
	const byId = new Map(library.map((l) => [l.limitId, l]));
	const byLabel = new Map<string, (typeof library)[number] | null>();
	for (const l of library.filter((l) => !l.retired)) byLabel.set(l.label, byLabel.has(l.label) ? null : l);
	const claimed = new Set<string>();
	const planned: RowPlan[] = rows.map((row, i) => {
		let match = row.id ? byId.get(row.id) : undefined;
		if (!match && !row.id) match = byLabel.get(row.label) ?? undefined;
		if (match && claimed.has(match.limitId)) match = undefined;
		const base = { row: i + 1, label: row.label, changes: [] as string[], restores: false };
		if (!match) return { ...base, status: 'new', limitId: null, currentVersion: null };
		claimed.add(match.limitId);
		const changes = changedFields(limitToSI(row), match).map((f) => limitFieldNames[f as keyof typeof limitFieldNames] ?? f);
		const restores = match.retired;
		if (restores) changes.push('withdrawn: brought back');
		return { ...base, status: changes.length ? 'changed' : 'unchanged', limitId: match.limitId, currentVersion: match.version, changes, restores };
	});
	const counts = { new: 0, changed: 0, unchanged: 0 };
	for (const p of planned) counts[p.status]++;
	const state = library.map((l) => `${l.limitId}:${l.version}:${l.retired}`).sort();
	const stamp = createHash('sha256').update(JSON.stringify([importId, state])).digest('hex').slice(0, 32);
	return { rows: planned, counts, untouched: library.filter((l) => !l.retired && !claimed.has(l.limitId)).length, stamp };
}

export type PublishOutcome = { created: number; revised: number; unchanged: number; staleMarked: number };

const reviewAgain = () =>
	failure(409, 'The limit library changed after this import was compared with it. Nothing was published; review the rows again, then publish.');
const decided = () => failure(409, 'This import has already been published or discarded.');

/** Publish a draft as reviewed (`stamp` from its plan): every new and changed row, in one transaction. */
export async function publish(actorId: string, importId: string, stamp: string): Promise<({ ok: true } & PublishOutcome) | Failure> {
	if (!isUuid(importId)) return notFound('import');
	const out = await db.transaction(async (tx): Promise<({ ok: true } & PublishOutcome) | Failure> => {
		await lockLimitLibrary(tx, 'change');
		const [draft] = await tx.select().from(table.limitImport).where(eq(table.limitImport.id, importId)).for('update');
		if (!draft) return notFound('import');
		if (draft.state !== 'draft') return decided();
		const current = await plan(tx, draft.id, draft.rows);
		if (current.stamp !== stamp) return reviewAgain();
		const outcome: PublishOutcome = { created: 0, revised: 0, unchanged: current.counts.unchanged, staleMarked: 0 };
		for (const p of current.rows) {
			const values = limitToSI(draft.rows[p.row - 1]);
			if (p.status === 'new') {
				outcome.staleMarked += (await limits.createIn(tx, actorId, values)).staleMarked;
				outcome.created++;
			} else if (p.status === 'changed') {
				const revised = await limits.reviseIn(tx, actorId, p.limitId!, p.currentVersion!, values);
				// Cannot happen under the library lock with a matching stamp; refuse rather than publish half.
				if (!revised.ok) throw new Error(`limit import ${importId}: row ${p.row} refused at publish: ${revised.message}`);
				outcome.staleMarked += revised.staleMarked;
				outcome.revised++;
			}
		}
		await tx.update(table.limitImport).set({ state: 'published', outcome, decidedBy: actorId, decidedAt: new Date() }).where(eq(table.limitImport.id, importId));
		await audit.record(tx, { actorId, action: 'limit_import.publish', entity: 'limit_import', entityId: importId, before: { state: 'draft' }, after: { state: 'published', ...outcome } });
		return { ok: true, ...outcome };
	});
	if (out.ok && out.staleMarked) await nudge(queues.reassessPaths);
	return out;
}

export async function discard(actorId: string, importId: string): Promise<{ ok: true } | Failure> {
	if (!isUuid(importId)) return notFound('import');
	return db.transaction(async (tx) => {
		const [draft] = await tx.select({ state: table.limitImport.state }).from(table.limitImport).where(eq(table.limitImport.id, importId)).for('update');
		if (!draft) return notFound('import');
		if (draft.state !== 'draft') return decided();
		await tx
			.update(table.limitImport)
			.set({ state: 'discarded', decidedBy: actorId, decidedAt: new Date() })
			.where(and(eq(table.limitImport.id, importId), eq(table.limitImport.state, 'draft')));
		await audit.record(tx, { actorId, action: 'limit_import.discard', entity: 'limit_import', entityId: importId, before: { state: 'draft' }, after: { state: 'discarded' } });
		return { ok: true } as const;
	});
}
