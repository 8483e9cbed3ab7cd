import { bigserial, boolean, integer, pgEnum, pgTable, text, timestamp, index } from 'drizzle-orm/pg-core';

import { roles } from '../../../roles';

export { roles, type Role } from '../../../roles';
export const roleEnum = pgEnum('role', roles);

export const user = pgTable('user', {
	id: text('id')
		.primaryKey()
		.$defaultFn(() => crypto.randomUUID()),
	email: text('email').notNull().unique(),
	name: text('name').notNull(),
	role: roleEnum('role').notNull().default('researcher'),
	passwordHash: text('password_hash').notNull(),
	disabled: boolean('disabled').notNull().default(false),
	version: integer('version').notNull().default(1),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});

/** `id` holds the SHA-256 of the session token, never the token itself. */
export const session = pgTable(
	'session',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
		createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull()
	},
	(t) => [index('session_user_idx').on(t.userId)]
);

/**
 * Failed sign-in counters, shared by every app instance (see auth/throttle.ts for the keys:
 * 'pair:<email>|<address>', 'account:<email>', 'address:<ip>', 'device:<nonce>'). Rows whose window
 * and lock have passed are purged by the housekeeping job.
 */
export const signInThrottle = pgTable(
	'sign_in_throttle',
	{
		key: text('key').primaryKey(),
		failures: integer('failures').notNull().default(0),
		windowStart: timestamp('window_start', { withTimezone: true }).notNull().defaultNow(),
		lockedUntil: timestamp('locked_until', { withTimezone: true })
	},
	(t) => [index('sign_in_throttle_window_idx').on(t.windowStart)]
);

/**
 * Password reset requests as they arrive: the request itself does the same work whoever the address
 * belongs to (one row), and the mail job looks the account up later. Also what the per-address and
 * per-address-typed limits count. Purged after a day.
 */
export const passwordResetRequest = pgTable(
	'password_reset_request',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		email: text('email').notNull(),
		address: text('address').notNull(),
		requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
		processedAt: timestamp('processed_at', { withTimezone: true })
	},
	(t) => [index('password_reset_request_email_idx').on(t.email, t.requestedAt), index('password_reset_request_address_idx').on(t.address, t.requestedAt)]
);

/** Server-side secrets shared by every instance (e.g. the key that signs device cookies), made once on first use. */
export const appSecret = pgTable('app_secret', {
	name: text('name').primaryKey(),
	value: text('value').notNull(),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

export type User = typeof user.$inferSelect;
export type NewUser = typeof user.$inferInsert;
export type Session = typeof session.$inferSelect;

/** A password reset link, by the hash of its token; used once, then never again. */
export const passwordReset = pgTable('password_reset', {
	tokenHash: text('token_hash').primaryKey(),
	userId: text('user_id')
		.notNull()
		.references(() => user.id),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	usedAt: timestamp('used_at', { withTimezone: true }),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
