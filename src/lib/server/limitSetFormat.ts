// Writing and reading limit-set files (format: src/lib/schemas/limitSet.ts). Reading checks every
// row with the limit form's schema and then the hazard engine's own rules, and reports every problem
// by row (counted from 1, as a person counts), label and field: one bad row refuses the whole file.
import { UnitDecimal, type QuantityKind } from '$lib/units';
import { limitFieldNames, limitFormValues, type LimitForm, type StoredLimit } from '$lib/schemas/limits';
import {
	LIMIT_SET_FORMAT,
	LIMIT_SET_SCHEMA_PATH,
	LIMIT_SET_VERSION,
	MAX_LIMIT_SET_BYTES,
	limitSetEnvelopeSchema,
	limitSetRowSchema,
	type LimitSet,
	type LimitSetRow
} from '$lib/schemas/limitSet';
import { engineProblems } from './limitChecks';

/** One problem of a file: `row` is null for the file's header. */
export type RowProblem = { row: number | null; label: string; field: string; fieldName: string; message: string };
export type ReadLimitSet = { ok: true; rows: LimitSetRow[] } | { ok: false; status: 400 | 413; message: string; problems: RowProblem[] };

// ------------------------------------------------------------------ writing

/** Fields typed with a unit, and the kind of quantity each holds (k's depends on the row). */
const unitFields = {
	wavelengthMin: 'wavelength',
	wavelengthMax: 'wavelength',
	durationMin: 'time',
	durationMax: 'time',
	wavelengthFactorOrigin: 'wavelength',
	wavelengthFactorFrom: 'wavelength',
	wavelengthFactorTo: 'wavelength',
	extendedAlphaMin: 'angle',
	extendedAlphaMax: 'angle',
	limitingAperture: 'length',
	pulseGroupingTime: 'time'
} as const satisfies Partial<Record<keyof StoredLimit, QuantityKind>>;

const numericFields = [
	...(Object.keys(unitFields) as (keyof typeof unitFields)[]),
	'k',
	'n',
	'wavelengthFactorValue',
	'wavelengthFactorSlope',
	'extendedExponent',
	'limitingApertureExponent',
	'pulseTrainExponent'
] as const;

/**
 * One stored limit as a row of the file: the form's values, each written as entered (asEntered: a
 * readable unit when 12 digits say it exactly, every digit in SI otherwise), so that reading the
 * file back gives the stored value to the last digit.
 */
export function exportRow(limitId: string, stored: StoredLimit): LimitSetRow {
	const { version: _, ...form } = limitFormValues(stored, 0);
	return { id: limitId, ...form };
}

export function limitSetDocument(limits: { limitId: string; stored: StoredLimit }[], exportedAt = new Date()): { $schema: string } & LimitSet {
	return {
		$schema: LIMIT_SET_SCHEMA_PATH,
		format: LIMIT_SET_FORMAT,
		version: LIMIT_SET_VERSION,
		exportedAt: exportedAt.toISOString(),
		limits: limits.map((l) => exportRow(l.limitId, l.stored))
	};
}

/** The stored fields in which two limits differ: numbers compared as exact decimals, dates by the instant. */
export function changedFields(a: StoredLimit, b: StoredLimit): (keyof StoredLimit)[] {
	const numeric = new Set<string>(numericFields);
	const differs = (key: keyof StoredLimit) => {
		const x = a[key];
		const y = b[key];
		if (x === null || y === null) return x !== y;
		if (x instanceof Date || y instanceof Date) return new Date(x as Date).getTime() !== new Date(y as Date).getTime();
		if (numeric.has(key)) return !new UnitDecimal(x as string).eq(y as string);
		return x !== y;
	};
	return (Object.keys(a) as (keyof StoredLimit)[]).filter((k) => k in b && differs(k));
}

// ------------------------------------------------------------------ reading

const fieldName = (field: string) => limitFieldNames[field as keyof typeof limitFieldNames] ?? field;

export function readLimitSet(text: string): ReadLimitSet {
	const refuse = (message: string, problems: RowProblem[] = [], status: 400 | 413 = 400): ReadLimitSet => ({ ok: false, status, message, problems });
	if (Buffer.byteLength(text, 'utf8') > MAX_LIMIT_SET_BYTES) return refuse(`The file is larger than ${MAX_LIMIT_SET_BYTES / 1024 / 1024} MB. Nothing was imported.`, [], 413);
	let data: unknown;
	try {
		data = JSON.parse(text.replace(/^\uFEFF/, ''));
	} catch (e) {
		return refuse(`The file is not valid JSON (${(e as Error).message}). Nothing was imported.`);
	}
	if (!data || typeof data !== 'object' || Array.isArray(data) || (data as { format?: unknown }).format !== LIMIT_SET_FORMAT)
		return refuse(`This is not a Beamwarden limit set: its "format" must be "${LIMIT_SET_FORMAT}". Nothing was imported.`);
	const version = (data as { version?: unknown }).version;
	if (typeof version === 'number' && version > LIMIT_SET_VERSION)
		return refuse(`This limit set is written in version ${version} of the format; this Beamwarden reads version ${LIMIT_SET_VERSION}. Nothing was imported.`);
	const envelope = limitSetEnvelopeSchema.safeParse(data);
	if (!envelope.success) {
		const problems = envelope.error.issues.map((i) => {
			const field = i.code === 'unrecognized_keys' ? i.keys.join(', ') : i.path.map(String).join('.') || '(file)';
			return { row: null, label: '', field, fieldName: field, message: i.message };
		});
		return refuse('The file’s header needs attention. Nothing was imported.', problems);
	}

	const problems: RowProblem[] = [];
	const rows: LimitSetRow[] = [];
	const ids = new Map<string, number>();
	envelope.data.limits.forEach((raw, i) => {
		const row = i + 1;
		const label = raw && typeof raw === 'object' && typeof (raw as { label?: unknown }).label === 'string' ? (raw as { label: string }).label.trim().slice(0, 200) : '';
		const add = (field: string, message: string) => problems.push({ row, label, field, fieldName: fieldName(field), message });
		if (!raw || typeof raw !== 'object' || Array.isArray(raw)) return add('(row)', 'Each limit must be an object of fields.');
		const parsed = limitSetRowSchema.safeParse(raw);
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				if (issue.code === 'unrecognized_keys') for (const key of issue.keys) add(key, 'Not a field of a limit.');
				else add(issue.path.map(String).join('.') || '(row)', issue.message);
			}
			return;
		}
		const checked: Omit<LimitForm, 'version'> = parsed.data;
		const engine = engineProblems(checked);
		for (const p of engine) add(p.field, p.reason);
		if (engine.length) return;
		if (parsed.data.id) {
			const first = ids.get(parsed.data.id);
			if (first !== undefined) return add('id', `Row ${first} has the same id; each limit may appear once.`);
			ids.set(parsed.data.id, row);
		}
		rows.push(parsed.data);
	});
	if (problems.length) {
		const bad = new Set(problems.map((p) => p.row)).size;
		return refuse(`${bad} of ${envelope.data.limits.length} limits need attention. Nothing was imported.`, problems);
	}
	if (rows.length === 0) return refuse('The file holds no limits. Nothing was imported.');
	return { ok: true, rows };
}
