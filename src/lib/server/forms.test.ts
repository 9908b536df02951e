import { describe, expect, it } from 'vitest';
import { safeValues } from './forms';

describe('safeValues', () => {
	it('echoes what the user typed except passwords and secrets', () => {
		const form = new FormData();
		form.set('email', 'a@b.example');
		form.set('password', 'hunter2-hunter2');
		form.set('newPassword', 'another-one-here');
		form.set('token', 'frt_x');
		expect(safeValues(form)).toEqual({ email: 'a@b.example' });
	});
});
