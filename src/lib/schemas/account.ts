import { z } from 'zod';
import { ROLES } from '../permissions';

const email = z
	.string()
	.trim()
	.min(1, 'Enter your e-mail address.')
	.max(254, 'That e-mail address is too long.')
	.email('Enter an e-mail address like name@example.com.');

const newPassword = z
	.string()
	.min(10, 'Use at least 10 characters.')
	.max(256, 'Use at most 256 characters.');

export const signInSchema = z.object({
	email,
	password: z.string().min(1, 'Enter your password.').max(256, 'That password is too long.')
});

export const signUpSchema = z.object({
	name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
	email,
	password: newPassword
});

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z
	.object({ password: newPassword, confirm: z.string() })
	.refine((v) => v.password === v.confirm, { message: 'The two passwords do not match.', path: ['confirm'] });

export const changePasswordSchema = z
	.object({ current: z.string().min(1, 'Enter your current password.').max(256, 'That password is too long.'), password: newPassword, confirm: z.string() })
	.refine((v) => v.password === v.confirm, { message: 'The two passwords do not match.', path: ['confirm'] });

export const farmNameSchema = z.object({
	name: z.string().trim().min(1, 'Give the farm a name.').max(120, 'Use at most 120 characters.')
});

export const inviteSchema = z.object({
	email,
	role: z.enum(ROLES, { message: 'Choose a role.' }).default('crew')
});

export const roleChangeSchema = z.object({
	userId: z.string().uuid('Unknown member.'),
	role: z.enum(ROLES, { message: 'Choose a role.' })
});
