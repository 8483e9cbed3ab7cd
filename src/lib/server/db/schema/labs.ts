import { pgTable, primaryKey, text, timestamp, uuid, index } from 'drizzle-orm/pg-core';
import { user } from './auth';

export const lab = pgTable('lab', {
	id: uuid('id').primaryKey().defaultRandom(),
	code: text('code').notNull().unique(),
	name: text('name').notNull(),
	building: text('building').notNull().default(''),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export const labMember = pgTable(
	'lab_member',
	{
		labId: uuid('lab_id')
			.notNull()
			.references(() => lab.id),
		userId: text('user_id')
			.notNull()
			.references(() => user.id)
	},
	(t) => [primaryKey({ columns: [t.labId, t.userId] }), index('lab_member_user_idx').on(t.userId)]
);

export type Lab = typeof lab.$inferSelect;
export type LabMember = typeof labMember.$inferSelect;
