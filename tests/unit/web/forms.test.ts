import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formMessage, parseForm, safeValues } from '$lib/server/web/forms';

const post = (fields: Record<string, string>) =>
	new Request('http://app.example/', { method: 'POST', body: new URLSearchParams(fields) });

describe('safeValues', () => {
	it('echoes what the user typed except passwords and secrets', () => {
		const form = new FormData();
		form.set('email', 'a@b.example');
		form.set('password', 'hunter2-hunter2');
		form.set('newPassword', 'another-one-here');
		form.set('token', 'frt_x');
		form.set('pwd', 'short-name-pw');
		form.set('passphrase', 'a passphrase here');
		expect(safeValues(form)).toEqual({ email: 'a@b.example' });
	});

	it('never echoes a password typed again in a box of another name', () => {
		const form = new FormData();
		form.set('password', 'granite-ladder-orbit-47');
		form.set('confirm', 'granite-ladder-orbit-47');
		form.set('repeat', 'granite-ladder-orbit-47');
		form.set('note', 'kept');
		expect(safeValues(form)).toEqual({ note: 'kept' });
	});

	it('with a field list, echoes only those fields', () => {
		const form = new FormData();
		form.set('email', 'a@b.example');
		form.set('anything', 'posted by hand');
		expect(safeValues(form, ['email'])).toEqual({ email: 'a@b.example' });
	});
});

describe('parseForm and formMessage', () => {
	const schema = z.object({ email: z.string().email(), password: z.string().min(12) });

	it('a refused form echoes only its own non-secret fields (a failed password reset echoes no password)', async () => {
		const parsed = await parseForm(
			post({ email: 'a@b.example', password: 'short', confirm: 'short', extra: 'x' }),
			schema
		);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		expect(parsed.failure.data.values).toEqual({ email: 'a@b.example' });
	});

	it('a valid form gives values for formMessage without secrets or unknown fields', async () => {
		const parsed = await parseForm(
			post({
				email: 'a@b.example',
				password: 'granite-ladder-orbit-47',
				again: 'granite-ladder-orbit-47'
			}),
			schema
		);
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		const failure = formMessage(400, parsed.values, 'Link used.');
		expect(failure.status).toBe(400);
		expect(failure.data).toEqual({
			errors: {},
			values: { email: 'a@b.example' },
			message: 'Link used.'
		});
		expect(JSON.stringify(formMessage(400, parsed.form, 'x').data)).not.toContain('granite');
	});
});
