// The PostgreSQL job queue (pg-boss). The durable state lives in our own tables (a path's `stale`
// flag, the mail ledger): a job is only a nudge to act on it, and a schedule sweeps up whatever a
// lost nudge left behind. So a job that runs twice or not at all changes nothing a person sees.
import PgBoss from 'pg-boss';
import { queueDefinitions, queues, type QueueName } from './queues';
import * as paths from '$lib/server/paths';

let boss: PgBoss | null = null;

const handlers: Record<QueueName, () => Promise<unknown>> = {
	[queues.reassessPaths]: async () => {
		// Drain in batches so one job clears a large backlog.
		let total = 0;
		for (;;) {
			const { reassessed } = await paths.reassessStale(200);
			total += reassessed;
			if (reassessed < 200) return { reassessed: total };
		}
	}
};

export async function startJobs(connectionString: string): Promise<PgBoss> {
	if (boss) return boss;
	const b = new PgBoss({ connectionString, migrate: false, max: 3, application_name: 'beamwarden-jobs' });
	// A database outage must not crash the process: pg-boss reports it here and retries.
	b.on('error', (e) => console.error('job queue:', e.message));
	await b.start();
	for (const q of queueDefinitions) {
		await b.work(q.name, { pollingIntervalSeconds: 2 }, () => handlers[q.name]());
		if (q.cron) await b.schedule(q.name, q.cron);
	}
	boss = b;
	return b;
}

export async function stopJobs(): Promise<void> {
	await boss?.stop({ graceful: true, timeout: 5000 });
	boss = null;
}

/** Ask the workers to act now. Never fails the caller: the schedule catches up if this is lost. */
export async function nudge(queue: QueueName): Promise<void> {
	try {
		await boss?.send(queue, {});
	} catch (e) {
		console.error('job queue: could not send', queue, (e as Error).message);
	}
}
