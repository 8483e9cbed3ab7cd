// Every queue of the app, created by the migration script (as the schema owner) before any worker runs.
export const queues = {
	/** Re-evaluate beam paths whose assessment went stale (a limit or a line changed). */
	reassessPaths: 'reassess-paths'
} as const;

export type QueueName = (typeof queues)[keyof typeof queues];

/** 'stately': at most one waiting and one running job per queue, so nudges never pile up. */
export const queueDefinitions: { name: QueueName; policy: 'standard' | 'stately'; cron?: string }[] = [
	{ name: queues.reassessPaths, policy: 'stately', cron: '*/5 * * * *' }
];
