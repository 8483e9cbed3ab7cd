// Shared by client and server: the four roles of the register.
export const roles = ['researcher', 'officer', 'manager', 'admin'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
	researcher: 'Researcher',
	officer: 'Laser safety officer',
	manager: 'Facility manager',
	admin: 'Administrator'
};
