// Laser eyewear in each lab's store, with the optical density it has over each wavelength band.
import { boolean, index, integer, numeric, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { eyewearConditions } from '../../../enums';
import { lab } from './labs';

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

export type Eyewear = typeof eyewear.$inferSelect;
export type EyewearBand = typeof eyewearBand.$inferSelect;
