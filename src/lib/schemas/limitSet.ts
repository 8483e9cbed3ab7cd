// Beamwarden's limit-set file: a whole limit library as JSON, to keep, move between installations,
// or review outside the app. Each row has exactly the fields of the limit form (values typed with
// their units, as the officer enters them) and passes the same rules; the JSON Schema published in
// static/formats is generated from these schemas (scripts/limit-set-schema.ts), never written by hand.
import { z } from 'zod';
import { limitFields, limitRules } from './limits';

export const LIMIT_SET_FORMAT = 'beamwarden-limit-set';
export const LIMIT_SET_VERSION = 1;
/** Where the JSON Schema of version 1 is served (a static file). */
export const LIMIT_SET_SCHEMA_PATH = '/formats/limit-set-v1.schema.json';
/** Far above any real library (a few dozen rows), small enough to check in one request. */
export const MAX_LIMIT_SET_BYTES = 2 * 1024 * 1024;
export const MAX_LIMIT_SET_ROWS = 2000;

/** One limit of the set: the limit form's fields; `id` names the limit it came from, when exported. */
export const limitSetRowSchema = limitFields
	.omit({ version: true })
	.extend({ id: z.uuid('The id must be a limit id (a UUID), or left out for a new limit.').optional() })
	.strict()
	.superRefine(limitRules);

export type LimitSetRow = z.output<typeof limitSetRowSchema>;

const header = {
	$schema: z.string().max(500).optional(),
	format: z.literal(LIMIT_SET_FORMAT),
	version: z.literal(LIMIT_SET_VERSION),
	exportedAt: z.iso.datetime({ offset: true })
};

/** The whole file. */
export const limitSetSchema = z
	.object({ ...header, limits: z.array(limitSetRowSchema).max(MAX_LIMIT_SET_ROWS) })
	.strict()
	.meta({
		title: 'Beamwarden limit set, version 1',
		description:
			'Exposure limits as entered by the laser safety officer from the local code. Quantities are text with a unit (e.g. "700 nm", "18 J/m²", "1.5 mrad"); empty text means "not given". Values come from the local code, never from Beamwarden.'
	});

export type LimitSet = z.output<typeof limitSetSchema>;

/** The file with its rows left unread: each row is then checked on its own, so a report can name every bad row. */
export const limitSetEnvelopeSchema = z.object({ ...header, limits: z.array(z.unknown()).max(MAX_LIMIT_SET_ROWS, `At most ${MAX_LIMIT_SET_ROWS} limits in one file.`) }).strict();

/** The JSON Schema (draft 2020-12) of the file, from the zod schemas above. */
export function limitSetJsonSchema(): Record<string, unknown> {
	return { $id: LIMIT_SET_SCHEMA_PATH, ...z.toJSONSchema(limitSetSchema, { io: 'input', target: 'draft-2020-12' }) };
}
