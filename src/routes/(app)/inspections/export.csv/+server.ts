import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as inspections from '$lib/server/inspections';
import { todayISO } from '$lib/inspectionState';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
	const scope = await scopeOf(requireAbility(locals, 'exportInspections'));
	const today = todayISO();
	const csv = inspections.toCsv(await inspections.schedule(scope, today));
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="inspections-${today}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
