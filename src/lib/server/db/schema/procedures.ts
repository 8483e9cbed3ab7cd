// Standard operating and alignment procedures, their versions and the sign-offs of the people who
// use them. A procedure is worked on as one draft at a time; approval copies the draft into an
// approved version, which the app's database role may only insert and read (as sign-offs): the text
// a person signed can never change under their signature. "Superseded" is derived: an approved
// version with a later approved version of the same procedure.
import { sql } from 'drizzle-orm';
import { boolean, check, date, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { lab } from './labs';
import { area, beamPath, laser } from './register';
import { document } from './documents';
import { procedureKinds } from '../../../schemas/procedures';

export { procedureKinds };
export const procedureKindEnum = pgEnum('procedure_kind', procedureKinds);
export const draftStates = ['draft', 'submitted'] as const;

/** A procedure belongs to one laser or to one laser controlled area. */
export const procedure = pgTable(
	'procedure',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		/** The lab of its laser or area, kept here so every list is scoped by one column. */
		labId: uuid('lab_id')
			.notNull()
			.references(() => lab.id),
		laserId: uuid('laser_id').references(() => laser.id),
		areaId: uuid('area_id').references(() => area.id),
		kind: procedureKindEnum('kind').notNull(),
		title: text('title').notNull(),
		/** Who keeps it current (the drafter, unless handed on). */
		ownerId: text('owner_id')
			.notNull()
			.references(() => user.id),
		/** Set when a covered beam path went back to review: the text may no longer match the set-up. */
		reviewNeeded: boolean('review_needed').notNull().default(false),
		reviewNeededReason: text('review_needed_reason').notNull().default(''),
		reviewNeededSince: timestamp('review_needed_since', { withTimezone: true }),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('procedure_lab_idx').on(t.labId),
		index('procedure_laser_idx').on(t.laserId),
		index('procedure_area_idx').on(t.areaId),
		check('procedure_one_target', sql`(${t.laserId} IS NULL) <> (${t.areaId} IS NULL)`)
	]
);

/** The beam paths a procedure covers: a change that reopens their review marks it to be reviewed. */
export const procedurePath = pgTable(
	'procedure_path',
	{
		procedureId: uuid('procedure_id')
			.notNull()
			.references(() => procedure.id),
		pathId: uuid('path_id')
			.notNull()
			.references(() => beamPath.id)
	},
	(t) => [primaryKey({ columns: [t.procedureId, t.pathId] }), index('procedure_path_path_idx').on(t.pathId)]
);

/** The working copy of the next version: at most one per procedure, deleted once approved. */
export const procedureDraft = pgTable(
	'procedure_draft',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		procedureId: uuid('procedure_id')
			.notNull()
			.references(() => procedure.id),
		/** Formatted text as Markdown; rendered and sanitised on the server whenever it is shown. */
		body: text('body').notNull().default(''),
		/** An uploaded PDF (document row of entity 'procedure'). */
		documentId: uuid('document_id').references(() => document.id),
		changeNote: text('change_note').notNull().default(''),
		state: text('state', { enum: draftStates }).notNull().default('draft'),
		submittedBy: text('submitted_by').references(() => user.id),
		submittedAt: timestamp('submitted_at', { withTimezone: true }),
		/** The officer's words when a submitted draft was sent back. */
		returnedComment: text('returned_comment').notNull().default(''),
		createdBy: text('created_by')
			.notNull()
			.references(() => user.id),
		updatedBy: text('updated_by')
			.notNull()
			.references(() => user.id),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('procedure_draft_one_idx').on(t.procedureId)]
);

/** Append-only for the app: an approved version is never edited or deleted. */
export const procedureVersion = pgTable(
	'procedure_version',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		procedureId: uuid('procedure_id')
			.notNull()
			.references(() => procedure.id),
		/** 1, 2, 3 … within the procedure. */
		number: integer('number').notNull(),
		body: text('body').notNull(),
		documentId: uuid('document_id').references(() => document.id),
		/** SHA-256 of the PDF as approved, so a changed file would show. */
		documentSha256: text('document_sha256'),
		changeNote: text('change_note').notNull().default(''),
		/** Who wrote the draft (created or last changed it); none of them may approve it. */
		draftedBy: text('drafted_by')
			.notNull()
			.references(() => user.id),
		submittedBy: text('submitted_by').references(() => user.id),
		submittedAt: timestamp('submitted_at', { withTimezone: true }),
		approvedBy: text('approved_by')
			.notNull()
			.references(() => user.id),
		approvedAt: timestamp('approved_at', { withTimezone: true }).notNull().defaultNow(),
		reviewBy: date('review_by', { mode: 'string' }).notNull(),
		approvalComment: text('approval_comment').notNull().default('')
	},
	(t) => [uniqueIndex('procedure_version_number_idx').on(t.procedureId, t.number), index('procedure_version_review_idx').on(t.reviewBy)]
);

/** "I have read and understood": append-only; a yearly renewal is a new row. */
export const procedureSignoff = pgTable(
	'procedure_signoff',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		versionId: uuid('version_id')
			.notNull()
			.references(() => procedureVersion.id),
		procedureId: uuid('procedure_id')
			.notNull()
			.references(() => procedure.id),
		userId: text('user_id')
			.notNull()
			.references(() => user.id),
		signedAt: timestamp('signed_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('procedure_signoff_person_idx').on(t.userId, t.procedureId), index('procedure_signoff_version_idx').on(t.versionId)]
);

/** Settings of the laser safety programme: one row (id 'programme'); absent means the defaults. */
export const programmeSetting = pgTable('programme_setting', {
	id: text('id').primaryKey(),
	/** A sign-off older than this lapses. */
	signoffIntervalMonths: integer('signoff_interval_months').notNull().default(12),
	version: integer('version').notNull().default(1),
	updatedBy: text('updated_by').references(() => user.id),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});

export type Procedure = typeof procedure.$inferSelect;
export type ProcedureDraft = typeof procedureDraft.$inferSelect;
export type ProcedureVersion = typeof procedureVersion.$inferSelect;
export type ProcedureSignoff = typeof procedureSignoff.$inferSelect;
