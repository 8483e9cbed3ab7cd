// Reviews of flagged beam paths and their required controls.
// Decisions and their controls are immutable: the app's role may insert and read them, never
// update or delete them; a new decision supersedes an old one.
import { index, numeric, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { beamPath } from './register';
import { assessment } from './limits';
import { controlKinds, decisionKinds } from '../../../enums';

export const decisionKindEnum = pgEnum('decision_kind', decisionKinds);
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

export type ReviewDecision = typeof reviewDecision.$inferSelect;
export type RequiredControl = typeof requiredControl.$inferSelect;
