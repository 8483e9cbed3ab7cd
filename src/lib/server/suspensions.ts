// Laser suspensions: an officer stops new clearances on a laser after an incident, and lifts the
// suspension later. Each is its own row (who, when, why; who lifted it, when, why) with audit rows;
// the laser's own status is never touched.
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canRead, type Scope } from '$lib/server/auth/scope';
import { failure, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import type { LiftForm, SuspendForm } from '$lib/schemas/incidents';
import type { SuspensionInfo } from '$lib/incidentTypes';
import { can } from '$lib/abilities';

export type ActiveSuspension = SuspensionInfo;

const suspender = alias(table.user, 'suspender');

/** The open suspensions of these lasers (read through `tx` inside a transaction). */
export async function activeFor(laserIds: string[], tx: Tx | typeof db = db): Promise<ActiveSuspension[]> {
	if (laserIds.length === 0) return [];
	const s = table.laserSuspension;
	const rows = await tx
		.select({
			id: s.id,
			laserId: s.laserId,
			maker: table.laser.maker,
			model: table.laser.model,
			incidentId: s.incidentId,
			incidentNumber: table.incident.number,
			reason: s.reason,
			suspendedAt: s.suspendedAt,
			suspendedByName: suspender.name
		})
		.from(s)
		.innerJoin(table.laser, eq(table.laser.id, s.laserId))
		.innerJoin(suspender, eq(suspender.id, s.suspendedBy))
		.leftJoin(table.incident, eq(table.incident.id, s.incidentId))
		.where(and(inArray(s.laserId, laserIds), isNull(s.liftedAt)));
	return rows.map(({ maker, model, suspendedAt, ...r }) => ({ ...r, laserName: `${maker} ${model}`, suspendedAt: suspendedAt.toISOString() }));
}

/**
 * The suspension to show on a page about one laser (its own page, a path of it, its review), if the
 * person may read that laser. Nothing for anyone else: a suspension says nothing of other labs.
 */
export async function forPage(scope: Scope, params: { laserId?: string; pathId?: string }): Promise<ActiveSuspension | null> {
	let laserId: string | null = null;
	let labId: string | null = null;
	if (params.laserId && isUuid(params.laserId)) {
		const [l] = await db.select({ id: table.laser.id, labId: table.laser.labId }).from(table.laser).where(eq(table.laser.id, params.laserId));
		if (l) [laserId, labId] = [l.id, l.labId];
	} else if (params.pathId && isUuid(params.pathId)) {
		const [p] = await db
			.select({ id: table.laser.id, labId: table.laser.labId })
			.from(table.beamPath)
			.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
			.where(eq(table.beamPath.id, params.pathId));
		if (p) [laserId, labId] = [p.id, p.labId];
	}
	if (!laserId || !labId || !canRead(scope, labId)) return null;
	const [active] = await activeFor([laserId]);
	return active ?? null;
}

/** Suspend a laser (officers), optionally from the incident that prompted it. */
export async function suspend(scope: Scope, form: SuspendForm, incidentId: string | null = null): Promise<{ ok: true; id: string } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer suspends a laser.');
	return db.transaction(async (tx) => {
		// The laser row is locked so two officers suspending it at once queue here; the second is told.
		const [l] = await tx.select({ id: table.laser.id, status: table.laser.status }).from(table.laser).where(eq(table.laser.id, form.laserId)).for('update');
		if (!l) return fieldsNeedAttention({ laserId: 'Choose a laser of the register.' });
		if (l.status === 'retired') return fieldsNeedAttention({ laserId: 'This laser is retired; there is nothing to suspend.' });
		const [open] = await tx
			.select({ id: table.laserSuspension.id })
			.from(table.laserSuspension)
			.where(and(eq(table.laserSuspension.laserId, form.laserId), isNull(table.laserSuspension.liftedAt)));
		if (open) return failure(409, 'This laser is already suspended.');
		const [row] = await tx.insert(table.laserSuspension).values({ laserId: form.laserId, incidentId, reason: form.reason, suspendedBy: scope.userId }).returning();
		await audit.record(tx, { actorId: scope.userId, action: 'laser.suspend', entity: 'laser', entityId: form.laserId, after: { suspensionId: row.id, incidentId, reason: form.reason } });
		return { ok: true as const, id: row.id };
	});
}

export async function lift(scope: Scope, form: LiftForm): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer lifts a suspension.');
	return db.transaction(async (tx) => {
		const s = table.laserSuspension;
		const [row] = await tx
			.update(s)
			.set({ liftedAt: new Date(), liftedBy: scope.userId, liftReason: form.reason })
			.where(and(eq(s.id, form.suspensionId), isNull(s.liftedAt)))
			.returning();
		if (!row) {
			const [exists] = await tx.select({ id: s.id }).from(s).where(eq(s.id, form.suspensionId));
			return exists ? failure(409, 'This suspension was already lifted.') : notFound('suspension');
		}
		await audit.record(tx, {
			actorId: scope.userId,
			action: 'laser.lift_suspension',
			entity: 'laser',
			entityId: row.laserId,
			before: { suspensionId: row.id, reason: row.reason },
			after: { liftedAt: row.liftedAt, reason: form.reason }
		});
		return { ok: true as const };
	});
}

/** Every suspension of these lasers, open or lifted, newest first (for the incident page). */
export async function history(laserIds: string[]) {
	if (laserIds.length === 0) return [];
	const s = table.laserSuspension;
	const lifter = alias(table.user, 'lifter');
	const rows = await db
		.select({ s, suspendedByName: suspender.name, liftedByName: lifter.name, maker: table.laser.maker, model: table.laser.model })
		.from(s)
		.innerJoin(table.laser, eq(table.laser.id, s.laserId))
		.innerJoin(suspender, eq(suspender.id, s.suspendedBy))
		.leftJoin(lifter, eq(lifter.id, s.liftedBy))
		.where(inArray(s.laserId, laserIds));
	return rows
		.sort((a, b) => b.s.suspendedAt.getTime() - a.s.suspendedAt.getTime())
		.map((r) => ({
			id: r.s.id,
			laserId: r.s.laserId,
			laserName: `${r.maker} ${r.model}`,
			incidentId: r.s.incidentId,
			reason: r.s.reason,
			suspendedAt: r.s.suspendedAt.toISOString(),
			suspendedByName: r.suspendedByName,
			liftedAt: r.s.liftedAt?.toISOString() ?? null,
			liftedByName: r.liftedByName,
			liftReason: r.s.liftReason
		}));
}

/** Why a clearance is refused while the laser is suspended. */
export function refusal(s: ActiveSuspension): string {
	return `${s.laserName} is suspended since ${s.suspendedAt.slice(0, 10)} (${s.suspendedByName}: ${s.reason}). No new clearance until a laser safety officer lifts the suspension.`;
}
