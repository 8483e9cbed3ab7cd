// The limit library as a file to download (format: src/lib/schemas/limitSet.ts).
import { requireAbility } from '$lib/server/auth/guard';
import * as limitSets from '$lib/server/limitSets';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
	requireAbility(locals, 'manageLimits');
	const file = await limitSets.document();
	return new Response(JSON.stringify(file, null, '\t') + '\n', {
		headers: {
			'content-type': 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="beamwarden-limit-set-${file.exportedAt.slice(0, 10)}.json"`,
			'cache-control': 'no-store'
		}
	});
};
