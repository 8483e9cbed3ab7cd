// The one role guard. Pages, actions and API routes call these; handleGuard uses them too.
import { error } from '@sveltejs/kit';
import { roleLabels, type Role } from '$lib/roles';
import { abilities, can, type Ability } from '$lib/abilities';
import type { SessionUser } from './session';

const roleName = (r: Role) => roleLabels[r].toLowerCase();

export function requireUser(locals: App.Locals): SessionUser {
	if (!locals.user) error(401, { message: 'Sign in to continue.' });
	return locals.user;
}

/** The signed-in user when the written abilities let them do this; 403 naming the role needed otherwise. */
export function requireAbility(locals: App.Locals, ability: Ability): SessionUser {
	const user = requireUser(locals);
	if (!can(user, ability)) error(403, forbidden(user.role, abilities[ability]));
	return user;
}

export function forbidden(role: Role, allowed: readonly Role[]): App.Error {
	const needed = allowed.length ? allowed.map(roleName).join(' or ') : 'no role (read only)';
	return {
		message: allowed.length
			? `This needs the ${needed} role. You are signed in as ${roleName(role)}.`
			: 'This page cannot be changed here.',
		missing: [...allowed]
	};
}
