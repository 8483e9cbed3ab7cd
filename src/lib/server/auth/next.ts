// Where sign-in sends a person afterwards.
/**
 * Only a path of this site: never an open redirect. The URL parser decides, as a browser would (it
 * drops tabs and newlines, so "/\t/evil.example" is "//evil.example"), and the path is rebuilt from it.
 */
export function safeNext(next: string | null, origin: string): string {
	if (!next || !next.startsWith('/')) return '/overview';
	try {
		const u = new URL(next, origin);
		return u.origin === origin ? u.pathname + u.search + u.hash : '/overview';
	} catch {
		return '/overview';
	}
}
