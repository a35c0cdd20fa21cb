/** User schemas shared by the admin forms, the JSON API and the seed. */
import { z } from 'zod';
import { ROLES } from '../roles';

export const roleSchema = z.enum(ROLES, { error: 'Role is admin, technician, supervisor or client' });

export const newUserSchema = z.object({
	name: z.string({ error: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(120),
	email: z.email({ error: 'Enter a valid e-mail address' }).trim().toLowerCase().max(254),
	role: roleSchema,
	password: z
		.string({ error: 'Password is required' })
		.min(12, 'Password needs at least 12 characters')
		.max(128, 'Password is at most 128 characters')
});
export type NewUser = z.infer<typeof newUserSchema>;

export const setRoleSchema = z.object({ role: roleSchema });

export const signInSchema = z.object({
	email: z.email({ error: 'Enter a valid e-mail address' }).trim().toLowerCase().max(254),
	password: z.string().min(1, 'Enter your password').max(128)
});
