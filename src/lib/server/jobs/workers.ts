// The workers of the PostgreSQL job queue (pg-boss); only the hooks start them, other modules
// reach the queue through `nudge` in ./queues. The durable state lives in our own tables (a path's `stale`
// flag, the mail ledger): a job is only a nudge to act on it, and a schedule sweeps up whatever a
// lost nudge left behind. So a job that runs twice or not at all changes nothing a person sees.
import PgBoss from 'pg-boss';
import { boss, nudge, queueDefinitions, queues, setBoss, type QueueName } from './queues';
import * as paths from '$lib/server/paths';
import * as reminders from '$lib/server/reminders';
import * as outbox from '$lib/server/mail/outbox';
import * as passwordResets from '$lib/server/passwordResets';
import * as throttle from '$lib/server/auth/throttle';
import * as auth from '$lib/server/auth/session';
import * as registerImport from '$lib/server/registerImport';
import * as dailyRun from './dailyRun';

const handlers: Record<QueueName, () => Promise<unknown>> = {
	[queues.reassessPaths]: async () => {
		// Paths last assessed by an older engine, limits that came into force or lapsed since the
		// paths were assessed, then the backlog, in batches so one job clears it.
		await paths.markStaleByEngine();
		await paths.markStaleByLimitDates();
		let total = 0;
		for (;;) {
			const { reassessed } = await paths.reassessStale(200);
			total += reassessed;
			if (reassessed < 200) return { reassessed: total };
		}
	},
	// Both mail jobs only touch the ledger: running one twice sends nothing twice. An SMTP outage
	// is recorded on the ledger rows (retried later), not thrown; a database outage fails the job,
	// which pg-boss logs through the 'error' event and the next schedule repeats.
	[queues.mailDaily]: async () => {
		const counts = await reminders.runDaily(new Date());
		const delivered = await outbox.deliverAll();
		await dailyRun.recordRun(new Date(), { ...counts, ...delivered });
		return { ...counts, ...delivered };
	},
	[queues.mailDeliver]: async () => {
		const resets = await passwordResets.processRequests(new Date());
		const notifications = await reminders.enqueueNotificationMails(new Date());
		const delivered = await outbox.deliverAll();
		return { resets: resets.linked, notifications: notifications.inserted, ...delivered };
	},
	[queues.housekeeping]: async () => {
		const throttleRows = await throttle.purge();
		const resetRequests = await passwordResets.purgeRequests();
		await auth.lucia.deleteExpiredSessions();
		return { throttleRows, resetRequests };
	},
	// Started imports, batch by batch (each batch marks its rows done, so a second run writes nothing twice).
	[queues.registerImport]: async () => {
		const result = await registerImport.runStarted();
		if (result.linesChanged) await nudge(queues.reassessPaths);
		return result;
	}
};

/** Handlers at work now: stopping waits for them (pg-boss gives up waiting after its timeout, the work does not stop). */
const inFlight = new Set<Promise<unknown>>();
export const handlersAtWork = () => inFlight.size;

/** Run a queue's handler; a failure is logged (message only) and rethrown so pg-boss records it. */
async function runHandler(name: QueueName) {
	const work = handlers[name]();
	inFlight.add(work);
	try {
		return await work;
	} catch (e) {
		console.error(`job ${name} failed:`, (e as Error).message);
		throw e;
	} finally {
		inFlight.delete(work);
	}
}

export async function startJobs(connectionString: string): Promise<PgBoss> {
	const running = boss();
	if (running) return running;
	const b = new PgBoss({ connectionString, migrate: false, max: 3, application_name: 'beamwarden-jobs' });
	// A database outage must not crash the process: pg-boss reports it here and retries.
	b.on('error', (e) => console.error('job queue:', e.message));
	await b.start();
	for (const q of queueDefinitions) {
		// Queues are created by the migration script; one not created yet (an older database) is
		// skipped with a word in the log rather than stopping the other queues.
		if (!(await b.getQueue(q.name))) {
			console.error(`job queue: queue ${q.name} does not exist yet; run the migrations (scripts/migrate.ts)`);
			continue;
		}
		await b.work(q.name, { pollingIntervalSeconds: 2 }, () => runHandler(q.name));
		if (q.cron) await b.schedule(q.name, q.cron);
	}
	setBoss(b);
	// Catch up at start-up rather than at the next schedule (e.g. snapshots of an older engine; the
	// daily reminders when the server was down at their hour, or a fresh demo has never run them).
	await nudge(queues.reassessPaths);
	try {
		if (await dailyRun.owedAt(new Date())) await nudge(queues.mailDaily);
	} catch (e) {
		console.error('job queue: could not read the last daily run:', (e as Error).message);
	}
	return b;
}

/** Stop taking jobs and wait for the handlers at work to finish, so that nothing is still sending when this returns. */
export async function stopJobs(): Promise<void> {
	await boss()?.stop({ graceful: true, timeout: 5000 });
	await Promise.allSettled([...inFlight]);
	setBoss(null);
}
