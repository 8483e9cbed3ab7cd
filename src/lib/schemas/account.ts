import type { Role } from '$lib/roles';
import { z } from 'zod';
import { mailModes } from '$lib/enums';

export const resetRequestSchema = z
	.object({ email: z.string().trim().min(1, 'Enter your e-mail address.').max(254).pipe(z.email({ error: 'Enter an e-mail address like name@example.org.' })) })
	.strict();

export const newPasswordSchema = z
	.object({
		password: z.string().min(12, 'Use at least 12 characters.').max(256, 'Use at most 256 characters.'),
		confirm: z.string().max(256)
	})
	.strict()
	.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });

export const preferencesSchema = z.object({ mailMode: z.enum(mailModes, { error: 'Choose immediate mails or a daily digest.' }) }).strict();

/** GET /api/me: who is signed in and when the session ends. */
export type MeResponse = {
	id: string;
	name: string;
	email: string;
	role: Role;
	labs: { id: string; code: string; name: string }[];
	session: { idleEndsAt: string; absoluteEndsAt: string };
};
