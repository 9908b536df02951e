/**
 * Readings on a meter's grid for the property tests of the counted engine: the grids the import
 * stores (1, 0.5 and 0.1 mm, 0.05 in), and seeded draws near a centre. A small LCG keeps each case
 * reproducible from its seed; the sum of three uniforms gives a bell of the given spread.
 */
import { gridValue, type CoverGrid } from '../../src/lib/analysis/coverGrid';

export const GRIDS: CoverGrid[] = [
	{ den: 1, factor: 1 },
	{ den: 2, factor: 1 },
	{ den: 10, factor: 1 },
	{ den: 20, factor: 25.4 }
];

/**
 * n readings near `centre` mm on `grid`, in the order drawn (not sorted). Covers stay at one
 * grid step or more unless `signed` (deviations from nominal may be negative; never −0, as a
 * reading is never stored as −0 and counts merge it with 0).
 */
export function drawOnGrid(
	grid: CoverGrid,
	centre: number,
	spread: number,
	n: number,
	seed: number,
	signed = false
): Float64Array {
	let state = seed;
	const uniform = () => (state = (state * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
	const stepsPerMm = grid.den / grid.factor;
	const values = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const mm = centre + spread * (uniform() + uniform() + uniform() - 1.5);
		const steps = Math.round(mm * stepsPerMm);
		values[i] = signed ? gridValue(steps, grid) + 0 : gridValue(Math.max(1, steps), grid);
	}
	return values;
}
