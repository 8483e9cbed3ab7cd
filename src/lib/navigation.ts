import type { IconName } from '$lib/components/Icon.svelte';
import type { Role } from '$lib/roles';
import { abilities } from '$lib/abilities';

export type NavItem = { href: string; label: string; icon: IconName; roles?: readonly Role[] };

export const navigation: NavItem[] = [
	{ href: '/overview', label: 'Overview', icon: 'home' },
	{ href: '/lasers', label: 'Register', icon: 'beam' },
	{ href: '/reviews', label: 'Review desk', icon: 'scale' },
	{ href: '/inspections', label: 'Inspection rota', icon: 'calendar' },
	{ href: '/eyewear', label: 'Eyewear store', icon: 'eye' },
	{ href: '/training', label: 'Training', icon: 'badge' },
	{ href: '/incidents', label: 'Incidents', icon: 'flag' },
	{ href: '/procedures', label: 'Procedures', icon: 'page' },
	{ href: '/authorisations', label: 'Authorisations', icon: 'key' },
	{ href: '/limits', label: 'Limit library', icon: 'list' },
	{ href: '/admin/users', label: 'People and labs', icon: 'people', roles: abilities.administer },
	{ href: '/admin/mail', label: 'Sent mail', icon: 'list', roles: abilities.administer }
];
