/**
 * A calendar day written 'YYYY-MM-DD' that exists: Date.parse accepts 2024-02-31 (rolling it over
 * to 2 March), so the day must also read back unchanged.
 */
export function isCalendarDay(t: string): boolean {
	if (!/^\d{4}-\d{2}-\d{2}$/.test(t)) return false;
	const d = new Date(`${t}T00:00:00Z`);
	return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === t;
}
