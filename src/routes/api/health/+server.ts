import { json } from '@sveltejs/kit';
import { databaseAnswers } from '$lib/server/health';

/** Load balancers ask this: 200 when the database answers, 503 otherwise. */
export async function GET() {
	if (await databaseAnswers()) return json({ status: 'ok' });
	return json({ status: 'unavailable', message: 'The database does not answer.' }, { status: 503 });
}
