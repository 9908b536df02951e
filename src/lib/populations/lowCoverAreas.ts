/**
 * Low-cover areas of a member: connected regions of cover-map cells whose least cover is below
 * a threshold (c_min unless the engineer picks another), each with its area and share of the
 * member. Cells connect through a shared edge (4-neighbourhood), so two cells touching only at
 * a corner are two areas: a repair is planned over a patch, not along a diagonal of points.
 * Written here because no package labels the regions of a sparse grid and measures them; a
 * flood fill over at most 36 × 36 cells costs nothing.
 * Display binning (coverMap.ts): a cell counts as low when any reading in it is, the
 * conservative reading of a map of low cover. No figure of the assessment comes from it.
 */
import type { CoverMapGrid } from './coverMap';

export interface LowCoverArea {
	/** Cells in the area, as [column, row]. */
	cells: [number, number][];
	/** Area in m² (cells × cell area); for a line scan, length along x × the member's height. */
	areaM2: number;
	/** Length along x in m of a line scan's stretch; null on an area map. */
	lengthM: number | null;
	/** Share of the member's area (0–1). */
	share: number;
	/** The least cover in the area (mm). */
	leastMm: number;
	/** Readings in the area's cells. */
	readings: number;
	/** Bounding box in mm. */
	box: { x0: number; y0: number; x1: number; y1: number };
	/** The area's outline as segments [x0, y0, x1, y1] in mm: cell edges with no low neighbour. */
	outline: [number, number, number, number][];
}

const NEIGHBOURS: [number, number][] = [
	[1, 0],
	[-1, 0],
	[0, 1],
	[0, -1]
];

/**
 * The connected low areas of a cover map, largest first.
 * @example a 3 × 2 grid of 1 m cells with low cells (0,0), (1,0) and (2,1) gives two areas,
 * 2 m² and 1 m².
 */
export function lowCoverAreas(grid: CoverMapGrid, thresholdMm: number): LowCoverArea[] {
	if (!Number.isFinite(thresholdMm)) throw new Error('lowCoverAreas needs a finite threshold');
	const cw = grid.widthMm / grid.columns;
	const ch = grid.heightMm / grid.rows;
	const low = new Map<number, { leastMm: number; count: number }>();
	for (const c of grid.cells) {
		if (c.leastMm < thresholdMm) low.set(c.j * grid.columns + c.i, c);
	}
	const seen = new Set<number>();
	const areas: LowCoverArea[] = [];
	for (const start of low.keys()) {
		if (seen.has(start)) continue;
		seen.add(start);
		const stack = [start];
		const members: number[] = [];
		while (stack.length > 0) {
			const k = stack.pop()!;
			members.push(k);
			const i = k % grid.columns;
			const j = Math.floor(k / grid.columns);
			for (const [di, dj] of NEIGHBOURS) {
				const ni = i + di;
				const nj = j + dj;
				if (ni < 0 || nj < 0 || ni >= grid.columns || nj >= grid.rows) continue;
				const nk = nj * grid.columns + ni;
				if (low.has(nk) && !seen.has(nk)) {
					seen.add(nk);
					stack.push(nk);
				}
			}
		}
		areas.push(describeArea(members, grid, low, cw, ch));
	}
	return areas.sort((a, b) => b.areaM2 - a.areaM2 || a.leastMm - b.leastMm);
}

function describeArea(
	keys: number[],
	grid: CoverMapGrid,
	low: Map<number, { leastMm: number; count: number }>,
	cw: number,
	ch: number
): LowCoverArea {
	const inArea = new Set(keys);
	const cells: [number, number][] = keys
		.map((k): [number, number] => [k % grid.columns, Math.floor(k / grid.columns)])
		.sort((a, b) => a[1] - b[1] || a[0] - b[0]);
	const outline: [number, number, number, number][] = [];
	let leastMm = Infinity;
	let readings = 0;
	let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
	for (const [i, j] of cells) {
		const cell = low.get(j * grid.columns + i)!;
		leastMm = Math.min(leastMm, cell.leastMm);
		readings += cell.count;
		const [l, t, r, b] = [i * cw, j * ch, (i + 1) * cw, (j + 1) * ch];
		[x0, y0, x1, y1] = [Math.min(x0, l), Math.min(y0, t), Math.max(x1, r), Math.max(y1, b)];
		const has = (di: number, dj: number) => inArea.has((j + dj) * grid.columns + (i + di));
		if (j === 0 || !has(0, -1)) outline.push([l, t, r, t]);
		if (j === grid.rows - 1 || !has(0, 1)) outline.push([l, b, r, b]);
		if (i === 0 || !has(-1, 0)) outline.push([l, t, l, b]);
		if (i === grid.columns - 1 || !has(1, 0)) outline.push([r, t, r, b]);
	}
	const areaMm2 = cells.length * cw * ch;
	return {
		cells,
		areaM2: areaMm2 / 1e6,
		lengthM: grid.kind === 'profile' ? (cells.length * cw) / 1000 : null,
		share: areaMm2 / (grid.widthMm * grid.heightMm),
		leastMm,
		readings,
		box: { x0, y0, x1, y1 },
		outline
	};
}

/**
 * The smallest area listed on its own, m² (the engineer may change it beside the threshold).
 * Common practice, not a code value: a patch repair is planned over about half a metre square
 * at least, and a single map cell is one reading's neighbourhood, more likely scatter of the
 * meter or a bar lap than a region to treat.
 */
export const SMALL_AREA_M2 = 0.25;

/** Low areas too small to list one by one, counted together. */
export interface SmallSpots {
	count: number;
	areaM2: number;
	/** Share of the member's area (0–1). */
	share: number;
	/** The least cover among them (mm); null when there are none. */
	leastMm: number | null;
}

/**
 * The one rule for which low areas are listed (the map's outlines and list, the owner's page,
 * the report): an area of at least `minM2` and more than one cell; the rest are "small spots",
 * counted and summed. `minM2` = 0 lists every area, single cells too.
 */
export function groupLowAreas(
	areas: readonly LowCoverArea[],
	minM2: number = SMALL_AREA_M2
): { listed: LowCoverArea[]; spots: SmallSpots } {
	if (!(minM2 >= 0)) throw new Error('groupLowAreas needs a minimum area of 0 m² or more');
	const small = (a: LowCoverArea) => minM2 > 0 && (a.cells.length < 2 || a.areaM2 < minM2);
	const listed = areas.filter((a) => !small(a));
	const rest = areas.filter(small);
	return {
		listed,
		spots: {
			count: rest.length,
			areaM2: rest.reduce((s, a) => s + a.areaM2, 0),
			share: rest.reduce((s, a) => s + a.share, 0),
			leastMm: rest.length > 0 ? Math.min(...rest.map((a) => a.leastMm)) : null
		}
	};
}
