import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { orError } from '$lib/server/http/pages';
import * as reports from '$lib/server/reports';
import { renderReportPdf } from '$lib/server/reportPdf';
import { contentDisposition } from '$lib/server/uploads';
import type { RequestHandler } from './$types';

/** The evaluation report of one snapshot as a PDF, made on the server; ?paper=letter for US Letter. */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const scope = await scopeOf(requireUser(locals));
	const { report } = orError(await reports.find(scope, params.pathId, params.snapshotId));
	const paper = url.searchParams.get('paper') === 'letter' ? 'LETTER' : 'A4';
	const pdf = await renderReportPdf(report, paper);
	const name = `hazard-evaluation-${report.path.name}-${report.snapshot.createdAt.slice(0, 10)}.pdf`.replace(/[^\w.-]+/g, '-');
	return new Response(new Uint8Array(pdf), {
		headers: { 'content-type': 'application/pdf', 'content-disposition': contentDisposition('attachment', name), 'cache-control': 'no-store' }
	});
};
