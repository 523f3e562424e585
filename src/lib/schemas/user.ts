/** Forms for sign-in and user administration, shared by the pages and the server actions. */
import { z } from 'zod';
import { ROLES } from '../roles.ts';

export const email = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.max(254, 'An e-mail address has at most 254 characters.')
	.pipe(z.email({ error: 'Enter a valid e-mail address, such as name@example.com.' }));

export const newPassword = z
	.string({ error: 'Enter a password.' })
	.min(10, 'Use at least 10 characters.')
	.max(200, 'Use at most 200 characters.');

export const signInForm = z.object({
	email: z
		.string({ error: 'Enter your e-mail address.' })
		.trim()
		.min(1, 'Enter your e-mail address.')
		.max(254, 'That is too long for an e-mail address.'),
	password: z
		.string({ error: 'Enter your password.' })
		.min(1, 'Enter your password.')
		.max(200, 'That is too long for a password.')
});

const role = z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}.` });
const siteIds = z.array(z.string().min(1).max(64)).max(100, 'Too many sites.');

export const createUserForm = z.object({
	name: z
		.string({ error: 'Enter a name.' })
		.trim()
		.min(2, 'Enter the full name (at least 2 characters).')
		.max(100, 'Use at most 100 characters.'),
	email,
	role,
	password: newPassword,
	siteIds
});

export const updateUserForm = z.object({
	id: z.string().min(1).max(64),
	role,
	siteIds
});

export const userIdForm = z.object({ id: z.string().min(1, 'Missing user.').max(64) });

export const resetPasswordForm = z.object({ id: z.string().min(1).max(64), password: newPassword });
