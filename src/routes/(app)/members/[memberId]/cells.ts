/**
 * Cover-map cells: readings binned onto a grid over the member, each cell showing the least
 * cover in it (the conservative reading for a map of low cover). Display binning only.
 */
import type { MemberReading } from '$lib/server/populations/member';

export interface Cell {
	x: number;
	y: number;
	leastMm: number;
	count: number;
}

export function binReadings(
	readings: MemberReading[],
	widthMm: number,
	heightMm: number,
	columns: number,
	rows: number
): Cell[] {
	const cells = new Map<string, Cell>();
	const cw = widthMm / columns;
	const ch = heightMm / rows;
	for (const r of readings) {
		if (r.xMm === null || r.yMm === null) continue;
		const i = Math.min(columns - 1, Math.max(0, Math.floor(r.xMm / cw)));
		const j = Math.min(rows - 1, Math.max(0, Math.floor(r.yMm / ch)));
		const key = `${i}:${j}`;
		const cell = cells.get(key);
		if (cell) {
			cell.leastMm = Math.min(cell.leastMm, r.coverMm);
			cell.count++;
		} else cells.set(key, { x: (i + 0.5) * cw, y: (j + 0.5) * ch, leastMm: r.coverMm, count: 1 });
	}
	return [...cells.values()];
}

// Viridis stops (perceptually uniform and colour-blind safe), dark = low cover.
const STOPS = ['#440154', '#3b528b', '#21918c', '#5ec962', '#fde725'];

function mix(a: string, b: string, t: number): string {
	const c = (s: string, k: number) => parseInt(s.slice(1 + 2 * k, 3 + 2 * k), 16);
	const v = [0, 1, 2].map((k) => Math.round(c(a, k) + (c(b, k) - c(a, k)) * t));
	return `rgb(${v.join(',')})`;
}

export function colourFor(valueMm: number, fromMm: number, toMm: number): string {
	const t = toMm > fromMm ? Math.min(1, Math.max(0, (valueMm - fromMm) / (toMm - fromMm))) : 0.5;
	const at = t * (STOPS.length - 1);
	const k = Math.min(STOPS.length - 2, Math.floor(at));
	return mix(STOPS[k], STOPS[k + 1], at - k);
}

export const GRADIENT = `linear-gradient(to right, ${STOPS.join(', ')})`;
