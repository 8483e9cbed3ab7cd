// What reaches people: in-app notifications, each person's mail preference, and the e-mail ledger
// that makes every reminder go out exactly once.
import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mailModes } from '../../../enums';
import { user } from './auth';
import { beamPath } from './register';

export const userPreference = pgTable('user_preference', {
	userId: text('user_id')
		.primaryKey()
		.references(() => user.id),
	mailMode: text('mail_mode', { enum: mailModes }).notNull().default('immediate'),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});

export const mailStatuses = ['pending', 'held', 'sending', 'sent', 'failed', 'digested'] as const;

/**
 * The e-mail ledger: one row per (kind, record, due key, step, recipient), ever. A reminder that is
 * computed again finds its row and is not sent twice; the row is our permanent sent-log.
 */
export const mailOutbox = pgTable(
	'mail_outbox',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		kind: text('kind').notNull(),
		recordId: text('record_id').notNull(),
		dueKey: text('due_key').notNull(),
		step: text('step').notNull(),
		recipientId: text('recipient_id').references(() => user.id),
		recipientEmail: text('recipient_email').notNull(),
		subject: text('subject').notNull(),
		textBody: text('text_body').notNull(),
		htmlBody: text('html_body').notNull(),
		/** Why the person gets it, said in the mail. */
		reason: text('reason').notNull(),
		status: text('status', { enum: mailStatuses }).notNull().default('pending'),
		attempts: integer('attempts').notNull().default(0),
		nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
		claimedAt: timestamp('claimed_at', { withTimezone: true }),
		lastError: text('last_error'),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		/** For held rows: the digest mail that carried them. */
		digestId: uuid('digest_id'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('mail_outbox_key_idx').on(t.kind, t.recordId, t.dueKey, t.step, t.recipientEmail),
		index('mail_outbox_pending_idx').on(t.status, t.nextAttemptAt)
	]
);

export const notification = pgTable(
	'notification',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: text('user_id').notNull().references(() => user.id),
		/** 'path.flagged', 'review.cleared', 'review.returned', 'review.replied' */
		kind: text('kind').notNull(),
		pathId: uuid('path_id').references(() => beamPath.id),
		title: text('title').notNull(),
		body: text('body').notNull().default(''),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		readAt: timestamp('read_at', { withTimezone: true })
	},
	(t) => [index('notification_user_idx').on(t.userId, t.createdAt)]
);

export type MailOutbox = typeof mailOutbox.$inferSelect;
export type Notification = typeof notification.$inferSelect;
