import { z } from 'zod';
import { ROLES } from '$lib/words';
import { newPasswordSchema } from './passwordRules';

export const emailSchema = z
	.string()
	.trim()
	.toLowerCase()
	.max(254, 'That address is too long.')
	.pipe(z.email('Enter an e-mail address such as name@example.com.'));

export const displayNameSchema = z
	.string()
	.trim()
	.min(1, 'Enter your name.')
	.max(120, 'Use at most 120 characters.');

export const roleSchema = z.enum(ROLES, 'Choose one of the roles.');

export const signInSchema = z.object({
	email: emailSchema,
	// Not the new-password rules: an old account's password must still be accepted here.
	password: z.string().min(1, 'Enter your password.').max(200, 'That password is too long.')
});

export const signUpSchema = z.object({
	displayName: displayNameSchema,
	email: emailSchema,
	organisationName: z
		.string()
		.trim()
		.min(2, 'Enter the name of your organisation.')
		.max(160, 'Use at most 160 characters.'),
	password: newPasswordSchema
});

export const changePasswordSchema = z.object({
	currentPassword: z.string().min(1, 'Enter your current password.').max(200),
	newPassword: newPasswordSchema
});

export const resetPasswordSchema = z.object({ password: newPasswordSchema });

export const inviteSchema = z.object({ email: emailSchema, role: roleSchema });

export const acceptInvitationSchema = z.object({
	displayName: displayNameSchema,
	password: newPasswordSchema
});
