/** Roles a Stillpoint user can hold; shared by server and browser code. */
export const ROLES = ['admin', 'technician', 'supervisor', 'client'] as const;
export type Role = (typeof ROLES)[number];

/** Lab staff see every case; clients see only the cases they are members of. */
export const STAFF_ROLES: readonly Role[] = ['admin', 'technician', 'supervisor'];

export const ROLE_LABELS: Record<Role, string> = {
	admin: 'Administrator',
	technician: 'Technician',
	supervisor: 'Supervisor',
	client: 'Client'
};

export interface SessionUser {
	id: number;
	name: string;
	email: string;
	role: Role;
}
