import { and, asc, eq, inArray, isNull } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { burnVerification, hashPassword, passwordProblem, verifyPassword } from '$lib/server/auth/password';
import * as device from '$lib/server/auth/device';
import * as throttle from '$lib/server/auth/throttle';
import type { NewUserInput, UpdateUserInput } from '$lib/schemas/users';
import { changedMeanwhile, failure, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';

export type UserSummary = {
	id: string;
	name: string;
	email: string;
	role: table.Role;
	disabled: boolean;
	version: number;
	labIds: string[];
};


const summaryColumns = {
	id: table.user.id,
	name: table.user.name,
	email: table.user.email,
	role: table.user.role,
	disabled: table.user.disabled,
	version: table.user.version
};

export async function list(): Promise<UserSummary[]> {
	const [people, memberships] = await Promise.all([
		db.select(summaryColumns).from(table.user).orderBy(asc(table.user.name)),
		db.select().from(table.labMember)
	]);
	const labsOf = new Map<string, string[]>();
	for (const m of memberships) labsOf.set(m.userId, [...(labsOf.get(m.userId) ?? []), m.labId]);
	return people.map((p) => ({ ...p, labIds: labsOf.get(p.id) ?? [] }));
}

export async function find(userId: string): Promise<{ ok: true; person: UserSummary } | Failure> {
	const [person] = await db.select(summaryColumns).from(table.user).where(eq(table.user.id, userId));
	if (!person) return notFound('person');
	const memberships = await db.select().from(table.labMember).where(eq(table.labMember.userId, userId));
	return { ok: true, person: { ...person, labIds: memberships.map((m) => m.labId) } };
}

async function unknownLabs(labIds: string[]): Promise<string[]> {
	if (labIds.length === 0) return [];
	const found = await db.select({ id: table.lab.id }).from(table.lab).where(inArray(table.lab.id, labIds));
	const known = new Set(found.map((l) => l.id));
	return labIds.filter((id) => !known.has(id));
}

export async function create(actorId: string | null, input: NewUserInput): Promise<{ ok: true; id: string } | Failure> {
	const problem = passwordProblem(input.password, [input.name, input.email.split('@')[0]]);
	if (problem) return fieldsNeedAttention({ password: problem });
	if ((await unknownLabs(input.labIds)).length)
		return fieldsNeedAttention({ labIds: 'Unknown lab.' });
	const passwordHash = await hashPassword(input.password);
	return db.transaction(async (tx) => {
		const inserted = await tx
			.insert(table.user)
			.values({ name: input.name, email: input.email, role: input.role, passwordHash })
			.onConflictDoNothing({ target: table.user.email })
			.returning({ id: table.user.id });
		if (inserted.length === 0)
			return failure(409, 'Some fields need attention.', { email: 'Someone already uses this e-mail address.' });
		const id = inserted[0].id;
		if (input.labIds.length) await tx.insert(table.labMember).values(input.labIds.map((labId) => ({ labId, userId: id })));
		await audit.record(tx, {
			actorId,
			action: 'user.create',
			entity: 'user',
			entityId: id,
			after: { name: input.name, email: input.email, role: input.role, labIds: input.labIds }
		});
		return { ok: true, id } as const;
	});
}

/** Role, labs and disabled flag, guarded by the row's version. A change of role or a disable ends the person's sessions. */
export async function update(actorId: string, userId: string, input: UpdateUserInput): Promise<{ ok: true } | Failure> {
	if ((await unknownLabs(input.labIds)).length)
		return fieldsNeedAttention({ labIds: 'Unknown lab.' });
	if (actorId === userId && (input.disabled || input.role !== 'admin'))
		return failure(400, 'You cannot disable yourself or remove your own administrator role.');
	return db.transaction(async (tx) => {
		// The active administrators are locked first, always in the same order, so that two admins
		// demoting each other at once are serialised and the second sees that none would remain.
		const admins = await tx
			.select({ id: table.user.id })
			.from(table.user)
			.where(and(eq(table.user.role, 'admin'), eq(table.user.disabled, false)))
			.orderBy(asc(table.user.id))
			.for('update');
		const [before] = await tx.select(summaryColumns).from(table.user).where(eq(table.user.id, userId)).for('update');
		if (!before) return notFound('user');
		const removesAdmin = admins.some((a) => a.id === userId) && (input.role !== 'admin' || input.disabled);
		if (removesAdmin && admins.length <= 1)
			return failure(409, 'This is the last active administrator: make someone else an administrator first.');
		const updated = await tx
			.update(table.user)
			.set({ role: input.role, disabled: input.disabled, version: before.version + 1, updatedAt: new Date() })
			.where(and(eq(table.user.id, userId), eq(table.user.version, input.version)))
			.returning({ id: table.user.id });
		if (updated.length === 0)
			return changedMeanwhile('user');
		const oldLabs = (await tx.select().from(table.labMember).where(eq(table.labMember.userId, userId))).map((m) => m.labId);
		await tx.delete(table.labMember).where(eq(table.labMember.userId, userId));
		if (input.labIds.length) await tx.insert(table.labMember).values(input.labIds.map((labId) => ({ labId, userId })));
		if (before.role !== input.role || input.disabled) await tx.delete(table.session).where(eq(table.session.userId, userId));
		await audit.record(tx, {
			actorId,
			action: 'user.update',
			entity: 'user',
			entityId: userId,
			before: { role: before.role, disabled: before.disabled, labIds: oldLabs },
			after: { role: input.role, disabled: input.disabled, labIds: input.labIds }
		});
		return { ok: true } as const;
	});
}

export type SignInOutcome = { ok: true; userId: string; deviceToken: string } | { ok: false; reason: 'invalid' } | { ok: false; reason: 'throttled'; retryAfter: number };

/**
 * The same answer for an unknown account, a wrong password and a disabled account. `deviceToken` is
 * the browser's device cookie, if any: when it was issued for this account, only this browser's own
 * failures can throttle it (auth/throttle.ts). A success hands back a fresh device token to keep.
 */
export async function authenticate(emailInput: string, password: string, address: string, deviceToken?: string): Promise<SignInOutcome> {
	const email = emailInput.trim().toLowerCase();
	const attempt: throttle.Attempt = { email, address, device: await device.verify(deviceToken, email) };
	const wait = await throttle.lockedFor(attempt);
	if (wait > 0) return { ok: false, reason: 'throttled', retryAfter: wait };
	const [person] = await db
		.select({ id: table.user.id, passwordHash: table.user.passwordHash, disabled: table.user.disabled })
		.from(table.user)
		.where(eq(table.user.email, email));
	const valid = person ? await verifyPassword(person.passwordHash, password) : (await burnVerification(password), false);
	if (!person || !valid || person.disabled) {
		await throttle.recordFailure(attempt);
		return { ok: false, reason: 'invalid' };
	}
	await throttle.recordSuccess(attempt);
	return { ok: true, userId: person.id, deviceToken: await device.issue(email) };
}

export async function setPassword(actorId: string | null, userId: string, password: string): Promise<void> {
	const passwordHash = await hashPassword(password);
	await db.transaction(async (tx) => {
		const now = new Date();
		await tx.update(table.user).set({ passwordHash, updatedAt: now }).where(eq(table.user.id, userId));
		// A new password ends the person's sessions and any reset link still open.
		await tx.update(table.passwordReset).set({ usedAt: now }).where(and(eq(table.passwordReset.userId, userId), isNull(table.passwordReset.usedAt)));
		await tx.delete(table.session).where(eq(table.session.userId, userId));
		await audit.record(tx, { actorId, action: 'user.password', entity: 'user', entityId: userId });
	});
}
