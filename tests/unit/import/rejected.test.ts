import { describe, expect, it } from 'vitest';
import { RejectedRows } from '$lib/server/import/rejected';

describe('the rejected rows download', () => {
	it('goes through the one CSV guard: a cell "x;=1+1" is quoted and its formula piece neutralised', () => {
		const rejected = new RejectedRows();
		rejected.add(4, 'cover.not-a-number', 'cover "abc" is not a number', ['D-01', 'abc', 'x;=1+1']);
		rejected.add(5, 'cover.not-a-number', 'cover "=1" is not a number', ['D-01', '=1', '']);
		expect(rejected.toCsv(['Member', 'Cover', 'Note'])).toBe(
			'row,reason,Member,Cover,Note\r\n' +
				`4,"cover ""abc"" is not a number",D-01,abc,"x;'=1+1"\r\n` +
				`5,"cover ""=1"" is not a number",D-01,'=1,\r\n`
		);
	});
});
