// Compute the reminders of one day and put them in the mail ledger; with --deliver, send what is due.
// Safe to run at any time and in several processes at once: the ledger sends each mail once.
//
//   npx tsx scripts/run-reminders.ts [--today=YYYY-MM-DD] [--deliver] [--now=ISO-timestamp]
//
// Uses DATABASE_URL and the mail settings (SMTP_HOST, SMTP_PORT, …). Exit 0 when done, 2 on bad
// arguments, bad settings or a failure (the message says which).
import { client } from '$lib/server/db';
import { deliverAll } from '$lib/server/mail/outbox';
import { toIsoDay } from '$lib/server/mail/schedule';
import { runDaily } from '$lib/server/reminders';

const usage = 'usage: npx tsx scripts/run-reminders.ts [--today=YYYY-MM-DD] [--deliver] [--now=ISO-timestamp]';

function parseArgs(argv: string[]) {
	let today = new Date().toISOString().slice(0, 10);
	let deliver = false;
	let now: Date | undefined;
	for (const arg of argv) {
		if (arg === '--deliver') deliver = true;
		else if (arg.startsWith('--today=')) today = toIsoDay(arg.slice('--today='.length));
		else if (arg.startsWith('--now=')) {
			now = new Date(arg.slice('--now='.length));
			if (Number.isNaN(now.getTime())) throw new Error(`--now: not a timestamp: ${arg.slice(6)}`);
		} else if (arg === '--help' || arg === '-h') {
			console.log(usage);
			process.exit(0);
		} else throw new Error(`unknown argument: ${arg}\n${usage}`);
	}
	return { today, deliver, now };
}

async function main(): Promise<number> {
	let args: ReturnType<typeof parseArgs>;
	try {
		args = parseArgs(process.argv.slice(2));
	} catch (e) {
		console.error((e as Error).message);
		return 2;
	}
	if (!process.env.DATABASE_URL) {
		console.error('DATABASE_URL is not set (postgres://… of the register).');
		return 2;
	}
	try {
		const counts = await runDaily(args.today);
		console.log(
			`reminders for ${counts.today}: ${counts.inspectionDue} inspection due, ${counts.inspectionOverdue} inspection overdue, ` +
				`${counts.reviewWaiting} review waiting, ${counts.trainingExpiring} training expiring, ${counts.trainingExpired} training expired, ${counts.actionOverdue} corrective action overdue, ${counts.findingOverdue} inspection finding overdue, ${counts.notifications} notification; ` +
				`${counts.safety.procedureReviewDue} procedure review due, ${counts.safety.signoffNeeded} sign-off needed, ${counts.safety.signoffLapsing} sign-off lapsing, ` +
				`${counts.safety.authorisationWaiting} authorisation waiting, ${counts.safety.authorisationLapsing} authorisation lapsing, ${counts.safety.authorisationLapsed} authorisation lapsed; ${counts.held} held for digests; ` +
				`${counts.digests} digests (${counts.digestItems} items)`
		);
		if (args.deliver) {
			const d = await deliverAll({ now: args.now });
			console.log(`delivery: ${d.claimed} claimed, ${d.sent} sent, ${d.retrying} to retry, ${d.failed} failed for good`);
		}
		return 0;
	} catch (e) {
		console.error(`run-reminders failed: ${(e as Error).message}`);
		return 2;
	} finally {
		await client.end({ timeout: 5 });
	}
}

process.exit(await main());
