// The written access policy: every route of the app, by route id, with who may read (GET/HEAD)
// and who may write (every other method, form actions included). handleGuard enforces it before
// any load, action or endpoint runs; a route that is missing here is refused (deny by default),
// and the access-matrix test fails on it. Loads, actions and endpoints check again through guard.ts,
// where finer rules (own labs, self-review) live.
import type { Role } from '$lib/server/db/schema';

export type Access = 'public' | 'signed-in' | readonly Role[];
export type RouteRule = { read: Access; write: Access };

const everyone: Access = 'signed-in';
const nobody: readonly Role[] = [];
const admin: readonly Role[] = ['admin'];
/** Lab members change their own labs' register; officers every lab's (finer rules in auth/scope.ts). */
const registerWriters: readonly Role[] = ['researcher', 'officer'];
const officers: readonly Role[] = ['officer'];

export const routePolicy: Record<string, RouteRule> = {
	'/': { read: 'public', write: nobody },
	'/(auth)/signin': { read: 'public', write: 'public' },
	'/(auth)/signout': { read: everyone, write: everyone },
	'/(auth)/reset-password': { read: 'public', write: 'public' },
	'/(auth)/reset-password/[token]': { read: 'public', write: 'public' },
	'/(app)/preferences': { read: everyone, write: everyone },
	'/(app)/admin/mail': { read: admin, write: nobody },
	'/(app)/overview': { read: everyone, write: nobody },
	'/(app)/lasers': { read: everyone, write: nobody },
	'/(app)/lasers/new': { read: registerWriters, write: registerWriters },
	'/(app)/lasers/[laserId]': { read: everyone, write: nobody },
	'/(app)/lasers/[laserId]/edit': { read: registerWriters, write: registerWriters },
	'/(app)/lasers/[laserId]/lines/new': { read: registerWriters, write: registerWriters },
	'/(app)/lasers/[laserId]/lines/[lineId]': { read: registerWriters, write: registerWriters },
	'/(app)/lasers/[laserId]/paths/new': { read: registerWriters, write: registerWriters },
	'/(app)/paths/[pathId]': { read: everyone, write: registerWriters },
	'/(app)/paths/[pathId]/report/[snapshotId]': { read: everyone, write: nobody },
	'/(app)/paths/[pathId]/report/[snapshotId]/evaluation.pdf': { read: everyone, write: nobody },
	'/(app)/reviews': { read: everyone, write: nobody },
	'/(app)/reviews/[pathId]': { read: everyone, write: registerWriters },
	'/(app)/inspections': { read: everyone, write: ['manager', 'officer'] },
	'/(app)/inspections/[inspectionId]': { read: everyone, write: officers },
	'/(app)/inspections/checklists': { read: officers, write: officers },
	'/(app)/inspections/export.csv': { read: ['manager', 'officer', 'admin'], write: nobody },
	'/(app)/documents/[documentId]': { read: everyone, write: nobody },
	'/(app)/eyewear': { read: everyone, write: nobody },
	'/(app)/training': { read: everyone, write: officers },
	'/(app)/eyewear/new': { read: officers, write: officers },
	'/(app)/eyewear/[eyewearId]': { read: officers, write: officers },
	// Incidents: anyone reports; finer rules (own reports, own labs' near misses, names) in incidents.ts.
	'/(app)/incidents': { read: everyone, write: everyone },
	'/(app)/incidents/report': { read: everyone, write: everyone },
	'/(app)/incidents/[incidentId]': { read: everyone, write: officers },
	'/(app)/incidents/[incidentId]/edit': { read: everyone, write: everyone },
	'/(app)/incidents/[incidentId]/medical': { read: officers, write: officers },
	'/(app)/incidents/learning': { read: ['officer', 'manager'], write: nobody },
	'/(app)/incidents/export.csv': { read: ['officer', 'manager'], write: nobody },
	'/(app)/procedures': { read: everyone, write: officers },
	'/(app)/procedures/new': { read: registerWriters, write: registerWriters },
	'/(app)/procedures/[procedureId]': { read: everyone, write: registerWriters },
	'/(app)/authorisations': { read: everyone, write: registerWriters },
	'/(app)/authorisations/[authorisationId]': { read: everyone, write: officers },
	'/(app)/areas/[areaId]': { read: everyone, write: registerWriters },
	'/(app)/areas/[areaId]/door': { read: everyone, write: nobody },
	'/(app)/areas/[areaId]/posting': { read: everyone, write: nobody },
	'/(app)/people/[userId]': { read: everyone, write: nobody },
	'/(app)/limits': { read: everyone, write: nobody },
	'/(app)/limits/new': { read: officers, write: officers },
	'/(app)/limits/[limitId]': { read: everyone, write: officers },
	'/(app)/admin/users': { read: admin, write: admin },
	'/(app)/admin/users/new': { read: admin, write: admin },
	'/(app)/admin/users/[userId]': { read: admin, write: admin },
	'/api/me': { read: everyone, write: nobody },
	'/api/assessments/preview': { read: nobody, write: everyone },
	'/api/lasers': { read: everyone, write: registerWriters },
	'/api/lasers/[laserId]': { read: everyone, write: registerWriters },
	'/api/lasers/[laserId]/paths': { read: nobody, write: registerWriters },
	'/api/paths/[pathId]': { read: everyone, write: registerWriters },
	'/api/limits': { read: everyone, write: officers },
	'/api/limits/[limitId]': { read: everyone, write: officers },
	'/api/incidents': { read: everyone, write: nobody },
	'/api/incidents/[incidentId]': { read: everyone, write: nobody },
	'/api/incidents/[incidentId]/medical': { read: officers, write: officers },
	'/api/admin/users': { read: admin, write: admin },
	'/api/admin/users/[userId]': { read: admin, write: admin },
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
