import { describe, expect, it } from 'vitest';
import {
	GoneError,
	InputError,
	NotFoundError,
	ReadOnlyError,
	StateError
} from '$lib/server/domainErrors';
import { loadOr404 } from '$lib/server/web/pages';
import { api } from '$lib/server/web/respond';

/** Each domain error and the status the route layer answers it with (docs/security.md, DEVELOPERS.md "Errors"). */
const CASES: [Error, number, string][] = [
	[new NotFoundError('The assessment'), 404, 'not_found'],
	[new ReadOnlyError('Shared read-only.'), 403, 'read_only'],
	[new StateError('Only a draft can be approved.'), 409, 'conflict'],
	[new GoneError('This link has expired.'), 410, 'gone'],
	[
		new InputError('Survey 9 is not a survey of this asset.', { surveys: ['x'] }),
		400,
		'invalid_input'
	]
];

describe('the route layer answers domain errors', () => {
	for (const [err, status, code] of CASES) {
		it(`${err.name} is a ${status} page and a ${status} '${code}' API error, words kept`, async () => {
			await expect(loadOr404(() => Promise.reject(err))).rejects.toMatchObject({
				status,
				body: { message: err.message }
			});
			await expect(api(() => Promise.reject(err))).rejects.toMatchObject({
				status,
				body: { message: err.message, code }
			});
		});
	}

	it('a NotFoundError may carry fixed words (a shared link that is not valid)', () => {
		expect(new NotFoundError('The link', 'This link is not valid.').message).toBe(
			'This link is not valid.'
		);
		expect(new NotFoundError('The assessment').message).toBe('The assessment was not found.');
	});

	it('passes on what it does not expect', async () => {
		const unexpected = new Error('disk on fire');
		await expect(loadOr404(() => Promise.reject(unexpected))).rejects.toBe(unexpected);
		await expect(api(() => Promise.reject(unexpected))).rejects.toBe(unexpected);
	});
});
