// Training records and authorisations: officers record them, everyone sees their own, officers and
// managers see everyone's. Records are never edited; a renewal is a new record.
import { aliasedTable, and, asc, desc, eq, isNull } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { failure, fieldsNeedAttention, type Failure } from '$lib/server/http/failure';
import type { RecordTrainingForm, WithdrawTrainingForm } from '$lib/schemas/training';
import { trainingState, type TrainingState } from '$lib/trainingState';

export type TrainingRow = {
	id: string;
	userId: string;
	userName: string;
	topic: string;
	completedOn: string;
	expiresOn: string | null;
	notes: string;
	recordedByName: string;
	withdrawnReason: string | null;
	state: TrainingState;
};

const recorder = aliasedTable(table.user, 'recorder');

/** Every record, or one person's (`userId`); by person, newest first. */
export async function list(today: string, userId?: string): Promise<TrainingRow[]> {
	const t = table.trainingRecord;
	const rows = await db
		.select({
			id: t.id,
			userId: t.userId,
			userName: table.user.name,
			topic: t.topic,
			completedOn: t.completedOn,
			expiresOn: t.expiresOn,
			notes: t.notes,
			recordedByName: recorder.name,
			withdrawnAt: t.withdrawnAt,
			withdrawnReason: t.withdrawnReason
		})
		.from(t)
		.innerJoin(table.user, eq(table.user.id, t.userId))
		.innerJoin(recorder, eq(recorder.id, t.recordedBy))
		.where(userId ? eq(t.userId, userId) : undefined)
		.orderBy(asc(table.user.name), desc(t.completedOn), asc(t.topic));
	// The latest completion of each person's topic (the same rule the reminders apply): earlier ones are renewed.
	const topicKey = (r: { userId: string; topic: string }) => `${r.userId}\u0000${r.topic.toLowerCase()}`;
	const latest = new Map<string, string>();
	for (const r of rows) if (!r.withdrawnAt && (latest.get(topicKey(r)) ?? '') < r.completedOn) latest.set(topicKey(r), r.completedOn);
	return rows.map(({ withdrawnAt, ...r }) => ({ ...r, state: trainingState(r.expiresOn, withdrawnAt !== null, today, r.completedOn < latest.get(topicKey(r))!) }));
}

/** People a record can be made for: every active account. */
export async function people() {
	return db.select({ id: table.user.id, name: table.user.name }).from(table.user).where(eq(table.user.disabled, false)).orderBy(asc(table.user.name));
}

export async function record(actorId: string, form: RecordTrainingForm, today: string): Promise<{ ok: true; id: string } | Failure> {
	if (form.completedOn > today) return fieldsNeedAttention({ completedOn: 'A training cannot be completed in the future.' });
	return db.transaction(async (tx) => {
		const [person] = await tx.select({ id: table.user.id }).from(table.user).where(and(eq(table.user.id, form.userId), eq(table.user.disabled, false)));
		if (!person) return fieldsNeedAttention({ userId: 'Choose an active person.' });
		const [row] = await tx
			.insert(table.trainingRecord)
			.values({ userId: form.userId, topic: form.topic, completedOn: form.completedOn, expiresOn: form.expiresOn || null, notes: form.notes, recordedBy: actorId })
			.returning();
		await audit.record(tx, { actorId, action: 'training.record', entity: 'training_record', entityId: row.id, after: row });
		return { ok: true as const, id: row.id };
	});
}

export async function withdraw(actorId: string, form: WithdrawTrainingForm): Promise<{ ok: true } | Failure> {
	return db.transaction(async (tx) => {
		const t = table.trainingRecord;
		const [row] = await tx
			.update(t)
			.set({ withdrawnAt: new Date(), withdrawnReason: form.reason })
			.where(and(eq(t.id, form.recordId), isNull(t.withdrawnAt)))
			.returning();
		if (!row) {
			const [exists] = await tx.select({ id: t.id }).from(t).where(eq(t.id, form.recordId));
			return exists ? failure(409, 'This record was already withdrawn.') : failure(404, 'No such training record.');
		}
		await audit.record(tx, { actorId, action: 'training.withdraw', entity: 'training_record', entityId: row.id, after: { withdrawnAt: row.withdrawnAt, withdrawnReason: row.withdrawnReason } });
		return { ok: true as const };
	});
}
