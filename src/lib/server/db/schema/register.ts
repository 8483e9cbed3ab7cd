// The register: laser controlled areas, lasers, emission lines, beam paths, path elements,
// points of concern. Physical inputs are stored in SI units as PostgreSQL numeric (strings in TS).
import { sql } from 'drizzle-orm';
import { boolean, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { lab } from './labs';

const created = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
const updated = () => timestamp('updated_at', { withTimezone: true }).notNull().defaultNow();
const si = (name: string) => numeric(name);

// The lists themselves are written once, in src/lib/enums.ts (relative import: drizzle-kit has no $lib).
import { beamDefinitions, beamProfiles, elementKinds, emissionModes, laserClasses, laserStatuses, pointKinds, reviewStates, tissues, verdicts } from '../../../enums';

export const laserClassEnum = pgEnum('laser_class', laserClasses);
export const laserStatusEnum = pgEnum('laser_status', laserStatuses);
export const emissionModeEnum = pgEnum('emission_mode', emissionModes);
export const beamDefinitionEnum = pgEnum('beam_definition', beamDefinitions);
export const beamProfileEnum = pgEnum('beam_profile', beamProfiles);
export const elementKindEnum = pgEnum('element_kind', elementKinds);
export const tissueEnum = pgEnum('tissue', tissues);
export const pointKindEnum = pgEnum('point_kind', pointKinds);
export const verdictEnum = pgEnum('verdict', verdicts);

/** A laser controlled area: where lasers stand and what is inspected. */
export const area = pgTable(
	'area',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		labId: uuid('lab_id').notNull().references(() => lab.id),
		name: text('name').notNull(),
		building: text('building').notNull().default(''),
		room: text('room').notNull().default(''),
		responsibleId: text('responsible_id').references(() => user.id),
		interlockNotes: text('interlock_notes').notNull().default(''),
		signageNotes: text('signage_notes').notNull().default(''),
		/** Months between inspections of this area. */
		inspectionIntervalMonths: integer('inspection_interval_months').notNull().default(12),
		inspectorId: text('inspector_id').references(() => user.id),
		version: integer('version').notNull().default(1),
		createdAt: created(),
		updatedAt: updated()
	},
	(t) => [index('area_lab_idx').on(t.labId)]
);

export const laser = pgTable(
	'laser',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		labId: uuid('lab_id').notNull().references(() => lab.id),
		areaId: uuid('area_id').references(() => area.id),
		maker: text('maker').notNull(),
		model: text('model').notNull(),
		serial: text('serial').notNull().default(''),
		laserClass: laserClassEnum('laser_class').notNull(),
		status: laserStatusEnum('status').notNull().default('active'),
		ownerId: text('owner_id').references(() => user.id),
		notes: text('notes').notNull().default(''),
		/** Shortest and longest wavelength of its lines, m: kept for the wavelength-band filter. */
		wavelengthMin: si('wavelength_min'),
		wavelengthMax: si('wavelength_max'),
		version: integer('version').notNull().default(1),
		createdAt: created(),
		updatedAt: updated()
	},
	(t) => [
		index('laser_lab_status_idx').on(t.labId, t.status),
		index('laser_class_idx').on(t.laserClass),
		index('laser_wavelength_idx').on(t.wavelengthMin, t.wavelengthMax),
		index('laser_updated_idx').on(t.updatedAt),
		// the register's default order (lasers.inventory): the first page is read off the index
		index('laser_model_idx').on(t.model, t.id),
		index('laser_search_idx').using('gin', sql`(${t.maker} || ' ' || ${t.model} || ' ' || ${t.serial}) gin_trgm_ops`)
	]
);

export const emissionLine = pgTable(
	'emission_line',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		laserId: uuid('laser_id').notNull().references(() => laser.id),
		label: text('label').notNull().default(''),
		/** Lines of a laser with the same group name are emitted together (a harmonic and its fundamental); '' = on its own. */
		emissionGroup: text('emission_group').notNull().default(''),
		mode: emissionModeEnum('mode').notNull(),
		/** λ, m; for a tunable line the assessment uses this value and wavelengthMax bounds the range. */
		wavelength: si('wavelength').notNull(),
		wavelengthMax: si('wavelength_max'),
		power: si('power'),
		pulseEnergy: si('pulse_energy'),
		pulseDuration: si('pulse_duration'),
		repetitionRate: si('repetition_rate'),
		/** Gaussian (diameter and divergence by their definitions) or flat-top (by the full width). */
		beamProfile: beamProfileEnum('beam_profile').notNull().default('gaussian'),
		beamDiameter: si('beam_diameter').notNull(),
		beamDiameterDefinition: beamDefinitionEnum('beam_diameter_definition').notNull(),
		divergence: si('divergence').notNull(),
		divergenceDefinition: beamDefinitionEnum('divergence_definition').notNull(),
		beamQuality: si('beam_quality'),
		/** Peak ÷ average irradiance of the measured profile (≥ 1); null for an ideal profile. */
		hotSpotFactor: si('hot_spot_factor'),
		version: integer('version').notNull().default(1),
		createdAt: created(),
		updatedAt: updated()
	},
	(t) => [index('emission_line_laser_idx').on(t.laserId)]
);

export const beamPath = pgTable(
	'beam_path',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		laserId: uuid('laser_id').notNull().references(() => laser.id),
		name: text('name').notNull(),
		purpose: text('purpose').notNull().default(''),
		/** Why the path carries only some of the lines emitted together (required then). */
		lineChoiceReason: text('line_choice_reason').notNull().default(''),
		/** Exposure duration for the NOHD, s (e.g. 0.25 s aversion response for visible beams). */
		nohdExposureDuration: si('nohd_exposure_duration'),
		/** Verdict of the latest assessment snapshot, null before the first save. */
		verdict: verdictEnum('verdict'),
		/** True while the latest snapshot exceeds a limit (or cannot be shown as safe) and no review cleared it. */
		flagged: boolean('flagged').notNull().default(false),
		/** Some accessible point lacks an input: saved as work in progress, not reviewable until complete. */
		draft: boolean('draft').notNull().default(false),
		/** The latest snapshot no longer reflects the path, its line or the limits it used. */
		stale: boolean('stale').notNull().default(false),
		retired: boolean('retired').notNull().default(false),
		/** Where the path stands with the officer: derived from its snapshots and decisions, kept here for the queue. */
		reviewState: text('review_state', { enum: reviewStates }).notNull().default('not_needed'),
		/** When it waits for review: since when (the queue is oldest first). */
		awaitingSince: timestamp('awaiting_since', { withTimezone: true }),
		/** The snapshot of the latest clearance, if any: the diff is shown against it. */
		clearedAssessmentId: uuid('cleared_assessment_id'),
		createdBy: text('created_by').references(() => user.id),
		updatedBy: text('updated_by').references(() => user.id),
		version: integer('version').notNull().default(1),
		createdAt: created(),
		updatedAt: updated()
	},
	(t) => [
		index('beam_path_laser_idx').on(t.laserId),
		index('beam_path_flagged_idx').on(t.flagged, t.stale),
		index('beam_path_review_idx').on(t.reviewState, t.awaitingSince),
		// the review desk's order (reviews.queue): a page is read off the index, oldest first
		index('beam_path_review_queue_idx').on(t.reviewState, sql`coalesce(${t.awaitingSince}, ${t.updatedAt})`, t.id)
	]
);

/** The emission lines a beam path carries (all lines emitted together, or a subset with a reason). */
export const pathLine = pgTable(
	'path_line',
	{
		pathId: uuid('path_id')
			.notNull()
			.references(() => beamPath.id, { onDelete: 'cascade' }),
		lineId: uuid('line_id')
			.notNull()
			.references(() => emissionLine.id),
		/** Order of the lines in the path (the order of the laser's lines). */
		sequence: integer('sequence').notNull()
	},
	(t) => [primaryKey({ columns: [t.pathId, t.lineId] }), index('path_line_line_idx').on(t.lineId)]
);

export const pathElement = pgTable(
	'path_element',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		pathId: uuid('path_id').notNull().references(() => beamPath.id, { onDelete: 'cascade' }),
		sequence: integer('sequence').notNull(),
		kind: elementKindEnum('kind').notNull(),
		label: text('label').notNull().default(''),
		length: si('length'),
		transmission: si('transmission'),
		reflectance: si('reflectance'),
		magnification: si('magnification'),
		focalLength: si('focal_length'),
		coreDiameter: si('core_diameter'),
		numericalAperture: si('numerical_aperture'),
		couplingTransmission: si('coupling_transmission'),
		/** Transmission (or reflectance) per wavelength band: [{ wavelengthMin, wavelengthMax, transmission }], SI decimal strings; null = one value for all lines. */
		bands: jsonb('bands').$type<{ wavelengthMin: string; wavelengthMax: string; transmission: string }[]>()
	},
	(t) => [uniqueIndex('path_element_order_idx').on(t.pathId, t.sequence)]
);

export const pointOfConcern = pgTable(
	'point_of_concern',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		pathId: uuid('path_id').notNull().references(() => beamPath.id, { onDelete: 'cascade' }),
		sequence: integer('sequence').notNull(),
		label: text('label').notNull(),
		kind: pointKindEnum('kind').notNull(),
		tissue: tissueEnum('tissue').notNull(),
		position: si('position').notNull(),
		exposureDuration: si('exposure_duration'),
		reflectance: si('reflectance'),
		viewingAngle: si('viewing_angle'),
		viewingDistance: si('viewing_distance')
	},
	(t) => [uniqueIndex('point_of_concern_order_idx').on(t.pathId, t.sequence)]
);

export type Area = typeof area.$inferSelect;
export type Laser = typeof laser.$inferSelect;
export type EmissionLine = typeof emissionLine.$inferSelect;
export type BeamPath = typeof beamPath.$inferSelect;
export type PathElement = typeof pathElement.$inferSelect;
export type PathLine = typeof pathLine.$inferSelect;
export type PointOfConcern = typeof pointOfConcern.$inferSelect;
