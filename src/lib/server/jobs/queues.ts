import type PgBoss from 'pg-boss';

// Every queue of the app, created by the migration script (as the schema owner) before any worker runs.
export const queues = {
	/** Re-evaluate beam paths whose assessment went stale (a limit or a line changed). */
	reassessPaths: 'reassess-paths',
	/** Once a day: put the day's reminders in the mail ledger, assemble digests, then deliver. */
	mailDaily: 'mail-daily',
	/** Every minute and on a nudge: turn reset requests into links, mail new in-app notifications and send what the ledger has due. */
	mailDeliver: 'mail-deliver',
	/** Every hour: forget sign-in throttle rows, reset requests and sessions that count for nothing any more. */
	housekeeping: 'housekeeping',
	/** On a nudge and every minute: write the register imports an officer started, batch by batch. */
	registerImport: 'register-import'
} as const;

export type QueueName = (typeof queues)[keyof typeof queues];

/**
 * 'stately': at most one waiting and one running job per queue, so nudges never pile up.
 * Cron times are UTC (pg-boss's default time zone).
 */
export const queueDefinitions: { name: QueueName; policy: 'standard' | 'stately'; cron?: string }[] = [
	{ name: queues.reassessPaths, policy: 'stately', cron: '*/5 * * * *' },
	{ name: queues.mailDaily, policy: 'stately', cron: '0 6 * * *' },
	{ name: queues.mailDeliver, policy: 'stately', cron: '* * * * *' },
	{ name: queues.housekeeping, policy: 'stately', cron: '17 * * * *' },
	{ name: queues.registerImport, policy: 'stately', cron: '* * * * *' }
];

let running: PgBoss | null = null;

/** The running queue of this process (set by the workers at start-up), or null. */
export const boss = () => running;
export function setBoss(b: PgBoss | null) {
	running = b;
}

/** Ask the workers to act now. Never fails the caller: the schedule catches up if this is lost. */
export async function nudge(queue: QueueName): Promise<void> {
	try {
		await running?.send(queue, {});
	} catch (e) {
		console.error('job queue: could not send', queue, (e as Error).message);
	}
}
