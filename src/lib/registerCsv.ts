// The CSV layout of the register: one row per emission line, the laser's own fields repeated on
// each of its lines. The import page documents these columns, the template carries them, the
// lines export writes them (so an export can be imported again), and the importer reads them.
import { beamDefinitions, beamProfiles, emissionModes, laserClasses, laserStatuses } from './enums';
import type { StateWord } from './words';

export type RegisterColumn = {
	name: string;
	/** The form field it fills: a laser field, or `line.` + a line field. */
	field: string;
	required: 'always' | 'by mode' | 'no';
	about: string;
	example: string;
	/** The closed list of values, when there is one. */
	values?: readonly string[];
};

export const registerColumns: readonly RegisterColumn[] = [
	{ name: 'lab', field: 'labId', required: 'always', about: 'The lab’s code, as on the register.', example: 'SPX' },
	{ name: 'maker', field: 'maker', required: 'always', about: 'Who made the laser.', example: 'Northlight Optics' },
	{ name: 'model', field: 'model', required: 'always', about: 'The model name.', example: 'Beacon 532' },
	{ name: 'serial', field: 'serial', required: 'always', about: 'The serial number (or a local asset number). Rows with the same lab and serial are one laser; a serial already in that lab updates the laser instead of adding another.', example: 'NB532-0042' },
	{ name: 'class', field: 'laserClass', required: 'no', about: 'The laser class; 4 when empty.', example: '3B', values: laserClasses },
	{ name: 'status', field: 'status', required: 'no', about: 'active when empty.', example: 'active', values: laserStatuses },
	{ name: 'notes', field: 'notes', required: 'no', about: 'Free text, up to 2,000 characters.', example: 'Bench 3, alignment laser.' },
	{ name: 'line_label', field: 'line.label', required: 'no', about: 'A name for the line. A line of an existing laser with the same label (or, without labels, the same position among them) is updated; another is added.', example: '532 nm CW' },
	{ name: 'emission_group', field: 'line.emissionGroup', required: 'no', about: 'Lines of one laser with the same group name are emitted together (a harmonic and its fundamental).', example: '' },
	{ name: 'mode', field: 'line.mode', required: 'no', about: 'The emission mode; continuous when empty.', example: 'continuous', values: emissionModes },
	{ name: 'wavelength', field: 'line.wavelength', required: 'always', about: 'With its unit; a bare number is read in nm.', example: '532 nm' },
	{ name: 'wavelength_max', field: 'line.wavelengthMax', required: 'no', about: 'Upper end of a tunable line.', example: '' },
	{ name: 'power', field: 'line.power', required: 'by mode', about: 'Continuous lines: the output power, with its unit.', example: '50 mW' },
	{ name: 'pulse_energy', field: 'line.pulseEnergy', required: 'by mode', about: 'Pulsed lines: the energy per pulse.', example: '' },
	{ name: 'pulse_duration', field: 'line.pulseDuration', required: 'by mode', about: 'Pulsed lines: the pulse duration.', example: '' },
	{ name: 'repetition_rate', field: 'line.repetitionRate', required: 'by mode', about: 'Repetitively pulsed lines: the pulse rate.', example: '' },
	{ name: 'beam_profile', field: 'line.beamProfile', required: 'no', about: 'gaussian when empty.', example: 'gaussian', values: beamProfiles },
	{ name: 'beam_diameter', field: 'line.beamDiameter', required: 'always', about: 'At the aperture; a bare number is read in mm.', example: '1.5 mm' },
	{ name: 'beam_diameter_definition', field: 'line.beamDiameterDefinition', required: 'no', about: 'How the diameter was measured; 1/e2 when empty.', example: '1/e2', values: beamDefinitions },
	{ name: 'divergence', field: 'line.divergence', required: 'always', about: 'Full angle; a bare number is read in mrad.', example: '1.2 mrad' },
	{ name: 'divergence_definition', field: 'line.divergenceDefinition', required: 'no', about: 'How the divergence was measured; 1/e2 when empty.', example: '1/e2', values: beamDefinitions },
	{ name: 'beam_quality', field: 'line.beamQuality', required: 'no', about: 'M², a plain number.', example: '' },
	{ name: 'hot_spot_factor', field: 'line.hotSpotFactor', required: 'no', about: 'Peak ÷ average irradiance of a measured profile (1 or more), a plain number.', example: '' }
];

export const registerColumnNames = registerColumns.map((c) => c.name);

/** Largest file the import reads, in rows (one per line). */
export const IMPORT_MAX_ROWS = 20_000;
/** Rows written per transaction by the import job. */
export const IMPORT_BATCH_ROWS = 500;

export type ImportState = 'preview' | 'queued' | 'running' | 'done' | 'failed' | 'discarded';

export const importStateWords: Record<ImportState, StateWord> = {
	preview: { word: 'checked, not imported', icon: 'half', tone: 'caution', hint: 'The file was read and checked; nothing is in the register yet.' },
	queued: { word: 'waiting to start', icon: 'clock', tone: 'caution', hint: 'The import job picks it up within a few seconds.' },
	running: { word: 'importing', icon: 'clock', tone: 'caution', hint: 'The rows are being written, a batch at a time.' },
	done: { word: 'imported', icon: 'ok', tone: 'calm', hint: 'Every row to import is in the register.' },
	failed: { word: 'stopped', icon: 'alert', tone: 'alert', hint: 'The import stopped on a fault; the batches written so far are kept.' },
	discarded: { word: 'discarded', icon: 'blank', tone: 'quiet', hint: 'The file was checked and set aside; nothing was imported.' }
};

export type ImportProblem = { line: number; column: string; message: string };

export type ImportProgress = {
	id: string;
	state: ImportState;
	/** Rows the job writes (every row, or the valid ones only). */
	rowsToImport: number;
	processedRows: number;
	lasersCreated: number;
	lasersUpdated: number;
	linesAdded: number;
	linesUpdated: number;
	linesUnchanged: number;
	message: string;
};
