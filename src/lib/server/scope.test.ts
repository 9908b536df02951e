import { describe, expect, it } from 'vitest';
import { ownRecord } from './scope';

const actor = { userId: 1, organisationId: 7, role: 'engineer' as const };

describe('ownRecord', () => {
	it('passes a record of the actor’s organisation and answers 404 for any other', () => {
		const own = { id: 3, organisationId: 7 };
		expect(ownRecord(own, actor)).toBe(own);
		expect(() => ownRecord({ id: 4, organisationId: 8 }, actor)).toThrow(
			expect.objectContaining({ status: 404 })
		);
		expect(() => ownRecord(null, actor)).toThrow(expect.objectContaining({ status: 404 }));
	});
});
