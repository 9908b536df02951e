/**
 * The cover map of a member as the API sends it: readings binned onto a grid over the member,
 * each cell with the least cover in it (the conservative reading for a map of low cover) and
 * its count. Binned on the server, so the answer has at most COVER_MAP_COLUMNS × COVER_MAP_ROWS
 * cells whatever the number of readings (a member of 120,000 readings was a 16 MB answer).
 * Display binning only: no figure of the assessment comes from it.
 */

export const COVER_MAP_COLUMNS = 36;
export const COVER_MAP_MAX_ROWS = 36;

export interface Cell {
	/** Column and row of the cell (0-based; row 0 at y = 0). */
	i: number;
	j: number;
	/** Centre of the cell (mm). */
	x: number;
	y: number;
	leastMm: number;
	count: number;
}

export interface CoverMapGrid {
	/**
	 * 'area': readings placed by x and y; 'profile': a line scan (x only), one row drawn as cover
	 * along x.
	 */
	kind: 'area' | 'profile';
	widthMm: number;
	/** The member's height; for a profile whose member has no height given, 1000 mm (per metre). */
	heightMm: number;
	columns: number;
	rows: number;
	cells: Cell[];
	/** Least and greatest of the cells' least covers (mm); null without placed readings. */
	rangeMm: [number, number] | null;
	/** False when a profile's height is not known and areas are per metre of width. */
	heightKnown: boolean;
	/** Readings without x or y, which no cell shows. */
	unplaced: number;
}

/** Rows of the grid: one per scan line where the lines are few, so no row is left empty. */
export const coverMapRows = (distinctY: number) =>
	Math.max(1, Math.min(COVER_MAP_MAX_ROWS, distinctY));
