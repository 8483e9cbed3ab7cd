// The written access policy: every route of the app, by route id, with who may read (GET/HEAD)
// and who may write (every other method, form actions included). handleGuard enforces it before
// any load, action or endpoint runs; a route that is missing here is refused (deny by default),
// and the access-matrix test fails on it. Loads, actions and endpoints check again through guard.ts,
// where finer rules (own labs, self-review) live.
import type { Role } from '$lib/roles';
import { abilities } from '$lib/abilities';

export type Access = 'public' | 'signed-in' | readonly Role[];
export type RouteRule = { read: Access; write: Access };

const everyone: Access = 'signed-in';
const nobody: readonly Role[] = [];
// Role lists come from the written abilities ($lib/abilities.ts); a route names the ability it serves.
const a = abilities;

export const routePolicy: Record<string, RouteRule> = {
	'/': { read: 'public', write: nobody },
	'/(auth)/signin': { read: 'public', write: 'public' },
	'/(auth)/signout': { read: everyone, write: everyone },
	'/(auth)/reset-password': { read: 'public', write: 'public' },
	'/(auth)/reset-password/[token]': { read: 'public', write: 'public' },
	'/(app)/preferences': { read: everyone, write: everyone },
	'/(app)/admin/mail': { read: a.administer, write: nobody },
	'/(app)/overview': { read: everyone, write: nobody },
	'/(app)/lasers': { read: everyone, write: nobody },
	'/(app)/lasers/new': { read: a.changeRegister, write: a.changeRegister },
	'/(app)/lasers/export/lasers.csv': { read: everyone, write: nobody },
	'/(app)/lasers/export/lines.csv': { read: everyone, write: nobody },
	'/(app)/lasers/export/paths.csv': { read: everyone, write: nobody },
	'/(app)/lasers/import': { read: a.importRegister, write: a.importRegister },
	'/(app)/lasers/import/template.csv': { read: a.importRegister, write: nobody },
	'/(app)/lasers/import/[registerImportId]': { read: a.importRegister, write: a.importRegister },
	'/(app)/lasers/[laserId]': { read: everyone, write: nobody },
	'/(app)/lasers/[laserId]/edit': { read: a.changeRegister, write: a.changeRegister },
	'/(app)/lasers/[laserId]/lines/new': { read: a.changeRegister, write: a.changeRegister },
	'/(app)/lasers/[laserId]/lines/[lineId]': { read: a.changeRegister, write: a.changeRegister },
	'/(app)/lasers/[laserId]/paths/new': { read: a.changeRegister, write: a.changeRegister },
	'/(app)/paths/[pathId]': { read: everyone, write: a.changeRegister },
	'/(app)/paths/[pathId]/report/[snapshotId]': { read: everyone, write: nobody },
	'/(app)/paths/[pathId]/report/[snapshotId]/evaluation.pdf': { read: everyone, write: nobody },
	'/(app)/reviews': { read: everyone, write: nobody },
	'/(app)/reviews/[pathId]': { read: everyone, write: a.changeRegister },
	'/(app)/inspections': { read: everyone, write: a.assignInspectors },
	'/(app)/inspections/[inspectionId]': { read: everyone, write: a.recordInspections },
	'/(app)/inspections/checklists': { read: a.recordInspections, write: a.recordInspections },
	'/(app)/inspections/export.csv': { read: a.exportInspections, write: nobody },
	'/(app)/documents/[documentId]': { read: everyone, write: nobody },
	'/(app)/eyewear': { read: everyone, write: nobody },
	'/(app)/training': { read: everyone, write: a.recordTraining },
	'/(app)/eyewear/new': { read: a.manageEyewear, write: a.manageEyewear },
	'/(app)/eyewear/[eyewearId]': { read: a.manageEyewear, write: a.manageEyewear },
	// Incidents: anyone reports; finer rules (own reports, own labs' near misses, names) in incidents.ts.
	'/(app)/incidents': { read: everyone, write: everyone },
	'/(app)/incidents/report': { read: everyone, write: everyone },
	'/(app)/incidents/[incidentId]': { read: everyone, write: a.investigateIncidents },
	'/(app)/incidents/[incidentId]/edit': { read: everyone, write: everyone },
	'/(app)/incidents/[incidentId]/medical': { read: a.investigateIncidents, write: a.investigateIncidents },
	'/(app)/incidents/learning': { read: a.readIncidentFigures, write: nobody },
	'/(app)/incidents/export.csv': { read: a.readIncidentFigures, write: nobody },
	'/(app)/procedures': { read: everyone, write: a.approveProcedures },
	'/(app)/procedures/new': { read: a.workWithLasers, write: a.workWithLasers },
	'/(app)/procedures/[procedureId]': { read: everyone, write: a.workWithLasers },
	'/(app)/authorisations': { read: everyone, write: a.workWithLasers },
	'/(app)/authorisations/[authorisationId]': { read: everyone, write: a.approveProcedures },
	'/(app)/areas/[areaId]': { read: everyone, write: a.workWithLasers },
	'/(app)/areas/[areaId]/door': { read: everyone, write: nobody },
	'/(app)/areas/[areaId]/posting': { read: everyone, write: nobody },
	'/(app)/people/[userId]': { read: everyone, write: nobody },
	'/(app)/limits': { read: everyone, write: nobody },
	'/(app)/limits/new': { read: a.manageLimits, write: a.manageLimits },
	'/(app)/limits/[limitId]': { read: everyone, write: a.manageLimits },
	'/(app)/limits/limit-set.json': { read: a.manageLimits, write: nobody },
	'/(app)/limits/import': { read: a.manageLimits, write: a.manageLimits },
	'/(app)/limits/import/[importId]': { read: a.manageLimits, write: a.manageLimits },
	'/(app)/admin/users': { read: a.administer, write: a.administer },
	'/(app)/admin/users/new': { read: a.administer, write: a.administer },
	'/(app)/admin/users/[userId]': { read: a.administer, write: a.administer },
	'/api/me': { read: everyone, write: nobody },
	'/api/assessments/preview': { read: nobody, write: everyone },
	'/api/lasers': { read: everyone, write: a.changeRegister },
	'/api/lasers/[laserId]': { read: everyone, write: a.changeRegister },
	'/api/lasers/[laserId]/paths': { read: nobody, write: a.changeRegister },
	'/api/register-imports/[registerImportId]': { read: a.importRegister, write: nobody },
	'/api/paths/[pathId]': { read: everyone, write: a.changeRegister },
	'/api/limits': { read: everyone, write: a.manageLimits },
	'/api/limits/[limitId]': { read: everyone, write: a.manageLimits },
	'/api/limits/export': { read: a.manageLimits, write: nobody },
	'/api/incidents': { read: everyone, write: nobody },
	'/api/incidents/[incidentId]': { read: everyone, write: nobody },
	'/api/incidents/[incidentId]/medical': { read: a.investigateIncidents, write: a.investigateIncidents },
	'/api/admin/users': { read: a.administer, write: a.administer },
	'/api/admin/users/[userId]': { read: a.administer, write: a.administer },
	'/api/health': { read: 'public', write: nobody }
};

export function ruleFor(routeId: string | null): RouteRule | undefined {
	return routeId === null ? undefined : routePolicy[routeId];
}

export function allows(access: Access, role: Role | null): boolean {
	if (access === 'public') return true;
	if (role === null) return false;
	if (access === 'signed-in') return true;
	return access.includes(role);
}
