import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as areas from '$lib/server/areas';
import * as authorisations from '$lib/server/authorisations';
import * as inspections from '$lib/server/inspections';
import { orError } from '$lib/server/http/pages';
import { todayISO } from '$lib/inspectionState';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const found = orError(await areas.find(scope, params.areaId));
	const [people, visits, officers] = await Promise.all([authorisations.inForceForArea(found.area.id, today), areas.visits(found.area.id, today), inspections.officers()]);
	return {
		today,
		printedAt: new Date(),
		area: { id: found.area.id, name: found.area.name, room: found.area.room, building: found.area.building },
		labName: found.labName,
		responsibleName: found.responsibleName,
		lasers: found.lasers.map((l) => ({ id: l.id, label: `${l.maker} ${l.model}`, laserClass: l.laserClass })),
		people: people.map((p) => ({ id: p.id, name: p.personName, forWhat: p.areaId ? 'the whole area' : p.targetLabel, until: p.outcome.validUntil })).sort((a, b) => a.name.localeCompare(b.name)),
		visitsToday: visits.coming.filter((v) => v.startsOn <= today).map((v) => ({ id: v.id, name: v.visitorName, kind: v.kind, escortName: v.escortName })),
		officers: officers.map((o) => o.name)
	};
};
