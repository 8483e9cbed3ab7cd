import { requireUser } from '$lib/server/auth/guard';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => {
	const user = requireUser(locals);
	return { user: { id: user.id, name: user.name, role: user.role } };
};
