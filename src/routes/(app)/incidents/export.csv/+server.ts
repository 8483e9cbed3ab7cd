import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { todayISO } from '$lib/inspectionState';
import type { RequestHandler } from './$types';

/** Every sent report, without any personal field (no reporter, no people involved). */
export const GET: RequestHandler = async ({ locals }) => {
	const scope = await scopeOf(requireAbility(locals, 'readIncidentFigures'));
	const today = todayISO();
	const rows = (await incidents.list(scope, today, {}, 100_000)).filter((r) => r.state !== 'draft');
	return new Response(incidents.toCsv(rows), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="incidents-${today}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
