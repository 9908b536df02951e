import { describe, expect, it } from 'vitest';
import {
	suggestMapping,
	suggestUnits,
	unitInHeader,
	type ColumnMapping,
	type ImportOptions
} from '$lib/server/import/mapping';
import { createRowValidator, readingSchema } from '$lib/server/import/validateRow';

const mapping: ColumnMapping = {
	memberLabel: 0,
	x: 1,
	y: 2,
	cover: 3,
	diameter: 4,
	spacing: null,
	direction: 5,
	note: null
};
const options = {
	units: 'mm',
	columnUnits: {},
	failingRows: 'import-valid',
	coverMaxMm: 300,
	acceptSmallCovers: false,
	fixedMemberLabel: null,
	encoding: 'utf-8',
	delimiter: ',',
	decimalMark: '.',
	headerRowIndex: 0
} as ImportOptions;
const members = new Map([['d-01', 11]]);

/** The schema's own verdict on a row's values, run fresh each time: what the validator must say. */
function zodVerdict(values: Record<string, unknown>) {
	const parsed = readingSchema(options.coverMaxMm)
		.partial({ barSpacingMm: true, note: true })
		.safeParse(values);
	if (parsed.success) return null;
	const issue = parsed.error.issues[0];
	return { code: `${String(issue.path[0])}.${issue.code}`, reason: issue.message };
}

const withoutLabel = ({ memberLabel: _label, ...rest }: Record<string, unknown>) => rest;

describe('checking a row of an import', () => {
	it('a spreadsheet error value in the cover (#DIV/0!) is named as such, not as an empty cover', () => {
		const validate = createRowValidator(mapping, options, members);
		const result = validate(['D-01', '0', '0', '#DIV/0!', '12', 'top']);
		expect(result).toEqual({
			ok: false,
			code: 'cover.spreadsheet-error',
			reason:
				'cover holds the spreadsheet error #DIV/0! (a formula that failed in the spreadsheet), not a number'
		});
		expect(validate(['D-01', '#N/A', '0', '30', '12', 'top'])).toMatchObject({
			ok: false,
			reason: expect.stringMatching(/^x holds the spreadsheet error #N\/A/)
		});
	});

	it('gives zod’s answer for every row, the first time a value is seen and every time after', () => {
		const validate = createRowValidator(mapping, options, members);
		// Values on both sides of each limit, repeated so that remembered answers are used.
		const covers = ['-0.1', '0', '45.5', '300', '300.1'];
		const diameters = ['', '0.5', '1', '16', '100', '101'];
		const directions = ['', 'top', 'a direction far too long'];
		for (let pass = 0; pass < 2; pass++)
			for (const cover of covers)
				for (const diameter of diameters)
					for (const direction of directions) {
						const cells = ['D-01', '100', '200', cover, diameter, direction];
						const values = {
							memberLabel: 'D-01',
							xMm: 100,
							yMm: 200,
							coverMm: Number(cover),
							barDiameterMm: diameter === '' ? null : Number(diameter),
							barDirection: direction || null
						};
						const expected = zodVerdict(values);
						const result = validate(cells);
						if (expected === null) {
							expect(result).toEqual({
								ok: true,
								reading: { ...withoutLabel(values), memberId: 11, barSpacingMm: null, note: null }
							});
						} else {
							expect(result).toEqual({ ok: false, ...expected });
						}
					}
	});

	it('names the cell that is not a number before any range, and an unknown member after', () => {
		const validate = createRowValidator(mapping, options, members);
		expect(validate(['D-01', 'ten', '0', '500', '', ''])).toEqual({
			ok: false,
			code: 'x.not-a-number',
			reason: 'x "ten" is not a number'
		});
		expect(validate(['D-01', '0', '0', '500', '', ''])).toMatchObject({
			ok: false,
			code: 'coverMm.too_big'
		});
		expect(validate(['d-01 ', '0', '0', '40', '', ''])).toMatchObject({
			ok: true,
			reading: { memberId: 11 }
		});
		expect(validate(['D-99', '0', '0', '40', '', ''])).toMatchObject({
			ok: false,
			code: 'member.unknown'
		});
		expect(validate(['D-01', '0', '0'])).toMatchObject({ ok: false, code: 'width' });
	});

	it('converts inches to mm before the limits are checked (1 in = 25.4 mm)', () => {
		const validate = createRowValidator(mapping, { ...options, units: 'inch' }, members);
		expect(validate(['D-01', '1', '2', '2', '', ''])).toMatchObject({
			ok: true,
			reading: { xMm: 25.4, yMm: 50.8, coverMm: 50.8 }
		});
		// 12 in = 304.8 mm, above the 300 mm limit.
		expect(validate(['D-01', '1', '2', '12', '', ''])).toMatchObject({ code: 'coverMm.too_big' });
	});

	it('reads each length column in its own unit: positions in metres beside covers in mm', () => {
		const validate = createRowValidator(
			mapping,
			{ ...options, columnUnits: { x: 'm', y: 'm', diameter: 'mm' } },
			members
		);
		// 1.25 m = 1250 mm; 0.035 m must be 35 mm exactly, not 35.00000000000001.
		expect(validate(['D-01', '1.25', '0.035', '31.5', '12', ''])).toMatchObject({
			ok: true,
			reading: { xMm: 1250, yMm: 35, coverMm: 31.5, barDiameterMm: 12 }
		});
		const inchCover = createRowValidator(
			mapping,
			{ ...options, columnUnits: { cover: 'inch' } },
			members
		);
		expect(inchCover(['D-01', '1', '2', '1.5', '', ''])).toMatchObject({
			reading: { xMm: 1, yMm: 2, coverMm: 38.1 }
		});
	});
});

describe('the unit a header names', () => {
	it('takes "Position (m)" as metres, not millimetres', () => {
		const headers = ['Member', 'Position (m)', 'Height [m]', 'Cover (mm)', 'Bar dia (in)'];
		const suggested = suggestMapping(headers);
		expect(suggested).toMatchObject({ memberLabel: 0, x: 1, y: 2, cover: 3, diameter: 4 });
		expect(suggestUnits(headers, suggested)).toEqual({
			x: 'm',
			y: 'm',
			cover: 'mm',
			diameter: 'inch'
		});
	});

	it('names no unit where the header names none, and does not take "mm" or "member" as m', () => {
		expect(unitInHeader('Cover')).toBeNull();
		expect(unitInHeader('Member')).toBeNull();
		expect(unitInHeader('cover_mm')).toBe('mm');
		expect(unitInHeader('x_m')).toBe('m');
		expect(unitInHeader('Chainage metres')).toBe('m');
		expect(unitInHeader('Cover inches')).toBe('inch');
		expect(unitInHeader('Spacing (in)')).toBe('inch');
	});
});
