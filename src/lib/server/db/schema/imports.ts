// Register imports: an uploaded CSV, checked row by row and staged here until the officer imports
// it; the import job writes the staged rows in batches and keeps its progress on the import row.
import { boolean, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';

export const registerImport = pgTable(
	'register_import',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		createdBy: text('created_by')
			.notNull()
			.references(() => user.id),
		fileName: text('file_name').notNull(),
		/** preview → queued → running → done (or failed); a preview may be discarded. */
		state: text('state', { enum: ['preview', 'queued', 'running', 'done', 'failed', 'discarded'] }).notNull().default('preview'),
		/** The officer chose to import the valid rows and leave the others. */
		validOnly: boolean('valid_only').notNull().default(false),
		totalRows: integer('total_rows').notNull(),
		errorRows: integer('error_rows').notNull(),
		/** Lasers the file adds and lasers it changes, as the preview found them. */
		newLasers: integer('new_lasers').notNull().default(0),
		existingLasers: integer('existing_lasers').notNull().default(0),
		/** The file's problems ({ line, column, message }), file-level ones included. */
		problems: jsonb('problems').notNull().default([]),
		processedRows: integer('processed_rows').notNull().default(0),
		lasersCreated: integer('lasers_created').notNull().default(0),
		lasersUpdated: integer('lasers_updated').notNull().default(0),
		linesAdded: integer('lines_added').notNull().default(0),
		linesUpdated: integer('lines_updated').notNull().default(0),
		linesUnchanged: integer('lines_unchanged').notNull().default(0),
		message: text('message').notNull().default(''),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		queuedAt: timestamp('queued_at', { withTimezone: true }),
		finishedAt: timestamp('finished_at', { withTimezone: true })
	},
	(t) => [index('register_import_state_idx').on(t.state, t.queuedAt)]
);

/** One valid row of an import: the laser's fields and the line in SI, as checked at upload. */
export const registerImportRow = pgTable(
	'register_import_row',
	{
		importId: uuid('import_id')
			.notNull()
			.references(() => registerImport.id, { onDelete: 'cascade' }),
		line: integer('line').notNull(),
		/** Rows of one laser (same lab and serial) share it, and are written in one batch. */
		laserKey: text('laser_key').notNull(),
		data: jsonb('data').notNull(),
		done: boolean('done').notNull().default(false)
	},
	(t) => [primaryKey({ columns: [t.importId, t.line] })]
);

export type RegisterImport = typeof registerImport.$inferSelect;
