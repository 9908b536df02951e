import { describe, expect, it } from 'vitest';
import type { CoverMapGrid } from '$lib/populations/coverMap';
import { groupLowAreas, lowCoverAreas, SMALL_AREA_M2 } from '$lib/populations/lowCoverAreas';

/**
 * A grid drawn by hand: each character is one cell of 500 mm × 250 mm (a 3 m × 1.5 m member
 * in 6 columns and 6 rows). Digits are the least cover in the cell in tens of mm
 * ('2' = 20 mm); '.' is a cell without readings. With c_min 30 mm the low cells are the 1s
 * and 2s. The areas below were counted on the drawing, not by the code under test.
 */
const DRAWN = [
	'22.455', // row 0
	'2 4551', // ' ' is also a cell without readings
	'445551',
	'444212',
	'555122',
	'5.5552'
];

function gridOf(drawing: string[], widthMm: number, heightMm: number): CoverMapGrid {
	const rows = drawing.length;
	const columns = drawing[0].length;
	const cells: CoverMapGrid['cells'] = [];
	drawing.forEach((line, j) =>
		[...line].forEach((ch, i) => {
			if (!/\d/.test(ch)) return;
			cells.push({
				i,
				j,
				x: ((i + 0.5) * widthMm) / columns,
				y: ((j + 0.5) * heightMm) / rows,
				leastMm: Number(ch) * 10,
				count: 3
			});
		})
	);
	return {
		kind: 'area',
		widthMm,
		heightMm,
		heightKnown: true,
		columns,
		rows,
		cells,
		rangeMm: [10, 50],
		unplaced: 0
	};
}

describe('low-cover areas: connected cells below the threshold (hand-drawn grid)', () => {
	const grid = gridOf(DRAWN, 3000, 1500);
	const cellM2 = 0.5 * 0.25;

	it('finds the two areas of the drawing, largest first, with their areas and shares', () => {
		const areas = lowCoverAreas(grid, 30);
		expect(areas).toHaveLength(2);
		// Right-hand area: (5,1) (5,2) (3,3) (4,3) (5,3) (3,4) (4,4) (5,4) (5,5) = 9 cells.
		expect(areas[0].cells).toHaveLength(9);
		expect(areas[0].areaM2).toBeCloseTo(9 * cellM2, 12);
		expect(areas[0].share).toBeCloseTo(9 / 36, 12);
		expect(areas[0].leastMm).toBe(10);
		expect(areas[0].readings).toBe(27);
		expect(areas[0].box).toEqual({ x0: 1500, y0: 250, x1: 3000, y1: 1500 });
		// Top-left area: (0,0) (1,0) (0,1) = 3 cells; the gap at (1,1) has no readings.
		expect(areas[1].cells).toEqual([
			[0, 0],
			[1, 0],
			[0, 1]
		]);
		expect(areas[1].areaM2).toBeCloseTo(3 * cellM2, 12);
		expect(areas[1].share).toBeCloseTo(3 / 36, 12);
		expect(areas[1].leastMm).toBe(20);
		expect(areas[1].lengthM).toBeNull();
	});

	it('draws the outline of an L of three cells with eight edges, in mm', () => {
		const [, corner] = lowCoverAreas(grid, 30);
		// Counted on the drawing: the L's perimeter is 8 cell edges.
		expect(corner.outline).toHaveLength(8);
		const length = corner.outline.reduce(
			(s, [x0, y0, x1, y1]) => s + Math.hypot(x1 - x0, y1 - y0),
			0
		);
		// 2 × 500 (top) + 500 + 500 (steps) + 3 × 250 (left) + 250 + 250 (right steps) … by hand:
		// top 1000, right of (1,0) 250, bottom of (1,0) 500, right of (0,1) 250, bottom 500,
		// left 500 → 3000 mm.
		expect(length).toBeCloseTo(3000, 9);
	});

	it('joins cells through edges only: a corner touch is two areas', () => {
		const diagonal = gridOf(['15', '51'], 2000, 2000);
		const areas = lowCoverAreas(diagonal, 30);
		expect(areas).toHaveLength(2);
		expect(areas.map((a) => a.areaM2)).toEqual([1, 1]);
	});

	it('takes a chosen threshold: below 50 mm the 4s join most low cells into one area', () => {
		const areas = lowCoverAreas(grid, 50);
		// Counted on the drawing: 19 cells of 1–4; the 4s at (3,0) and (2,1) touch no other low
		// cell through an edge, the other 17 are one area.
		expect(areas.map((a) => a.cells.length)).toEqual([17, 1, 1]);
		expect(areas[0].leastMm).toBe(10);
		expect(areas.slice(1).map((a) => a.cells[0])).toEqual([
			[3, 0],
			[2, 1]
		]);
	});

	it('finds nothing when no cell is below, and refuses a threshold that is not a number', () => {
		expect(lowCoverAreas(grid, 10)).toEqual([]);
		expect(() => lowCoverAreas(grid, Number.NaN)).toThrow(/finite threshold/);
	});

	it('gives a line scan its stretches as lengths along x', () => {
		const profile = { ...gridOf(['5115511'], 7000, 1000), kind: 'profile' as const };
		const areas = lowCoverAreas(profile, 30);
		expect(areas.map((a) => a.lengthM)).toEqual([2, 2]);
		expect(areas.map((a) => a.areaM2)).toEqual([2, 2]);
	});
});

describe('small spots: single cells and areas under the minimum are counted, not listed', () => {
	// Drawn by hand: 8 × 4 cells of 0.5 m × 0.5 m (0.25 m² each) on a 4 m × 2 m member; with the
	// threshold 30 mm the 1s and 2s are low. Counted on the drawing: a 5-cell area top left
	// (1.25 m²), a 2-cell area (4,2)–(5,2) (0.5 m²), and three single cells (6,0), (0,3), (7,3).
	const SPOTTY = [
		'11155515', // row 0
		'11555555',
		'55552255',
		'25555552'
	];
	const grid = gridOf(SPOTTY, 4000, 2000);
	const areas = lowCoverAreas(grid, 30);

	it('finds five areas in all', () => {
		expect(areas.map((a) => a.cells.length)).toEqual([5, 2, 1, 1, 1]);
	});

	it('by default (0.25 m²) lists the two areas of more than one cell and counts three spots', () => {
		expect(SMALL_AREA_M2).toBe(0.25);
		const { listed, spots } = groupLowAreas(areas);
		expect(listed.map((a) => a.areaM2)).toEqual([1.25, 0.5]);
		expect(spots.count).toBe(3);
		expect(spots.areaM2).toBeCloseTo(0.75, 12);
		expect(spots.share).toBeCloseTo(3 / 32, 12);
		// (6,0) reads 10 mm, (0,3) and (7,3) 20 mm.
		expect(spots.leastMm).toBe(10);
	});

	it('with 1 m² lists only the large area; with 0 lists every area, single cells too', () => {
		const large = groupLowAreas(areas, 1);
		expect(large.listed.map((a) => a.cells.length)).toEqual([5]);
		expect(large.spots.count).toBe(4);
		expect(large.spots.areaM2).toBeCloseTo(1.25, 12);
		const every = groupLowAreas(areas, 0);
		expect(every.listed).toHaveLength(5);
		expect(every.spots).toEqual({ count: 0, areaM2: 0, share: 0, leastMm: null });
	});

	it('counts an area of several cells under the minimum as a spot (cells of 0.25 m × 0.25 m)', () => {
		// The same drawing on a 2 m × 1 m member: cells of 0.0625 m², the 5-cell area 0.3125 m²,
		// the 2-cell area 0.125 m² (under 0.25 m²).
		const small = groupLowAreas(lowCoverAreas(gridOf(SPOTTY, 2000, 1000), 30));
		expect(small.listed.map((a) => a.areaM2)).toEqual([0.3125]);
		expect(small.spots.count).toBe(4);
		expect(small.spots.areaM2).toBeCloseTo(0.125 + 3 * 0.0625, 12);
	});

	it('refuses a negative minimum', () => {
		expect(() => groupLowAreas(areas, -1)).toThrow(/minimum area/);
	});
});
