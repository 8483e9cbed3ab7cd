import type { Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

export type AuditInput = {
	actorId: string | null;
	action: string;
	entity: string;
	entityId: string;
	before?: unknown;
	after?: unknown;
};

/** Write the audit row inside the caller's transaction: the change and its record commit together. */
export async function record(tx: Tx, entry: AuditInput): Promise<void> {
	await tx.insert(table.auditLog).values({
		actorId: entry.actorId,
		action: entry.action,
		entity: entry.entity,
		entityId: entry.entityId,
		before: entry.before ?? null,
		after: entry.after ?? null
	});
}
