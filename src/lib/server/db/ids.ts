/** Whether an id from a URL or a form can be a row's uuid: looked up only if so (PostgreSQL refuses a malformed uuid). */
export function isUuid(s: string): boolean {
	return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(s);
}
