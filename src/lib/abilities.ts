// Who may do what: the one place where role lists are written. The route policy
// ($lib/server/auth/policy.ts), the guards of loads, actions and endpoints (requireAbility), the data
// modules and the pages all ask `can(…)` with one of these names; finer rules (own labs, own reports,
// self-review) live in the data modules. Shared with the browser so a page can hide what it may not do.
import type { Role } from '$lib/roles';

export const abilities = {
	/** Register lasers, lines and beam paths, answer a review (own labs; officers every lab). */
	changeRegister: ['researcher', 'officer'],
	/** People who work with lasers: sign procedures, ask for an authorisation, draft a procedure. */
	workWithLasers: ['researcher', 'officer'],
	/** Clear or return beam paths. */
	decideReviews: ['officer'],
	/** Enter, revise, retire, import limits. */
	manageLimits: ['officer'],
	/** Add, change and withdraw eyewear. */
	manageEyewear: ['officer'],
	/** Record and withdraw training. */
	recordTraining: ['officer'],
	/** Record inspections, their photos and findings; keep the checklists. */
	recordInspections: ['officer'],
	/** Choose who inspects an area. */
	assignInspectors: ['manager', 'officer'],
	/** Investigate incidents: actions, suspensions, medical follow-up, closing. */
	investigateIncidents: ['officer'],
	/** The incident figures and lessons, and their export. */
	readIncidentFigures: ['officer', 'manager'],
	/** The inspection export. */
	exportInspections: ['manager', 'officer', 'admin'],
	/** Approve and confirm procedures, set the sign-off interval, grant or refuse authorisations. */
	approveProcedures: ['officer'],
	/** Bring in the register from a CSV file. */
	importRegister: ['officer'],
	/** Read every person's records (researchers read their own). */
	readEveryone: ['officer', 'manager', 'admin'],
	/** People, labs and the sent mail. */
	administer: ['admin']
} as const satisfies Record<string, readonly Role[]>;

export type Ability = keyof typeof abilities;

export function can(who: Role | { role: Role }, ability: Ability): boolean {
	const role = typeof who === 'string' ? who : who.role;
	return (abilities[ability] as readonly Role[]).includes(role);
}
