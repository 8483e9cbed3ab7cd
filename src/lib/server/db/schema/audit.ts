import { bigserial, index, jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/** Append-only: the app's database role has no UPDATE or DELETE on this table. */
export const auditLog = pgTable(
	'audit_log',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
		actorId: text('actor_id'),
		action: text('action').notNull(),
		entity: text('entity').notNull(),
		entityId: text('entity_id').notNull(),
		before: jsonb('before'),
		after: jsonb('after')
	},
	(t) => [index('audit_log_entity_idx').on(t.entity, t.entityId), index('audit_log_at_idx').on(t.at)]
);

export type AuditEntry = typeof auditLog.$inferSelect;
