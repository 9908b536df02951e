import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { sniffFormat } from '$lib/server/import/sniff';

describe('the format of an uploaded file, from its bytes', () => {
	it('names UTF-16 text with a byte-order mark as UTF-16 text, not as an audio file', async () => {
		const csv = 'Member,X,Y,Cover\r\nM-01,0,0,31.5\r\n';
		for (const encoding of ['utf-16le', 'utf-16be']) {
			const bytes = iconv.encode(csv, encoding, { addBOM: true });
			const refusal = sniffFormat(bytes, 'readings.csv');
			await expect(refusal).rejects.toThrow(
				/This file is text in UTF-16 .*Save it again as "CSV UTF-8"/
			);
			await expect(refusal).rejects.not.toThrow(/audio|mpeg/);
		}
	});

	it('says an empty file is empty, with its size', async () => {
		await expect(sniffFormat(new Uint8Array(0), 'readings.csv')).rejects.toThrow(
			'The file is empty (0 bytes): it holds no readings.'
		);
	});

	it('still reads UTF-8 with its byte-order mark as text', async () => {
		const bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('Member,Cover\n')]);
		expect(await sniffFormat(bytes, 'readings.csv')).toBe('csv');
	});
});
