// Inspections of laser controlled areas, their checklists and findings.
import { sql } from 'drizzle-orm';
import { boolean, date, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { area } from './register';
import { checkOutcomes } from '../../../enums';

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

export type Inspection = typeof inspection.$inferSelect;
export type Finding = typeof finding.$inferSelect;
