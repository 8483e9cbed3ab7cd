// Uploaded files (photos, SOPs, certificates), kept in PostgreSQL with the record they belong to.
import { customType, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

/** Uploaded files (photos, SOPs, certificates), kept in PostgreSQL with the record they belong to. */
export const document = pgTable(
	'document',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		entity: text('entity').notNull(),
		entityId: text('entity_id').notNull(),
		fileName: text('file_name').notNull(),
		mediaType: text('media_type').notNull(),
		size: integer('size').notNull(),
		sha256: text('sha256').notNull(),
		width: integer('width'),
		height: integer('height'),
		data: bytea('data').notNull(),
		uploadedBy: text('uploaded_by').references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('document_entity_idx').on(t.entity, t.entityId)]
);

export type DocumentRow = typeof document.$inferSelect;
