import { z } from 'zod';

export const newTokenSchema = z.object({
	name: z
		.string({ error: 'Name is required' })
		.trim()
		.min(2, 'Name needs at least 2 characters')
		.max(80, 'Name is at most 80 characters')
});

export const revokeTokenSchema = z.object({ id: z.coerce.number().int().positive('Unknown token') });
