import { describe, expect, it } from 'vitest';
import { newPasswordSchema } from '$lib/server/auth/passwordRules';
const message = (password: string) =>
	newPasswordSchema.safeParse(password).error?.issues[0]?.message ?? null;

describe('newPasswordSchema', () => {
	it('wants at least 12 characters', () => {
		expect(message('short-one')).toBe('Use at least 12 characters.');
	});

	it('refuses entries of the common-password list and their near variants', () => {
		for (const common of ['qwerty123456', 'password1234', '123456789012', 'abcdefghijkl']) {
			expect(message(common), common).toMatch(/commonly used passwords/);
		}
	});

	it('accepts a long passphrase', () => {
		expect(message('granite-ladder-orbit-47')).toBeNull();
		expect(message('cover-check-demo-2026')).toBeNull();
	});
});
