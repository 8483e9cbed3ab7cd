// Incidents and near misses: the report, the officer's investigation, linked records, corrective
// actions, the officer-only medical follow-up, and laser suspensions (their own records, never a
// change of the laser's status).
import { sql } from 'drizzle-orm';
import { boolean, check, date, index, integer, pgEnum, pgTable, serial, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { contributingFactors, incidentKinds, incidentStates, medicalAttentionChoices, severityLevels } from '../../../incidentWords';
import { user } from './auth';
import { lab } from './labs';
import { area, beamPath, laser } from './register';
import { eyewear } from './eyewear';

export const incidentKindEnum = pgEnum('incident_kind', incidentKinds);
export const incidentStateEnum = pgEnum('incident_state', incidentStates);
export const severityEnum = pgEnum('incident_severity', severityLevels);
export const medicalAttentionEnum = pgEnum('medical_attention', medicalAttentionChoices);

export const incident = pgTable(
	'incident',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		/** A short number people can say aloud ("incident 12"). */
		number: serial('number').notNull().unique(),
		state: incidentStateEnum('state').notNull().default('draft'),
		/** Null only while a draft. */
		kind: incidentKindEnum('kind'),
		/**
		 * When it happened, on the facility's clock as the reporter entered it (no time zone: it is a
		 * wall-clock reading, not an instant converted by someone's browser). Null only while a draft.
		 */
		occurredAt: timestamp('occurred_at', { withTimezone: false, mode: 'string' }),
		labId: uuid('lab_id').references(() => lab.id),
		areaId: uuid('area_id').references(() => area.id),
		laserId: uuid('laser_id').references(() => laser.id),
		pathId: uuid('path_id').references(() => beamPath.id),
		locationNotes: text('location_notes').notNull().default(''),
		description: text('description').notNull().default(''),
		/** Personal: officers and managers only (and the reporter). */
		peopleInvolved: text('people_involved').notNull().default(''),
		medicalAttention: medicalAttentionEnum('medical_attention').notNull().default('unknown'),
		/** The reporter asked that only officers see who reported. */
		anonymous: boolean('anonymous').notNull().default(false),
		reportedBy: text('reported_by')
			.notNull()
			.references(() => user.id),
		submittedAt: timestamp('submitted_at', { withTimezone: true }),
		severity: severityEnum('severity'),
		causes: text('causes').notNull().default(''),
		factors: text('factors', { enum: contributingFactors }).array().notNull().default(sql`'{}'::text[]`),
		investigatedBy: text('investigated_by').references(() => user.id),
		investigatedAt: timestamp('investigated_at', { withTimezone: true }),
		closedBy: text('closed_by').references(() => user.id),
		closedAt: timestamp('closed_at', { withTimezone: true }),
		closingNote: text('closing_note').notNull().default(''),
		version: integer('version').notNull().default(1),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('incident_state_idx').on(t.state),
		index('incident_lab_idx').on(t.labId),
		index('incident_reporter_idx').on(t.reportedBy),
		index('incident_occurred_idx').on(t.occurredAt),
		check('incident_submitted_complete', sql`${t.state} = 'draft' OR (${t.kind} IS NOT NULL AND ${t.occurredAt} IS NOT NULL AND ${t.labId} IS NOT NULL AND ${t.submittedAt} IS NOT NULL)`)
	]
);

export const incidentLinkKinds = ['path', 'eyewear', 'procedure'] as const;

/** Records the investigation names: beam paths, eyewear, and procedures (by their reference). */
export const incidentLink = pgTable(
	'incident_link',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		incidentId: uuid('incident_id')
			.notNull()
			.references(() => incident.id),
		kind: text('kind', { enum: incidentLinkKinds }).notNull(),
		pathId: uuid('path_id').references(() => beamPath.id),
		eyewearId: uuid('eyewear_id').references(() => eyewear.id),
		/** A procedure's reference (e.g. "SOP MPC-07") until procedures have a register of their own. */
		reference: text('reference')
	},
	(t) => [
		index('incident_link_incident_idx').on(t.incidentId),
		check(
			'incident_link_target',
			sql`(${t.kind} = 'path' AND ${t.pathId} IS NOT NULL) OR (${t.kind} = 'eyewear' AND ${t.eyewearId} IS NOT NULL) OR (${t.kind} = 'procedure' AND ${t.reference} IS NOT NULL)`
		)
	]
);

export const correctiveAction = pgTable(
	'corrective_action',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		incidentId: uuid('incident_id')
			.notNull()
			.references(() => incident.id),
		description: text('description').notNull(),
		ownerId: text('owner_id')
			.notNull()
			.references(() => user.id),
		dueOn: date('due_on', { mode: 'string' }).notNull(),
		createdBy: text('created_by')
			.notNull()
			.references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		/** Closure evidence in words; photos are documents of entity 'corrective_action'. */
		evidence: text('evidence').notNull().default(''),
		closedBy: text('closed_by').references(() => user.id),
		closedAt: timestamp('closed_at', { withTimezone: true }),
		version: integer('version').notNull().default(1)
	},
	(t) => [index('corrective_action_incident_idx').on(t.incidentId), index('corrective_action_open_idx').on(t.closedAt, t.dueOn), index('corrective_action_owner_idx').on(t.ownerId)]
);

/** The medical follow-up of an incident: officers only, never shown to anyone else. */
export const incidentMedical = pgTable('incident_medical', {
	incidentId: uuid('incident_id')
		.primaryKey()
		.references(() => incident.id),
	examinationRequestedOn: date('examination_requested_on', { mode: 'string' }),
	examinationDoneOn: date('examination_done_on', { mode: 'string' }),
	/** One line. */
	outcome: text('outcome').notNull().default(''),
	version: integer('version').notNull().default(1),
	updatedBy: text('updated_by')
		.notNull()
		.references(() => user.id),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});

/**
 * A laser suspended by an officer: while a row has no lifted_at, the laser takes no new clearance.
 * At most one open suspension per laser; lifting keeps the row (who, when, why).
 */
export const laserSuspension = pgTable(
	'laser_suspension',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		laserId: uuid('laser_id')
			.notNull()
			.references(() => laser.id),
		incidentId: uuid('incident_id').references(() => incident.id),
		reason: text('reason').notNull(),
		suspendedBy: text('suspended_by')
			.notNull()
			.references(() => user.id),
		suspendedAt: timestamp('suspended_at', { withTimezone: true }).notNull().defaultNow(),
		liftedBy: text('lifted_by').references(() => user.id),
		liftedAt: timestamp('lifted_at', { withTimezone: true }),
		liftReason: text('lift_reason')
	},
	(t) => [uniqueIndex('laser_suspension_open_idx').on(t.laserId).where(sql`${t.liftedAt} IS NULL`), index('laser_suspension_incident_idx').on(t.incidentId)]
);

export type Incident = typeof incident.$inferSelect;
export type IncidentLink = typeof incidentLink.$inferSelect;
export type CorrectiveAction = typeof correctiveAction.$inferSelect;
export type IncidentMedical = typeof incidentMedical.$inferSelect;
export type LaserSuspension = typeof laserSuspension.$inferSelect;
