import { createHash } from 'node:crypto';
import { eq, isNull, sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { hashPassword, passwordProblem, verifyPassword } from '$lib/server/auth/password';
import * as auth from '$lib/server/auth/session';
import * as deviceCookies from '$lib/server/auth/device';
import * as throttle from '$lib/server/auth/throttle';
import * as passwordResets from '$lib/server/passwordResets';
import * as users from '$lib/server/users';
import { makeLab, makeUser, must } from './factories';

describe('password storage [ASVS 11.4.2, 6.2.x]', () => {
	it('stores only an Argon2id hash with m ≥ 19456 KiB, t ≥ 2, p = 1', async () => {
		const u = await makeUser();
		const [row] = await db.select().from(table.user).where(eq(table.user.id, u.id));
		expect(row.passwordHash).not.toContain(u.password);
		// PHC string format: $argon2id$v=19$m=…,t=…,p=…$salt$hash
		const m = /^\$argon2id\$v=19\$m=(\d+),t=(\d+),p=(\d+)\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]+$/.exec(row.passwordHash);
		expect(m, row.passwordHash.slice(0, 30)).not.toBeNull();
		expect(Number(m![1])).toBeGreaterThanOrEqual(19456);
		expect(Number(m![2])).toBeGreaterThanOrEqual(2);
		expect(Number(m![3])).toBe(1);
	});

	it('does not truncate long passwords and accepts any Unicode', async () => {
		const long = 'ü'.repeat(100) + 'Ωmega passphrase 🛡️ ' + 'x'.repeat(80);
		const hash = await hashPassword(long);
		expect(await verifyPassword(hash, long)).toBe(true);
		expect(await verifyPassword(hash, long.slice(0, 72))).toBe(false);
		expect(passwordProblem(long)).toBeNull();
		expect(passwordProblem('日本語のとても長いパスフレーズです')).toBeNull();
	});

	it('refuses short, common and product-name passwords, without composition rules', () => {
		expect(passwordProblem('short')).toMatch(/at least 12/);
		expect(passwordProblem('1qaz2wsx3edc')).toMatch(/common/); // in the common-password list shipped with @zxcvbn-ts/language-common
		expect(passwordProblem('qwerty123456')).toMatch(/common/);
		expect(passwordProblem('my beamwarden login')).toMatch(/product name/);
		expect(passwordProblem('aaaaaaaaaaaaaaaa')).toMatch(/repeats/);
		expect(passwordProblem('lowercase words only here')).toBeNull();
	});
});

describe('sessions [ASVS 7.2.x, 7.3.x, 7.4.x]', () => {
	it('uses a random token of at least 128 bits and stores only its SHA-256', async () => {
		const u = await makeUser();
		const s = await auth.createSession(u.id);
		// lucia's ids are base32 (5 bits per character)
		expect(s.id.length * 5).toBeGreaterThanOrEqual(128);
		const rows = await db.select().from(table.session).where(eq(table.session.userId, u.id));
		expect(rows).toHaveLength(1);
		expect(rows[0].id).not.toBe(s.id);
		expect(rows[0].id).toBe(createHash('sha256').update(s.id).digest('hex'));
		const v = await auth.validateSessionToken(s.id);
		expect(v.user?.id).toBe(u.id);
		expect(v.user).not.toHaveProperty('passwordHash');
		// the stored hash itself is not a usable token
		expect((await auth.validateSessionToken(rows[0].id)).session).toBeNull();
	});

	it('sign-out invalidates the session server-side', async () => {
		const u = await makeUser();
		const s = await auth.createSession(u.id);
		await auth.invalidateSession(s.id);
		expect((await auth.validateSessionToken(s.id)).session).toBeNull();
		expect(await db.select().from(table.session).where(eq(table.session.userId, u.id))).toHaveLength(0);
	});

	it('ends an idle session and one past the absolute timeout', async () => {
		const u = await makeUser();
		const idle = await auth.createSession(u.id);
		await db.update(table.session).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(table.session.id, auth.hashToken(idle.id)));
		expect((await auth.validateSessionToken(idle.id)).session).toBeNull();

		const old = await auth.createSession(u.id);
		const signedInLongAgo = new Date(Date.now() - auth.ABSOLUTE_TIMEOUT_MS - 60_000);
		await db.update(table.session).set({ createdAt: signedInLongAgo }).where(eq(table.session.id, auth.hashToken(old.id)));
		expect((await auth.validateSessionToken(old.id)).session).toBeNull();
		expect(await db.select().from(table.session).where(eq(table.session.id, auth.hashToken(old.id)))).toHaveLength(0);
	});

	it('ends every session of a person whose role changes, who is disabled, or whose password changes', async () => {
		const admin = await makeUser('admin');
		const u = await makeUser('researcher');
		const s1 = await auth.createSession(u.id);
		const before = must(await users.find(u.id)).person;
		expect((await users.update(admin.id, u.id, { role: 'officer', labIds: [], disabled: false, version: before.version })).ok).toBe(true);
		expect((await auth.validateSessionToken(s1.id)).session).toBeNull();

		const s2 = await auth.createSession(u.id);
		const now = must(await users.find(u.id)).person;
		await users.update(admin.id, u.id, { role: 'officer', labIds: [], disabled: true, version: now.version });
		expect((await auth.validateSessionToken(s2.id)).session).toBeNull();

		const v = await makeUser('manager');
		const s3 = await auth.createSession(v.id);
		await users.setPassword(admin.id, v.id, 'a brand new long passphrase');
		expect((await auth.validateSessionToken(s3.id)).session).toBeNull();
	});
});

describe('sign-in throttling [ASVS 6.1.1, 6.3.1]: slow the attacker, never lock the owner out', () => {
	let n = 0;
	/** A fresh documentation-range address per call, so tests never share counters. */
	const addr = () => `198.18.${Math.floor(++n / 250)}.${n % 250}.${process.pid % 100}`;
	const signedInBefore = async (u: { email: string; password: string }, address: string) => {
		const first = await users.authenticate(u.email, u.password, address);
		if (!first.ok) throw new Error('the owner could not sign in');
		return first.deviceToken;
	};

	it('locks an account at one address after repeated failures, while its owner signs in from elsewhere', async () => {
		const u = await makeUser();
		const attacker = addr();
		for (let i = 0; i < throttle.LIMITS.pair; i++) expect(await users.authenticate(u.email, 'wrong guess number ' + i, attacker)).toEqual({ ok: false, reason: 'invalid' });
		const locked = await users.authenticate(u.email, u.password, attacker);
		expect(locked).toMatchObject({ ok: false, reason: 'throttled' });
		expect(await users.authenticate(u.email, u.password, addr())).toMatchObject({ ok: true, userId: u.id });
	});

	it('a stranger at the same address (a shared proxy) trying many accounts, and the owner’s own account, never stops the browser the owner signed in from before', async () => {
		const owner = await makeUser();
		const proxy = addr();
		const device = await signedInBefore(owner, proxy);
		// spraying: one guess on each of 60 accounts, then guesses on the owner's account, all from the proxy
		// (the stranger's failures recorded as a failed authenticate records them, without 70 password hashings)
		await users.authenticate(`nobody-first-${proxy}@test.example`, 'Spring2026!', proxy);
		for (let i = 0; i < 60; i++) await throttle.recordFailure({ email: `nobody-${i}-${proxy}@test.example`, address: proxy, device: null });
		for (let i = 0; i < 10; i++) await throttle.recordFailure({ email: owner.email, address: proxy, device: null });
		// a browser that never signed in to the account waits…
		const colleague = await makeUser();
		expect(await users.authenticate(colleague.email, colleague.password, proxy)).toMatchObject({ ok: false, reason: 'throttled' });
		// …the owner's browser that signed in before does not
		expect(await users.authenticate(owner.email, owner.password, proxy, device)).toMatchObject({ ok: true, userId: owner.id });
	});

	it('failures on one account from many addresses (100 over 25) never stop the owner’s browser that signed in before; a new browser waits', async () => {
		const owner = await makeUser();
		const device = await signedInBefore(owner, addr());
		for (let a = 0; a < 25; a++) {
			const from = addr();
			for (let i = 0; i < 4; i++) await throttle.recordFailure({ email: owner.email, address: from, device: null });
		}
		expect(await users.authenticate(owner.email, owner.password, addr())).toMatchObject({ ok: false, reason: 'throttled' });
		expect(await users.authenticate(owner.email, owner.password, addr(), device)).toMatchObject({ ok: true, userId: owner.id });
	});

	it('a device cookie counts only for the account it was issued to, signed with our key; guessing with a stolen one locks that cookie alone', async () => {
		const owner = await makeUser();
		const other = await makeUser();
		const device = await signedInBefore(owner, addr());
		const [nonce, signature] = device.split('.');
		expect(await deviceCookies.verify(device, owner.email)).toBe(nonce);
		expect(await deviceCookies.verify(device, ` ${owner.email.toUpperCase()} `)).toBe(nonce);
		expect(await deviceCookies.verify(device, other.email)).toBeNull();
		expect(await deviceCookies.verify(`${nonce}x.${signature}`, owner.email)).toBeNull();
		expect(await deviceCookies.verify(`${nonce}.${signature.slice(1)}A`, owner.email)).toBeNull();
		expect(await deviceCookies.verify(`${device}.extra`, owner.email)).toBeNull();
		expect(await deviceCookies.verify(undefined, owner.email)).toBeNull();

		const thief = addr();
		for (let i = 0; i < throttle.LIMITS.device; i++) await users.authenticate(owner.email, `stolen cookie guess ${i}`, thief, device);
		expect(await users.authenticate(owner.email, owner.password, thief, device)).toMatchObject({ ok: false, reason: 'throttled' });
		// the account itself is not locked by the stolen cookie's failures
		expect(await users.authenticate(owner.email, owner.password, addr())).toMatchObject({ ok: true });
	});

	it('answers an unknown account exactly like a wrong password', async () => {
		const u = await makeUser();
		const unknown = await users.authenticate('nobody-here@test.example', 'whatever password', addr());
		const wrong = await users.authenticate(u.email, 'not the password', addr());
		expect(unknown).toEqual(wrong);
	});

	it('keeps the counters in PostgreSQL, where every app instance sees them', async () => {
		const u = await makeUser();
		const from = addr();
		await users.authenticate(u.email, 'nope nope nope', from);
		const rows = await db.select().from(table.signInThrottle).where(sql`${table.signInThrottle.key} LIKE ${'%' + u.email + '%'} OR ${table.signInThrottle.key} = ${'address:' + from}`);
		expect(rows.map((r) => r.key.split(':')[0]).sort()).toEqual(['account', 'address', 'pair']);
	});

	it('purges rows whose window and lock have passed, and keeps the ones that still count', async () => {
		const u = await makeUser();
		const longAgo = new Date(Date.now() - 2 * throttle.WINDOW_MS - throttle.LOCK_MS);
		const old = { email: u.email, address: addr(), device: null };
		for (let i = 0; i < throttle.LIMITS.pair; i++) await throttle.recordFailure(old, longAgo);
		const live = { email: u.email, address: addr(), device: null };
		await throttle.recordFailure(live);
		const keyOf = (a: { email: string; address: string }) => `pair:${a.email}|${a.address}`;
		expect(await throttle.purge()).toBeGreaterThanOrEqual(1);
		const left = (await db.select({ key: table.signInThrottle.key }).from(table.signInThrottle)).map((r) => r.key);
		expect(left).not.toContain(keyOf(old));
		expect(left).toContain(keyOf(live));
	});

	it('a completed password reset ends the account’s locks, so the owner can sign in from a new browser', async () => {
		const owner = await makeUser();
		for (let a = 0; a < 5; a++) {
			const from = addr();
			for (let i = 0; i < 5; i++) await users.authenticate(owner.email, `guess ${a}-${i}`, from);
		}
		const home = addr();
		expect(await users.authenticate(owner.email, owner.password, home)).toMatchObject({ reason: 'throttled' });
		const token = `reset-for-${owner.id}`;
		await db.insert(table.passwordReset).values({ tokenHash: createHash('sha256').update(token).digest('hex'), userId: owner.id, expiresAt: new Date(Date.now() + 60_000) });
		expect(await passwordResets.complete(token, 'a brand new passphrase 4040')).toEqual({ ok: true });
		expect(await users.authenticate(owner.email, 'a brand new passphrase 4040', home)).toMatchObject({ ok: true });
	});
});

describe('password reset requests [ASVS 6.3.x]: the same work for every address, limited per client and per account', () => {
	let n = 0;
	const addr = () => `198.19.${Math.floor(++n / 250)}.${n % 250}`;
	const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

	it('writes the same for a known and an unknown address (one request row, no link yet); the mail job links only the active account', async () => {
		const u = await makeUser();
		const links = () => db.$count(table.passwordReset, eq(table.passwordReset.userId, u.id));
		const mails = () => db.$count(table.mailOutbox, eq(table.mailOutbox.kind, 'password.reset'));
		const [linksBefore, mailsBefore] = [await links(), await mails()];
		expect(await passwordResets.request(u.email, addr())).toEqual({ ok: true });
		expect(await passwordResets.request(`nobody-${u.id}@test.example`, addr())).toEqual({ ok: true });
		expect([await links(), await mails()]).toEqual([linksBefore, mailsBefore]);
		const rows = await db.select().from(table.passwordResetRequest).where(sql`${table.passwordResetRequest.email} IN (${u.email}, ${`nobody-${u.id}@test.example`})`);
		expect(rows).toHaveLength(2);
		expect(rows.every((r) => r.processedAt === null)).toBe(true);
		await passwordResets.processRequests();
		expect([await links(), await mails()]).toEqual([linksBefore + 1, mailsBefore + 1]);
		expect(await db.$count(table.passwordResetRequest, isNull(table.passwordResetRequest.processedAt))).toBe(0);
	});

	it('takes as long for a known address as for an unknown one', async () => {
		const u = await makeUser();
		const known: number[] = [];
		const unknown: number[] = [];
		const time = async (email: string) => {
			const t = performance.now();
			await passwordResets.request(email, addr());
			return performance.now() - t;
		};
		for (let i = 0; i < 30; i++) {
			const k = await time(u.email);
			const x = await time(`unknown-${i}-${u.id}@test.example`);
			if (i >= 5) [known.push(k), unknown.push(x)];
		}
		const ratio = median(known) / median(unknown);
		expect(ratio, `known ${median(known).toFixed(2)} ms, unknown ${median(unknown).toFixed(2)} ms`).toBeGreaterThan(0.6);
		expect(ratio, `known ${median(known).toFixed(2)} ms, unknown ${median(unknown).toFixed(2)} ms`).toBeLessThan(1.6);
	});

	it('answers 429 after 10 requests an hour from one client address, whichever accounts they name', async () => {
		const from = addr();
		for (let i = 0; i < passwordResets.MAX_PER_ADDRESS_PER_HOUR; i++) expect(await passwordResets.request(`spray-${i}-${from}@test.example`, from)).toEqual({ ok: true });
		expect(await passwordResets.request('one-more@test.example', from)).toMatchObject({ ok: false, status: 429 });
		expect(await passwordResets.request('one-more@test.example', addr())).toEqual({ ok: true });
	});

	it('mails at most 3 links an hour to one account, however many addresses ask; the answer never changes', async () => {
		const u = await makeUser();
		for (let i = 0; i < 8; i++) expect(await passwordResets.request(u.email, addr())).toEqual({ ok: true });
		await passwordResets.processRequests();
		expect(await db.$count(table.passwordReset, eq(table.passwordReset.userId, u.id))).toBe(passwordResets.MAX_LINKS_PER_ACCOUNT_PER_HOUR);
	});

	it('two mail jobs at once never take the same request', async () => {
		const people = await Promise.all([makeUser(), makeUser(), makeUser(), makeUser()]);
		for (const p of people) await passwordResets.request(p.email, addr());
		const [a, b] = await Promise.all([passwordResets.processRequests(), passwordResets.processRequests()]);
		expect(a.linked + b.linked).toBe(4);
		for (const p of people) expect(await db.$count(table.passwordReset, eq(table.passwordReset.userId, p.id))).toBe(1);
	});

	it('forgets requests older than a day', async () => {
		const from = addr();
		await passwordResets.request('old-request@test.example', from, new Date(Date.now() - 25 * 3600_000));
		expect(await passwordResets.purgeRequests()).toBeGreaterThanOrEqual(1);
		expect(await db.$count(table.passwordResetRequest, eq(table.passwordResetRequest.address, from))).toBe(0);
	});
});

describe('people, labs and the audit log', () => {
	it('refuses a stale save with 409 and keeps the first one', async () => {
		const admin = await makeUser('admin');
		const u = await makeUser();
		const { version } = must(await users.find(u.id)).person;
		expect((await users.update(admin.id, u.id, { role: 'manager', labIds: [], disabled: false, version })).ok).toBe(true);
		const stale = await users.update(admin.id, u.id, { role: 'officer', labIds: [], disabled: false, version });
		expect(stale).toMatchObject({ ok: false, status: 409 });
		expect(must(await users.find(u.id)).person.role).toBe('manager');
	});

	it('writes nothing when part of the input is bad', async () => {
		const before = await db.$count(table.user);
		const r = await users.create(null, {
			name: 'Half Saved',
			email: 'half-saved@test.example',
			role: 'researcher',
			labIds: ['00000000-0000-4000-8000-000000000000'],
			password: 'a perfectly fine passphrase'
		});
		expect(r).toMatchObject({ ok: false, status: 400 });
		expect(await db.$count(table.user)).toBe(before);
	});

	it('records who changed what, before and after', async () => {
		const admin = await makeUser('admin');
		const lab = await makeLab();
		const u = await makeUser();
		const { version } = must(await users.find(u.id)).person;
		await users.update(admin.id, u.id, { role: 'researcher', labIds: [lab.id], disabled: false, version });
		const [entry] = await db.select().from(table.auditLog).where(sql`${table.auditLog.entityId} = ${u.id} AND ${table.auditLog.action} = 'user.update'`);
		expect(entry.actorId).toBe(admin.id);
		expect(entry.before).toMatchObject({ labIds: [] });
		expect(entry.after).toMatchObject({ labIds: [lab.id] });
	});

	it('keeps the audit log append-only for the app’s database role', async () => {
		const u = await makeUser();
		const denied = (q: Promise<unknown>) =>
			q.then(
				() => 'allowed',
				(e: { cause?: { code?: string } }) => e.cause?.code // 42501 = insufficient_privilege
			);
		expect(await denied(db.execute(sql`UPDATE audit_log SET action = 'tampered' WHERE entity_id = ${u.id}`))).toBe('42501');
		expect(await denied(db.execute(sql`DELETE FROM audit_log WHERE entity_id = ${u.id}`))).toBe('42501');
		expect(await denied(db.execute(sql`TRUNCATE audit_log`))).toBe('42501');
		expect(await db.$count(table.auditLog, eq(table.auditLog.entityId, u.id))).toBe(1);
	});
});

describe('the last active administrator', () => {
	it('cannot be demoted or disabled, so the register never loses its administration', async () => {
		const a = await makeUser('admin');
		const b = await makeUser('admin');
		// Only a and b are active administrators from here on (files run one after another).
		await db.execute(sql`UPDATE "user" SET disabled = true WHERE role = 'admin' AND id NOT IN (${a.id}, ${b.id})`);
		const version = async (id: string) => must(await users.find(id)).person.version;
		expect((await users.update(a.id, b.id, { role: 'admin', labIds: [], disabled: true, version: await version(b.id) })).ok).toBe(true);
		const demote = await users.update(b.id, a.id, { role: 'officer', labIds: [], disabled: false, version: await version(a.id) });
		expect(demote).toMatchObject({ ok: false, status: 409 });
		expect(must(await users.find(a.id)).person.role).toBe('admin');
	});
});

describe('password reset links', () => {
	it('using one link, or an administrator setting the password, ends every other link of the person', async () => {
		const u = await makeUser('researcher');
		const sha = (t: string) => createHash('sha256').update(t).digest('hex');
		const expiresAt = new Date(Date.now() + 30 * 60_000);
		const link = async (t: string) => db.insert(table.passwordReset).values({ tokenHash: sha(t), userId: u.id, expiresAt });
		await link('first-link-token');
		await link('second-link-token');
		expect(await passwordResets.complete('first-link-token', 'a fresh and long passphrase 1')).toEqual({ ok: true });
		expect(await passwordResets.isUsable('second-link-token')).toBe(false);
		expect(await passwordResets.complete('second-link-token', 'another long passphrase 22')).toMatchObject({ ok: false, status: 400 });

		await link('third-link-token');
		await users.setPassword(null, u.id, 'set by an administrator 333');
		expect(await passwordResets.isUsable('third-link-token')).toBe(false);
	});
});
