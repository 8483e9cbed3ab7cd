// Authorisations to operate a laser or to work in a laser controlled area, and dated visits.
// Whether an authorisation holds today is never stored: it is derived from the officer's decision
// and its conditions (training current, procedures signed, expiry) each time it is read. What is
// stored is what people decided, and, for the audit and the once-only mail, each lapse the daily
// run noticed (append-only for the app).
import { sql } from 'drizzle-orm';
import { check, date, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { lab } from './labs';
import { area, laser } from './register';
import { procedure } from './procedures';
import { visitorKinds } from '../../../schemas/authorisations';

export const authorisationDecisions = ['requested', 'granted', 'refused', 'withdrawn'] as const;

export const authorisation = pgTable(
	'authorisation',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id),
		labId: uuid('lab_id')
			.notNull()
			.references(() => lab.id),
		laserId: uuid('laser_id').references(() => laser.id),
		areaId: uuid('area_id').references(() => area.id),
		decision: text('decision', { enum: authorisationDecisions }).notNull(),
		requestNote: text('request_note').notNull().default(''),
		requestedBy: text('requested_by')
			.notNull()
			.references(() => user.id),
		requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
		decidedBy: text('decided_by').references(() => user.id),
		decidedAt: timestamp('decided_at', { withTimezone: true }),
		/** The officer's reason for a refusal or a withdrawal, or a note with the grant. */
		decisionReason: text('decision_reason').notNull().default(''),
		/** Last day it may hold; null: no end date of its own. */
		expiresOn: date('expires_on', { mode: 'string' }),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('authorisation_user_idx').on(t.userId),
		index('authorisation_laser_idx').on(t.laserId),
		index('authorisation_area_idx').on(t.areaId),
		index('authorisation_lab_idx').on(t.labId, t.decision),
		// One open request or grant per person and laser, and per person and area.
		uniqueIndex('authorisation_open_laser_idx').on(t.userId, t.laserId).where(sql`${t.decision} IN ('requested', 'granted') AND ${t.laserId} IS NOT NULL`),
		uniqueIndex('authorisation_open_area_idx').on(t.userId, t.areaId).where(sql`${t.decision} IN ('requested', 'granted') AND ${t.areaId} IS NOT NULL`),
		check('authorisation_one_target', sql`(${t.laserId} IS NULL) <> (${t.areaId} IS NULL)`)
	]
);

/** What must hold for a grant to be active: a training topic current, or a procedure signed. */
export const authorisationCondition = pgTable(
	'authorisation_condition',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		authorisationId: uuid('authorisation_id')
			.notNull()
			.references(() => authorisation.id),
		/** The latest record of this topic (any case) must be current. */
		trainingTopic: text('training_topic'),
		/** The current approved version must be signed, and the sign-off not lapsed. */
		procedureId: uuid('procedure_id').references(() => procedure.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('authorisation_condition_auth_idx').on(t.authorisationId), check('authorisation_condition_one', sql`(${t.trainingTopic} IS NULL) <> (${t.procedureId} IS NULL)`)]
);

/** A lapse the daily run noticed, once per cause: the audit row and the mail hang on it. Append-only. */
export const authorisationLapse = pgTable(
	'authorisation_lapse',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		authorisationId: uuid('authorisation_id')
			.notNull()
			.references(() => authorisation.id),
		/** Which condition failed, e.g. 'expiry', 'training:laser safety induction:2027-01-10'. */
		cause: text('cause').notNull(),
		/** First day it no longer held. */
		since: date('since', { mode: 'string' }).notNull(),
		reason: text('reason').notNull(),
		noticedAt: timestamp('noticed_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('authorisation_lapse_cause_idx').on(t.authorisationId, t.cause)]
);

/** A visitor or contractor in a laser controlled area on given days, escorted and briefed. */
export const visit = pgTable(
	'visit',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		labId: uuid('lab_id')
			.notNull()
			.references(() => lab.id),
		areaId: uuid('area_id')
			.notNull()
			.references(() => area.id),
		visitorName: text('visitor_name').notNull(),
		organisation: text('organisation').notNull().default(''),
		kind: text('kind', { enum: visitorKinds }).notNull(),
		startsOn: date('starts_on', { mode: 'string' }).notNull(),
		endsOn: date('ends_on', { mode: 'string' }).notNull(),
		escortName: text('escort_name').notNull(),
		briefing: text('briefing').notNull(),
		recordedBy: text('recorded_by')
			.notNull()
			.references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('visit_area_idx').on(t.areaId, t.startsOn)]
);

export type Authorisation = typeof authorisation.$inferSelect;
export type AuthorisationCondition = typeof authorisationCondition.$inferSelect;
export type AuthorisationLapse = typeof authorisationLapse.$inferSelect;
export type Visit = typeof visit.$inferSelect;
