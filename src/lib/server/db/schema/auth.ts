import { boolean, integer, pgEnum, pgTable, text, timestamp, index } from 'drizzle-orm/pg-core';

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

/** Failed sign-in counters, shared by every app instance. key = 'account:<email>' or 'address:<ip>'. */
export const signInThrottle = pgTable('sign_in_throttle', {
	key: text('key').primaryKey(),
	failures: integer('failures').notNull().default(0),
	windowStart: timestamp('window_start', { withTimezone: true }).notNull().defaultNow(),
	lockedUntil: timestamp('locked_until', { withTimezone: true })
});

export type User = typeof user.$inferSelect;
export type NewUser = typeof user.$inferInsert;
export type Session = typeof session.$inferSelect;
