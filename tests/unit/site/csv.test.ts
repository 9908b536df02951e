import { describe, expect, it } from 'vitest';
import { refusedCsv } from '../../../src/lib/site/csv';
import type { SiteEntry } from '../../../src/lib/site/queue';

const base = {
	surveyId: 1,
	memberId: 2,
	memberLabel: 'W-01',
	createdAt: 0,
	state: 'refused' as const,
	batchId: null,
	refusal: 'The survey is submitted: its readings are frozen.'
};

describe('refused site entries as CSV', () => {
	it('writes one line per entry with its reason, quoting commas and formula starts', () => {
		const entries: SiteEntry[] = [
			{
				...base,
				clientId: 'a',
				kind: 'reading',
				data: {
					x: '-10',
					y: '20',
					cover: '31.5',
					diameter: '20',
					direction: 'x',
					note: 'by, joint'
				}
			},
			{
				...base,
				clientId: 'b',
				kind: 'hole',
				data: {
					label: 'H1',
					xMm: '',
					yMm: '',
					meterReadingMm: '31',
					measuredCoverMm: '33.5',
					method: 'drilled'
				}
			},
			{
				...base,
				clientId: 'c',
				kind: 'reading',
				data: { x: '', y: '', cover: '28', diameter: '', direction: '', note: '=HYPERLINK("x")' }
			}
		];
		// RFC 4180 quoting, CRLF lines; a leading = gets an apostrophe so a spreadsheet shows it as
		// text (OWASP "CSV Injection"; src/lib/csv.ts), while a negative x stays a number.
		expect(refusedCsv(entries).split('\r\n')).toEqual([
			'member,kind,x,y,cover,diameter,direction,note,reason',
			'W-01,reading,-10,20,31.5,20,x,"by, joint",The survey is submitted: its readings are frozen.',
			'W-01,hole,,,31,,,"hole H1: measured 33.5 mm, drilled",The survey is submitted: its readings are frozen.',
			'W-01,reading,,,28,,,"\'=HYPERLINK(""x"")",The survey is submitted: its readings are frozen.',
			''
		]);
	});
});
