import { dictionary } from '@zxcvbn-ts/language-common';
import { Argon2id } from 'oslo/password';

// oslo's wrapper: Argon2id, m = 19456 KiB, t = 2, p = 1, NFKC-normalised input.
const argon2id = new Argon2id();

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 256;

const common = new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));

export function hashPassword(password: string): Promise<string> {
	return argon2id.hash(password);
}

export function verifyPassword(hash: string, password: string): Promise<boolean> {
	return argon2id.verify(hash, password);
}

/** Why a new password is refused, or null. No composition rules: length and known-bad lists only. */
export function passwordProblem(password: string, context: string[] = []): string | null {
	const length = [...password].length;
	if (length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
	if (length > PASSWORD_MAX_LENGTH) return `Use at most ${PASSWORD_MAX_LENGTH} characters.`;
	const lower = password.toLowerCase();
	if (common.has(lower)) return 'This password is on a list of common passwords; choose another.';
	const words = ['beamwarden', ...context.map((c) => c.toLowerCase()).filter((c) => c.length >= 4)];
	if (words.some((w) => lower.includes(w)))
		return 'The password must not contain the product name or your own name or e-mail.';
	if (new Set(password).size < 4) return 'This password repeats too few characters; choose another.';
	return null;
}

let dummyHash: Promise<string> | undefined;
/** Spend the same time on unknown accounts as on known ones. */
export async function burnVerification(password: string): Promise<void> {
	dummyHash ??= argon2id.hash('not-a-real-account-password');
	await argon2id.verify(await dummyHash, password);
}
