// Training records and authorisations. A record is never edited or deleted: a renewal is a new
// record, a record entered in error is withdrawn (with a reason), so the history stays for audits.
import { date, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';

export const trainingRecord = pgTable(
	'training_record',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id),
		/** What was completed: a course, a briefing, an authorisation to work with a given laser. */
		topic: text('topic').notNull(),
		completedOn: date('completed_on', { mode: 'string' }).notNull(),
		/** null: does not expire. */
		expiresOn: date('expires_on', { mode: 'string' }),
		notes: text('notes').notNull().default(''),
		recordedBy: text('recorded_by')
			.notNull()
			.references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
		withdrawnReason: text('withdrawn_reason')
	},
	(t) => [index('training_record_user_idx').on(t.userId), index('training_record_expires_idx').on(t.expiresOn)]
);

export type TrainingRecord = typeof trainingRecord.$inferSelect;
