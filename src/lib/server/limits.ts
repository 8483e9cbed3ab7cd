// The limit library. A limit is never edited in place: a revision is a new version, and every
// beam path whose wavelength the old or the new version covers becomes stale in the same transaction.
import { and, asc, desc, eq, or, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { nudge, queues } from '$lib/server/jobs/queues';
import { changedMeanwhile, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { engineProblems } from '$lib/server/limitChecks';
import { isUuid } from '$lib/server/db/ids';
import { limitToSI, type LimitForm } from '$lib/schemas/limits';

export type LimitRow = table.ExposureLimitVersion;

/**
 * The limit library's lock. Every snapshot transaction (a save, a re-evaluation) reads the library
 * under the shared lock; a change to the library (new limit, revision, withdrawal) takes it
 * exclusively before marking paths stale. So a snapshot is either taken wholly before a change
 * (and then marked stale by it) or wholly after it (with the new limits): never from the old
 * library while the change's stale flags pass it by.
 */
const LIMIT_LIBRARY_LOCK = 7_241_011;
export async function lockLimitLibrary(tx: Tx, mode: 'read' | 'change'): Promise<void> {
	await tx.execute(mode === 'read' ? sql`SELECT pg_advisory_xact_lock_shared(${LIMIT_LIBRARY_LOCK})` : sql`SELECT pg_advisory_xact_lock(${LIMIT_LIBRARY_LOCK})`);
}

/** The current version of every limit in force today (not retired, within its validity dates). */
export async function currentLimits(ex: Tx | typeof db = db, at = new Date()): Promise<LimitRow[]> {
	const iso = at.toISOString();
	const rows = await ex
		.select({ v: table.exposureLimitVersion })
		.from(table.exposureLimit)
		.innerJoin(
			table.exposureLimitVersion,
			and(eq(table.exposureLimitVersion.limitId, table.exposureLimit.id), eq(table.exposureLimitVersion.version, table.exposureLimit.currentVersion))
		)
		.where(
			and(
				eq(table.exposureLimit.retired, false),
				sql`(${table.exposureLimitVersion.validFrom} IS NULL OR ${table.exposureLimitVersion.validFrom} <= ${iso}::timestamptz)`,
				// Valid until a day means through that whole (UTC) day.
				sql`(${table.exposureLimitVersion.validUntil} IS NULL OR ${table.exposureLimitVersion.validUntil} + interval '1 day' > ${iso}::timestamptz)`
			)
		);
	return rows.map((r) => r.v);
}

export type LimitSummary = table.ExposureLimitVersion & { retired: boolean };

export async function list(ex: Tx | typeof db = db): Promise<LimitSummary[]> {
	const rows = await ex
		.select({ v: table.exposureLimitVersion, retired: table.exposureLimit.retired })
		.from(table.exposureLimit)
		.innerJoin(
			table.exposureLimitVersion,
			and(eq(table.exposureLimitVersion.limitId, table.exposureLimit.id), eq(table.exposureLimitVersion.version, table.exposureLimit.currentVersion))
		)
		.orderBy(asc(table.exposureLimit.retired), asc(table.exposureLimitVersion.tissue), asc(table.exposureLimitVersion.wavelengthMin), asc(table.exposureLimitVersion.durationMin));
	return rows.map((r) => ({ ...r.v, retired: r.retired }));
}

export async function find(limitId: string) {
	if (!isUuid(limitId)) return notFound('limit');
	const [head] = await db.select().from(table.exposureLimit).where(eq(table.exposureLimit.id, limitId));
	if (!head) return notFound('limit');
	const versions = await db.select().from(table.exposureLimitVersion).where(eq(table.exposureLimitVersion.limitId, limitId)).orderBy(desc(table.exposureLimitVersion.version));
	return { ok: true as const, limit: { ...head, current: versions.find((v) => v.version === head.currentVersion)!, versions } };
}

/** Mark stale every assessed, live path whose line (or tunable range) meets one of these wavelength ranges. */
async function markStale(tx: Tx, ranges: { min: string; max: string }[], reason: string): Promise<number> {
	const overlaps = ranges.map((r) => sql`(l.wavelength <= ${r.max}::numeric AND coalesce(l.wavelength_max, l.wavelength) >= ${r.min}::numeric)`);
	const marked = await tx.execute<{ id: string }>(sql`
		UPDATE beam_path bp SET stale = true
		WHERE NOT bp.retired AND bp.verdict IS NOT NULL
			AND EXISTS (SELECT 1 FROM path_line pl JOIN emission_line l ON l.id = pl.line_id WHERE pl.path_id = bp.id AND (${sql.join(overlaps, sql` OR `)}))
		RETURNING bp.id`);
	if (marked.length)
		await tx.execute(sql`
			UPDATE assessment a SET stale = true, stale_reason = ${reason}
			WHERE a.id IN (SELECT DISTINCT ON (path_id) id FROM assessment WHERE path_id IN ${sql`(${sql.join(marked.map((m) => sql`${m.id}::uuid`), sql`, `)})`} ORDER BY path_id, created_at DESC)`);
	return marked.length;
}

export type LimitValues = ReturnType<typeof limitToSI>;

/** The form in SI, checked with the hazard engine's own rules: a limit the engine cannot use is never saved. */
function checkedLimit(form: LimitForm): { ok: true; values: LimitValues } | Failure {
	const problems = engineProblems(form);
	if (problems.length) return fieldsNeedAttention(Object.fromEntries(problems.map((p) => [p.field, p.reason])));
	return { ok: true, values: limitToSI(form) };
}

/** The limit versions an assessment used, as recorded in its result. */
export async function versions(used: { id: string; version: string | number }[]): Promise<table.ExposureLimitVersion[]> {
	if (!used.length) return [];
	return db
		.select()
		.from(table.exposureLimitVersion)
		.where(or(...used.map((u) => and(eq(table.exposureLimitVersion.limitId, u.id), eq(table.exposureLimitVersion.version, Number(u.version))))));
}

export async function create(actorId: string, form: LimitForm): Promise<{ ok: true; id: string; staleMarked: number } | Failure> {
	const checked = checkedLimit(form);
	if (!checked.ok) return checked;
	const out = await db.transaction(async (tx) => {
		await lockLimitLibrary(tx, 'change');
		return { ok: true, ...(await createIn(tx, actorId, checked.values)) } as const;
	});
	if (out.staleMarked) await nudge(queues.reassessPaths);
	return out;
}

/** A new limit inside the caller's transaction, which holds the library lock; values already checked. */
export async function createIn(tx: Tx, actorId: string, values: LimitValues): Promise<{ id: string; staleMarked: number }> {
	const [head] = await tx.insert(table.exposureLimit).values({}).returning();
	const staleMarked = await markStale(tx, [{ min: values.wavelengthMin, max: values.wavelengthMax }], `New limit “${values.label}”`);
	const [v] = await tx.insert(table.exposureLimitVersion).values({ limitId: head.id, version: 1, ...values, staleMarked, createdBy: actorId }).returning();
	await audit.record(tx, { actorId, action: 'limit.create', entity: 'exposure_limit', entityId: head.id, after: v });
	return { id: head.id, staleMarked };
}

/** A new version; `form.version` must be the version the officer was looking at. */
export async function revise(actorId: string, limitId: string, form: LimitForm): Promise<{ ok: true; version: number; staleMarked: number } | Failure> {
	if (!isUuid(limitId)) return notFound('limit');
	const checked = checkedLimit(form);
	if (!checked.ok) return checked;
	const out = await db.transaction(async (tx) => {
		await lockLimitLibrary(tx, 'change');
		return reviseIn(tx, actorId, limitId, form.version, checked.values);
	});
	if (out.ok && out.staleMarked) await nudge(queues.reassessPaths);
	return out;
}

/**
 * A new version inside the caller's transaction, which holds the library lock; values already
 * checked. Every path the old or the new version covers becomes stale, as for any edit.
 */
export async function reviseIn(tx: Tx, actorId: string, limitId: string, seenVersion: number, values: LimitValues): Promise<{ ok: true; version: number; staleMarked: number } | Failure> {
	const found = await tx.select().from(table.exposureLimit).where(eq(table.exposureLimit.id, limitId)).for('update');
	if (!found.length) return notFound('limit');
	const head = found[0];
	if (head.currentVersion !== seenVersion) return changedMeanwhile('limit');
	const [old] = await tx
		.select()
		.from(table.exposureLimitVersion)
		.where(and(eq(table.exposureLimitVersion.limitId, limitId), eq(table.exposureLimitVersion.version, head.currentVersion)));
	const version = head.currentVersion + 1;
	const staleMarked = await markStale(
		tx,
		[
			{ min: old.wavelengthMin, max: old.wavelengthMax },
			{ min: values.wavelengthMin, max: values.wavelengthMax }
		],
		`Limit “${values.label}” revised to version ${version}`
	);
	const [v] = await tx.insert(table.exposureLimitVersion).values({ limitId, version, ...values, staleMarked, createdBy: actorId }).returning();
	await tx.update(table.exposureLimit).set({ currentVersion: version, retired: false }).where(eq(table.exposureLimit.id, limitId));
	await audit.record(tx, { actorId, action: 'limit.revise', entity: 'exposure_limit', entityId: limitId, before: old, after: v });
	return { ok: true, version, staleMarked } as const;
}

export async function retire(actorId: string, limitId: string, version: number): Promise<{ ok: true; staleMarked: number } | Failure> {
	if (!isUuid(limitId)) return notFound('limit');
	const out = await db.transaction(async (tx) => {
		await lockLimitLibrary(tx, 'change');
		const found = await tx.select().from(table.exposureLimit).where(eq(table.exposureLimit.id, limitId)).for('update');
		if (!found.length) return notFound('limit');
		if (found[0].currentVersion !== version || found[0].retired) return changedMeanwhile('limit');
		const [current] = await tx
			.select()
			.from(table.exposureLimitVersion)
			.where(and(eq(table.exposureLimitVersion.limitId, limitId), eq(table.exposureLimitVersion.version, version)));
		await tx.update(table.exposureLimit).set({ retired: true }).where(eq(table.exposureLimit.id, limitId));
		const staleMarked = await markStale(tx, [{ min: current.wavelengthMin, max: current.wavelengthMax }], `Limit “${current.label}” withdrawn`);
		await audit.record(tx, { actorId, action: 'limit.retire', entity: 'exposure_limit', entityId: limitId, before: { retired: false }, after: { retired: true, staleMarked } });
		return { ok: true, staleMarked } as const;
	});
	if (out.ok && out.staleMarked) await nudge(queues.reassessPaths);
	return out;
}
