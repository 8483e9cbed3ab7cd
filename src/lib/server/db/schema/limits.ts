// Exposure limits as the laser safety officer enters them from the local code. Never built in.
// A limit keeps every version: an assessment names the versions it used, so a later edit makes it stale.
import { boolean, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { beamPath, tissueEnum, verdictEnum } from './register';

import { limitImportStates, limitQuantities, pulseBases, wavelengthFactorKinds } from '../../../enums';
import type { LimitSetRow } from '../../../schemas/limitSet';

export const limitQuantityEnum = pgEnum('limit_quantity', limitQuantities);
export const wavelengthFactorKindEnum = pgEnum('wavelength_factor_kind', wavelengthFactorKinds);
export const pulseBasisEnum = pgEnum('pulse_basis', pulseBases);
export const limitImportStateEnum = pgEnum('limit_import_state', limitImportStates);

export const exposureLimit = pgTable('exposure_limit', {
	id: uuid('id').primaryKey().defaultRandom(),
	currentVersion: integer('current_version').notNull().default(1),
	retired: boolean('retired').notNull().default(false),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export const exposureLimitVersion = pgTable(
	'exposure_limit_version',
	{
		limitId: uuid('limit_id').notNull().references(() => exposureLimit.id),
		version: integer('version').notNull(),
		label: text('label').notNull(),
		tissue: tissueEnum('tissue').notNull(),
		wavelengthMin: numeric('wavelength_min').notNull(),
		wavelengthMax: numeric('wavelength_max').notNull(),
		durationMin: numeric('duration_min').notNull(),
		durationMax: numeric('duration_max').notNull(),
		quantity: limitQuantityEnum('quantity').notNull(),
		k: numeric('k').notNull(),
		n: numeric('n').notNull(),
		/** C(λ): none, a constant, or 10^(slope·(λ − origin)) clamped to [from, to] (the limit's own range when null). */
		wavelengthFactorKind: wavelengthFactorKindEnum('wavelength_factor_kind').notNull().default('none'),
		wavelengthFactorValue: numeric('wavelength_factor_value'),
		wavelengthFactorSlope: numeric('wavelength_factor_slope'),
		wavelengthFactorOrigin: numeric('wavelength_factor_origin'),
		wavelengthFactorFrom: numeric('wavelength_factor_from'),
		wavelengthFactorTo: numeric('wavelength_factor_to'),
		/** C_E(α): (α/α_min)^exponent between α_min and α_max, 1 below, held above; null = every source a point source. */
		extendedAlphaMin: numeric('extended_alpha_min'),
		extendedAlphaMax: numeric('extended_alpha_max'),
		extendedExponent: numeric('extended_exponent'),
		/** Limiting aperture a·tᵇ: a is limiting_aperture, b this exponent (0 = constant). */
		limitingAperture: numeric('limiting_aperture').notNull(),
		limitingApertureExponent: numeric('limiting_aperture_exponent').notNull().default('0'),
		/** Pulses closer together than T_i count as one (single-pulse limits of repetitive lines). */
		pulseGroupingTime: numeric('pulse_grouping_time'),
		pulseBasis: pulseBasisEnum('pulse_basis').notNull(),
		pulseTrainExponent: numeric('pulse_train_exponent'),
		/** The officer's statement that the code applies no pulse-train correction to this single-pulse limit. */
		noTrainCorrection: boolean('no_train_correction').notNull().default(false),
		citation: text('citation').notNull(),
		/** Demonstration values, to be replaced by the local code's. */
		demonstration: boolean('demonstration').notNull().default(false),
		validFrom: timestamp('valid_from', { withTimezone: true, mode: 'date' }),
		validUntil: timestamp('valid_until', { withTimezone: true, mode: 'date' }),
		/** How many beam paths this version made stale when it was saved. */
		staleMarked: integer('stale_marked').notNull().default(0),
		createdBy: text('created_by').references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.limitId, t.version] }), index('limit_version_tissue_idx').on(t.tissue)]
);

/** An assessment snapshot: what the engine said about a path, from which inputs and limit versions. */
export const assessment = pgTable(
	'assessment',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		pathId: uuid('path_id').notNull().references(() => beamPath.id),
		pathVersion: integer('path_version').notNull(),
		engineVersion: text('engine_version').notNull(),
		inputs: jsonb('inputs').notNull(),
		result: jsonb('result').notNull(),
		verdict: verdictEnum('verdict').notNull(),
		worstRatio: numeric('worst_ratio'),
		requiredOd: numeric('required_od'),
		/** [{ id, version }] of every limit the engine was given. */
		limitVersions: jsonb('limit_versions').$type<{ id: string; version: string }[]>().notNull(),
		/** Why the snapshot was taken: 'save' by a person, 'reassess' after a limit changed. */
		cause: text('cause').notNull().default('save'),
		stale: boolean('stale').notNull().default(false),
		staleReason: text('stale_reason'),
		createdBy: text('created_by').references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('assessment_path_idx').on(t.pathId, t.createdAt), index('assessment_stale_idx').on(t.stale)]
);

/**
 * A limit-set file that passed every check, kept as a draft until the officer publishes it (creating
 * and revising limits in one transaction) or discards it. Rows as read from the file (form values).
 */
export const limitImport = pgTable(
	'limit_import',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		state: limitImportStateEnum('state').notNull().default('draft'),
		fileName: text('file_name').notNull(),
		rows: jsonb('rows').$type<LimitSetRow[]>().notNull(),
		/** What publishing did: limits created, revised, left as they were, and paths made stale. */
		outcome: jsonb('outcome').$type<{ created: number; revised: number; unchanged: number; staleMarked: number }>(),
		createdBy: text('created_by').references(() => user.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		decidedBy: text('decided_by').references(() => user.id),
		decidedAt: timestamp('decided_at', { withTimezone: true })
	},
	(t) => [index('limit_import_state_idx').on(t.state, t.createdAt)]
);

export type LimitImport = typeof limitImport.$inferSelect;
export type ExposureLimit = typeof exposureLimit.$inferSelect;
export type ExposureLimitVersion = typeof exposureLimitVersion.$inferSelect;
export type Assessment = typeof assessment.$inferSelect;
