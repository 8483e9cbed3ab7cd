// Environment settings, checked once at start-up with a clear message per bad variable.
import { z } from 'zod';

const schema = z.object({
	DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/, error: 'must be a postgres:// URL' }),
	ORIGIN: z.url({ error: 'must be the public URL of the app, e.g. https://lasers.example.org' }).optional()
});

export type Config = z.infer<typeof schema>;

export function readConfig(env: Record<string, string | undefined> = process.env): Config {
	const parsed = schema.safeParse(env);
	if (!parsed.success) {
		const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
		throw new Error(`Beamwarden cannot start; fix these environment variables:\n${lines.join('\n')}`);
	}
	return parsed.data;
}
