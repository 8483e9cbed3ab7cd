// Small factories for test data, written straight through the app's data modules.
import { randomUUID } from 'node:crypto';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as users from '$lib/server/users';
import type { Role } from '$lib/roles';

export const strongPassword = 'correct horse battery staple 7';

export async function makeLab(code = `L${randomUUID().slice(0, 6)}`) {
	const [lab] = await db.insert(table.lab).values({ code, name: `Lab ${code}` }).returning();
	return lab;
}

export async function makeUser(role: Role = 'researcher', labIds: string[] = []) {
	const email = `${role}-${randomUUID().slice(0, 8)}@test.example`;
	const result = await users.create(null, { name: `Test ${role}`, email, role, labIds, password: strongPassword });
	if (!result.ok) throw new Error(`factory failed: ${result.message}`);
	return { id: result.id, email, password: strongPassword, role };
}

import * as lasers from '$lib/server/lasers';
import * as limits from '$lib/server/limits';
import { scopeOf } from '$lib/server/auth/scope';
import type { LimitForm } from '$lib/schemas/limits';
import { blankElement, type NewLaserForm, type PathForm } from '$lib/schemas/register';
import * as dailyRun from '$lib/server/jobs/dailyRun';
import { startJobs } from '$lib/server/jobs/workers';

export async function scopeFor(u: { id: string; email: string; role: Role }) {
	return scopeOf({ id: u.id, email: u.email, name: 'Test', role: u.role, disabled: false });
}

export function laserForm(labId: string, overrides: Partial<NewLaserForm['line']> = {}): NewLaserForm {
	return {
		labId,
		maker: 'Test Optics',
		model: 'Green CW 5',
		serial: `SN-${randomUUID().slice(0, 6)}`,
		laserClass: '4',
		status: 'active',
		notes: '',
		line: {
			label: 'main',
			emissionGroup: '',
			mode: 'continuous',
			wavelength: '532 nm',
			wavelengthMax: '',
			power: '5 W',
			pulseEnergy: '',
			pulseDuration: '',
			repetitionRate: '',
			beamDiameter: '2 mm',
			beamDiameterDefinition: '1/e2',
			divergence: '1 mrad',
			divergenceDefinition: '1/e2',
			beamQuality: '',
			beamProfile: 'gaussian',
			hotSpotFactor: '',
			...overrides
		}
	};
}

const element = blankElement;

/** A path with a splitter and a lens, and two points of concern. */
export function pathForm(lineId: string, overrides: Partial<PathForm> = {}): PathForm {
	return {
		lineIds: [lineId],
		lineChoiceReason: '',
		name: 'Bench path A',
		purpose: 'alignment',
		nohdExposureDuration: '0.25 s',
		elements: [
			element('propagate', { length: '0.5 m' }),
			element('transmission', { label: 'splitter, 10 % branch', transmission: '0.1' }),
			element('propagate', { length: '0.3 m' }),
			element('lens', { label: 'f = 100 mm', focalLength: '100 mm' }),
			element('propagate', { length: '1 m' })
		],
		points: [
			{ key: 'p1', label: 'Before the splitter', kind: 'intrabeam', tissue: 'eye', position: '0.4 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '' },
			{ key: 'p2', label: 'Past the lens', kind: 'intrabeam', tissue: 'eye', position: '1.8 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '' }
		],
		version: 0,
		...overrides
	};
}

/** The value of an outcome that must have succeeded (a failure fails the test with its message). */
export function must<T extends { ok: boolean }>(outcome: T): Extract<T, { ok: true }> {
	if (!outcome.ok) throw new Error(`expected success: ${JSON.stringify(outcome)}`);
	return outcome as Extract<T, { ok: true }>;
}

/** A visible-band eye limit for flow tests (a test fixture, not a value from any code). */
export function limitForm(overrides: Partial<LimitForm> = {}): LimitForm {
	return {
		label: 'Test fixture: visible eye, short exposure',
		tissue: 'eye',
		wavelengthMin: '400 nm',
		wavelengthMax: '700 nm',
		durationMin: '1e-9 s',
		durationMax: '10 s',
		quantity: 'radiant_exposure',
		k: '18 J/m²',
		n: '0.75',
		wavelengthFactorKind: 'none',
		wavelengthFactorValue: '',
		wavelengthFactorSlope: '',
		wavelengthFactorOrigin: '',
		wavelengthFactorFrom: '',
		wavelengthFactorTo: '',
		extendedAlphaMin: '',
		extendedAlphaMax: '',
		extendedExponent: '',
		limitingAperture: '7 mm',
		limitingApertureExponent: '',
		pulseGroupingTime: '',
		pulseBasis: 'continuous',
		pulseTrainExponent: '',
		noTrainCorrection: false,
		citation: 'Test fixture',
		demonstration: true,
		validFrom: '',
		validUntil: '',
		version: 0,
		...overrides
	};
}

export { lasers, limits };

/**
 * Start the job queue for a test without the start-up catch-up of the daily reminders: that run
 * would put today's reminders for every record of the shared test database in the mail ledger,
 * where the mail tests of later files would find them.
 */
export async function startJobsForTest() {
	await dailyRun.recordRun(new Date(), { test: 'daily run not owed' });
	return startJobs(process.env.DATABASE_URL!);
}
