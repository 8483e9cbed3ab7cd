// The daily reminder run's own record: when it last finished (kept in PostgreSQL, so a restart or a
// second instance sees it), whether a start-up must catch it up, and when the schedule runs it next.
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { queueDefinitions, queues } from './queues';

const DAY_MS = 86_400_000;

/** The daily queue's cron, 'M H * * *' in UTC (pg-boss's default time zone). */
function dailyTime(): { hour: number; minute: number } {
	const cron = queueDefinitions.find((q) => q.name === queues.mailDaily)?.cron ?? '';
	const m = /^(\d{1,2}) (\d{1,2}) \* \* \*$/.exec(cron);
	if (!m) throw new Error(`the daily reminder run needs a once-a-day cron 'M H * * *', not '${cron}'`);
	return { minute: Number(m[1]), hour: Number(m[2]) };
}

/** The first scheduled run strictly after `now`. */
export function nextScheduled(now: Date): Date {
	const { hour, minute } = dailyTime();
	const at = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), hour, minute));
	return at > now ? at : new Date(at.getTime() + DAY_MS);
}

/** A run is owed when there has never been one, or the last finished more than a day ago. */
export function isLate(lastFinishedAt: Date | null, now: Date): boolean {
	return lastFinishedAt === null || now.getTime() - lastFinishedAt.getTime() > DAY_MS;
}

export async function lastRun(): Promise<{ finishedAt: Date; result: unknown } | null> {
	const [row] = await db.select().from(table.jobRun).where(eq(table.jobRun.queue, queues.mailDaily));
	return row ? { finishedAt: row.lastFinishedAt, result: row.lastResult } : null;
}

/** Called by the daily job when it has finished; a failed run records nothing, so it stays owed. */
export async function recordRun(finishedAt: Date, result: unknown): Promise<void> {
	await db
		.insert(table.jobRun)
		.values({ queue: queues.mailDaily, lastFinishedAt: finishedAt, lastResult: result ?? {} })
		.onConflictDoUpdate({ target: table.jobRun.queue, set: { lastFinishedAt: sql`excluded.last_finished_at`, lastResult: sql`excluded.last_result` } });
}

/** Whether a start-up at `now` must run the daily reminders at once rather than wait for the schedule. */
export async function owedAt(now: Date): Promise<boolean> {
	return isLate((await lastRun())?.finishedAt ?? null, now);
}
