// Inspections of laser controlled areas, their checklists and findings, uploaded documents,
// and the e-mail ledger that makes every reminder go out exactly once.
import { sql } from 'drizzle-orm';
import { boolean, customType, date, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { area } from './register';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

export const checklistTemplate = pgTable('checklist_template', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name').notNull(),
	active: boolean('active').notNull().default(true),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export const checklistItem = pgTable(
	'checklist_item',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		templateId: uuid('template_id').notNull().references(() => checklistTemplate.id),
		sequence: integer('sequence').notNull(),
		text: text('text').notNull(),
		guidance: text('guidance').notNull().default('')
	},
	(t) => [uniqueIndex('checklist_item_order_idx').on(t.templateId, t.sequence)]
);

/** One inspection of an area: scheduled with a due date, done once completed. */
export const inspection = pgTable(
	'inspection',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		areaId: uuid('area_id').notNull().references(() => area.id),
		inspectorId: text('inspector_id').references(() => user.id),
		dueOn: date('due_on', { mode: 'string' }).notNull(),
		completedOn: date('completed_on', { mode: 'string' }),
		completedBy: text('completed_by').references(() => user.id),
		templateId: uuid('template_id').references(() => checklistTemplate.id),
		notes: text('notes').notNull().default(''),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('inspection_due_idx').on(t.dueOn),
		index('inspection_area_idx').on(t.areaId),
		// At most one open (not yet done) inspection per area.
		uniqueIndex('inspection_open_area_idx').on(t.areaId).where(sql`${t.completedOn} IS NULL`)
	]
);

export const checkOutcomes = ['pass', 'fail', 'not_applicable'] as const;
export const checkOutcomeEnum = pgEnum('check_outcome', checkOutcomes);

export const inspectionResult = pgTable(
	'inspection_result',
	{
		inspectionId: uuid('inspection_id').notNull().references(() => inspection.id),
		sequence: integer('sequence').notNull(),
		/** The item's text as it stood when inspected: templates may change later. */
		itemText: text('item_text').notNull(),
		outcome: checkOutcomeEnum('outcome').notNull(),
		notes: text('notes').notNull().default('')
	},
	(t) => [primaryKey({ columns: [t.inspectionId, t.sequence] })]
);

export const finding = pgTable(
	'finding',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		inspectionId: uuid('inspection_id').notNull().references(() => inspection.id),
		description: text('description').notNull(),
		action: text('action').notNull().default(''),
		dueOn: date('due_on', { mode: 'string' }),
		ownerId: text('owner_id').references(() => user.id),
		closedOn: date('closed_on', { mode: 'string' }),
		/** Who closed the finding and what was done about it. */
		closedBy: text('closed_by').references(() => user.id),
		closureNote: text('closure_note').notNull().default(''),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('finding_open_idx').on(t.closedOn, t.dueOn)]
);

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

export const mailModes = ['immediate', 'digest'] as const;

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

export const passwordReset = pgTable('password_reset', {
	tokenHash: text('token_hash').primaryKey(),
	userId: text('user_id')
		.notNull()
		.references(() => user.id),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	usedAt: timestamp('used_at', { withTimezone: true }),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export type Inspection = typeof inspection.$inferSelect;
export type Finding = typeof finding.$inferSelect;
export type MailOutbox = typeof mailOutbox.$inferSelect;
export type DocumentRow = typeof document.$inferSelect;
