import { z } from 'zod';
import { roles } from '$lib/roles';

const email = z.email({ error: 'Enter an e-mail address like name@example.org.' }).max(254).trim().toLowerCase();

export const signInSchema = z.object({
	email: z.string().trim().min(1, 'Enter your e-mail address.').max(254).pipe(z.email({ error: 'Enter an e-mail address like name@example.org.' })),
	password: z.string().min(1, 'Enter your password.').max(256, 'That is longer than any password here.')
});

export const newUserSchema = z
	.object({
		name: z.string().trim().min(1, 'Enter the person’s name.').max(120),
		email,
		role: z.enum(roles, { error: 'Choose one of the four roles.' }),
		labIds: z.array(z.uuid({ error: 'Unknown lab.' })).max(50).refine((ids) => new Set(ids).size === ids.length, 'Each lab can be chosen once.').default([]),
		password: z.string().min(12, 'Use at least 12 characters.').max(256, 'Use at most 256 characters.')
	})
	.strict();

export const updateUserSchema = z
	.object({
		role: z.enum(roles, { error: 'Choose one of the four roles.' }),
		labIds: z.array(z.uuid({ error: 'Unknown lab.' })).max(50).refine((ids) => new Set(ids).size === ids.length, 'Each lab can be chosen once.').default([]),
		disabled: z.boolean().default(false),
		version: z.coerce.number().int().positive()
	})
	.strict();

export type NewUserInput = z.infer<typeof newUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
