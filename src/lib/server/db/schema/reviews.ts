// Reviews of flagged beam paths, their required controls, eyewear, and in-app notifications.
// Decisions and their controls are immutable: the app's role may insert and read them, never
// update or delete them; a new decision supersedes an old one.
import { boolean, index, integer, numeric, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { lab } from './labs';
import { beamPath } from './register';
import { assessment } from './limits';

export const reviewStates = ['not_needed', 'awaiting_review', 'cleared', 'returned'] as const;
export const decisionKinds = ['cleared', 'returned'] as const;
export const decisionKindEnum = pgEnum('decision_kind', decisionKinds);
export const controlKinds = ['eyewear', 'enclosure', 'interlock', 'signage', 'beam_stop', 'procedure', 'training', 'other'] as const;
export const controlKindEnum = pgEnum('control_kind', controlKinds);

export const reviewDecision = pgTable(
	'review_decision',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		pathId: uuid('path_id').notNull().references(() => beamPath.id),
		/** The snapshot the officer read and decided on. */
		assessmentId: uuid('assessment_id').notNull().references(() => assessment.id),
		decision: decisionKindEnum('decision').notNull(),
		comments: text('comments').notNull().default(''),
		reviewBy: timestamp('review_by', { withTimezone: true, mode: 'date' }),
		decidedBy: text('decided_by').notNull().references(() => user.id),
		decidedAt: timestamp('decided_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('review_decision_path_idx').on(t.pathId, t.decidedAt)]
);

export const requiredControl = pgTable(
	'required_control',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		decisionId: uuid('decision_id').notNull().references(() => reviewDecision.id),
		kind: controlKindEnum('kind').notNull(),
		/** Eyewear: the minimum optical density at `wavelength` (m), or over `wavelength`–`wavelengthMax`. */
		minOd: numeric('min_od'),
		wavelength: numeric('wavelength'),
		wavelengthMax: numeric('wavelength_max'),
		details: text('details').notNull().default('')
	},
	(t) => [index('required_control_decision_idx').on(t.decisionId)]
);

/** The researcher's answer to a returned review. */
export const reviewReply = pgTable('review_reply', {
	id: uuid('id').primaryKey().defaultRandom(),
	decisionId: uuid('decision_id').notNull().references(() => reviewDecision.id),
	authorId: text('author_id').notNull().references(() => user.id),
	body: text('body').notNull(),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export const eyewearConditions = ['good', 'worn', 'damaged'] as const;
export const eyewearConditionEnum = pgEnum('eyewear_condition', eyewearConditions);

export const eyewear = pgTable(
	'eyewear',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		labId: uuid('lab_id').notNull().references(() => lab.id),
		label: text('label').notNull(),
		location: text('location').notNull().default(''),
		frame: text('frame').notNull().default(''),
		condition: eyewearConditionEnum('condition').notNull().default('good'),
		lastCheckedAt: timestamp('last_checked_at', { withTimezone: true, mode: 'date' }),
		retired: boolean('retired').notNull().default(false),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('eyewear_lab_idx').on(t.labId)]
);

/** Optical density over a wavelength band, ends inclusive (m). */
export const eyewearBand = pgTable(
	'eyewear_band',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		eyewearId: uuid('eyewear_id').notNull().references(() => eyewear.id, { onDelete: 'cascade' }),
		wavelengthMin: numeric('wavelength_min').notNull(),
		wavelengthMax: numeric('wavelength_max').notNull(),
		od: numeric('od').notNull()
	},
	(t) => [index('eyewear_band_item_idx').on(t.eyewearId)]
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

export type ReviewDecision = typeof reviewDecision.$inferSelect;
export type RequiredControl = typeof requiredControl.$inferSelect;
export type Eyewear = typeof eyewear.$inferSelect;
export type EyewearBand = typeof eyewearBand.$inferSelect;
export type Notification = typeof notification.$inferSelect;
