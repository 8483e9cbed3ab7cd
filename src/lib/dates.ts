// Dates and times as every page shows them: in UTC, so that the server's render and the browser's
// agree and a record reads the same for everyone. Loads pass Date objects through (SvelteKit
// serialises them); the API's JSON carries ISO strings; both are accepted here.

type When = Date | string | null | undefined;

const iso = (d: Date | string) => (typeof d === 'string' ? new Date(d) : d).toISOString();

/** The day, yyyy-mm-dd. */
export function day(d: When, none = '—'): string {
	return d ? iso(d).slice(0, 10) : none;
}

/** The day and the minute, yyyy-mm-dd hh:mm UTC. */
export function moment(d: When, none = '—'): string {
	return d ? `${iso(d).slice(0, 16).replace('T', ' ')} UTC` : none;
}
