import { requireAbility } from '$lib/server/auth/guard';
import { writeCsv } from '$lib/server/csv';
import { registerColumns } from '$lib/registerCsv';
import type { RequestHandler } from './$types';

/** The import's columns with one example row (invented), to fill in a spreadsheet. */
export const GET: RequestHandler = async ({ locals }) => {
	requireAbility(locals, 'importRegister');
	const csv = writeCsv(
		registerColumns.map((c) => c.name),
		[registerColumns.map((c) => c.example)]
	);
	return new Response(csv, {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': 'attachment; filename="register-import-template.csv"', 'cache-control': 'no-store' }
	});
};
