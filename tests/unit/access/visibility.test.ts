import { describe, expect, it } from 'vitest';
import { NotFoundError } from '$lib/server/domainErrors';
import { ownRecord } from '$lib/server/access/visibility';
import { loadOr404 } from '$lib/server/web/pages';

const actor = { userId: 1, organisationId: 7, role: 'engineer' as const };

describe('ownRecord', () => {
	it('passes a record of the actor’s organisation and answers 404 for any other', async () => {
		const own = { id: 3, organisationId: 7 };
		expect(ownRecord(own, actor)).toBe(own);
		expect(() => ownRecord({ id: 4, organisationId: 8 }, actor)).toThrow(NotFoundError);
		expect(() => ownRecord(null, actor)).toThrow(NotFoundError);
		// The route layer answers it with 404.
		for (const record of [{ id: 4, organisationId: 8 }, null]) {
			await expect(loadOr404(async () => ownRecord(record, actor))).rejects.toThrow(
				expect.objectContaining({ status: 404 })
			);
		}
	});
});
