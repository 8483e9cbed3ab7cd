import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { requireAbility } from '$lib/server/auth/guard';
import { listMailbox, readMailboxMessage } from '$lib/server/mail/mailbox';
import { recentLedger } from '$lib/server/mail/outbox';
import * as dailyRun from '$lib/server/jobs/dailyRun';
import type { PageServerLoad } from './$types';

const query = z.object({ page: z.coerce.number().int().min(1).max(10000).catch(1), message: z.string().max(200).optional().catch(undefined) });

/** The local fake mail server's inbox (non-production only) and our own sent-log. */
export const load: PageServerLoad = async ({ locals, url }) => {
	requireAbility(locals, 'administer');
	const q = query.parse(Object.fromEntries(url.searchParams));
	const box = await listMailbox({ page: q.page, pageSize: 25 });
	if (!box.available) error(404, { message: `The local mailbox is not available: ${box.reason}` });
	const open = q.message ? await readMailboxMessage(q.message) : null;
	const ledger = await recentLedger(50);
	const now = new Date();
	const last = await dailyRun.lastRun();
	return {
		daily: { lastAt: last?.finishedAt ?? null, late: dailyRun.isLate(last?.finishedAt ?? null, now), nextAt: dailyRun.nextScheduled(now) },
		box,
		message: open && open.available ? open.message : null,
		ledger
	};
};
