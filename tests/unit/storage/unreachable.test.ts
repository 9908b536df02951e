import { describe, expect, it } from 'vitest';
import { isStorageUnreachable } from '$lib/server/storage/unreachable';

const withCode = (code: string) => Object.assign(new Error(`connect ${code}`), { code });

describe('isStorageUnreachable', () => {
	it('counts socket errors, the client timeout and 5xx answers as storage being down', () => {
		expect(isStorageUnreachable(withCode('ECONNREFUSED'))).toBe(true);
		expect(isStorageUnreachable(withCode('ECONNRESET'))).toBe(true);
		expect(isStorageUnreachable(Object.assign(new Error('slow'), { name: 'TimeoutError' }))).toBe(
			true
		);
		const both = new AggregateError([withCode('ECONNREFUSED'), withCode('ECONNREFUSED')]);
		expect(isStorageUnreachable(both)).toBe(true);
		const slowDown = Object.assign(new Error('SlowDown'), { $metadata: { httpStatusCode: 503 } });
		expect(isStorageUnreachable(slowDown)).toBe(true);
	});

	it('leaves 4xx answers and other errors alone: they are not an outage', () => {
		const noBucket = Object.assign(new Error('NoSuchBucket'), {
			$metadata: { httpStatusCode: 404 }
		});
		expect(isStorageUnreachable(noBucket)).toBe(false);
		expect(isStorageUnreachable(withCode('ENOENT'))).toBe(false);
		expect(isStorageUnreachable(new Error('bad'))).toBe(false);
		expect(isStorageUnreachable(undefined)).toBe(false);
	});
});
