import { QueryTypes } from 'sequelize';
import { Reading } from '$lib/server/db';
import {
	COVER_MAP_COLUMNS,
	coverMapRows,
	type Cell,
	type CoverMapGrid
} from '$lib/populations/coverMap';

interface Extent {
	maxX: number | null;
	maxY: number | null;
	distinctY: number | bigint;
	placed: number | bigint | string | null;
	xOnly: number | bigint | string | null;
	unplaced: number | bigint | string | null;
}

/** A profile's height when the member's is not given: areas are then per metre of width. */
const PROFILE_HEIGHT_MM = 1000;

/**
 * A member's cover map binned in MariaDB (GROUP BY cell over the member's rows of the readings'
 * primary key): the rows never come to Node, and the answer is bounded by the grid. A member
 * scanned along x only (no y) is binned along x into one row: a profile.
 */
export async function coverMapGrid(member: {
	id: number;
	gridWidthMm: number | null;
	gridHeightMm: number | null;
}): Promise<CoverMapGrid> {
	const sequelize = Reading.sequelize!;
	const [extent] = await sequelize.query<Extent>(
		`SELECT MAX(x_mm) AS maxX, MAX(y_mm) AS maxY, COUNT(DISTINCT y_mm) AS distinctY,
			SUM(x_mm IS NOT NULL AND y_mm IS NOT NULL) AS placed,
			SUM(x_mm IS NOT NULL AND y_mm IS NULL) AS xOnly,
			SUM(x_mm IS NULL OR y_mm IS NULL) AS unplaced
		FROM readings WHERE member_id = :m`,
		{ type: QueryTypes.SELECT, replacements: { m: member.id } }
	);
	const profile = Number(extent?.placed ?? 0) === 0 && Number(extent?.xOnly ?? 0) > 0;
	const widthMm = member.gridWidthMm ?? Math.max(0, Number(extent?.maxX ?? 0)) + 1;
	const heightKnown = !profile || member.gridHeightMm !== null;
	const heightMm = profile
		? (member.gridHeightMm ?? PROFILE_HEIGHT_MM)
		: (member.gridHeightMm ?? Math.max(0, Number(extent?.maxY ?? 0)) + 1);
	const columns = COVER_MAP_COLUMNS;
	const rows = profile ? 1 : coverMapRows(Number(extent?.distinctY ?? 0));
	const cw = widthMm / columns;
	const ch = heightMm / rows;
	const grouped = await sequelize.query<{ i: number; j: number; leastMm: number; count: bigint }>(
		`SELECT LEAST(:lastColumn, GREATEST(0, FLOOR(x_mm / :cw))) AS i,
			${profile ? '0' : 'LEAST(:lastRow, GREATEST(0, FLOOR(y_mm / :ch)))'} AS j,
			MIN(cover_mm) AS leastMm, COUNT(*) AS count
		FROM readings WHERE member_id = :m AND x_mm IS NOT NULL
			AND ${profile ? 'y_mm IS NULL' : 'y_mm IS NOT NULL'}
		GROUP BY i, j ORDER BY j, i`,
		{
			type: QueryTypes.SELECT,
			replacements: { m: member.id, cw, ch, lastColumn: columns - 1, lastRow: rows - 1 }
		}
	);
	const cells: Cell[] = grouped.map((g) => ({
		i: Number(g.i),
		j: Number(g.j),
		x: (Number(g.i) + 0.5) * cw,
		y: (Number(g.j) + 0.5) * ch,
		leastMm: Number(g.leastMm),
		count: Number(g.count)
	}));
	let least = Infinity;
	let most = -Infinity;
	for (const c of cells) {
		least = Math.min(least, c.leastMm);
		most = Math.max(most, c.leastMm);
	}
	const shown = profile ? Number(extent?.xOnly ?? 0) : Number(extent?.placed ?? 0);
	const total = Number(extent?.placed ?? 0) + Number(extent?.unplaced ?? 0);
	return {
		kind: profile ? 'profile' : 'area',
		widthMm,
		heightMm,
		heightKnown,
		columns,
		rows,
		cells,
		rangeMm: cells.length ? [least, most] : null,
		unplaced: total - shown
	};
}
