// When each scheduled job last finished, kept in our own table so a restart can tell a missed run.
import { jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

export const jobRun = pgTable('job_run', {
	/** The pg-boss queue name. */
	queue: text('queue').primaryKey(),
	lastFinishedAt: timestamp('last_finished_at', { withTimezone: true }).notNull(),
	/** The handler's counts, for the admin page. */
	lastResult: jsonb('last_result').notNull().default({})
});

export type JobRun = typeof jobRun.$inferSelect;
