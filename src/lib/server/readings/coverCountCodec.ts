/**
 * A member's cover counts as stored (member_cover_sets.cover_counts, migration 012): each
 * distinct cover once with its number of readings, ascending. On the meter's grid (the usual
 * case) an entry is the whole number of steps k (int32) and the count (uint32), 8 bytes, so a
 * member of 10,000 readings at 0.1 mm over a 60 mm range holds at most 600 entries (4.8 kB)
 * however many readings it has. Off every grid (covers that came from a calculation) an entry
 * is the cover itself (float64) and its count, 12 bytes. Both are exact: decoding gives the
 * same doubles as readings.cover_mm.
 */
import { type CountedSample, countedFromSorted } from '../../analysis/countedSample';
import { type CoverGrid, gridSteps, gridValue } from '../../analysis/coverGrid';

const ON_GRID_BYTES = 8;
const OFF_GRID_BYTES = 12;

export interface StoredCounts {
	grid: CoverGrid | null;
	distinct: number;
	bytes: Buffer;
}

/** The stored form of a counted sample (its grid as detected, or none). */
export function encodeCounts(sample: CountedSample): StoredCounts {
	const { values, counts } = sample;
	const grid =
		sample.lattice && sample.lattice.a === 0 && sample.lattice.b === 1 ? sample.lattice.grid : null;
	const width = grid ? ON_GRID_BYTES : OFF_GRID_BYTES;
	const bytes = Buffer.alloc(values.length * width);
	for (let i = 0; i < values.length; i++) {
		if (grid) bytes.writeInt32LE(gridSteps(values[i], grid)!, i * width);
		else bytes.writeDoubleLE(values[i], i * width);
		bytes.writeUInt32LE(counts[i], i * width + width - 4);
	}
	return { grid, distinct: values.length, bytes };
}

/** Counts of sorted covers, ready to store. */
export function encodeSortedCovers(sorted: Float64Array): StoredCounts {
	return encodeCounts(countedFromSorted(sorted));
}

/** A counted sample back from its stored form; throws on a length that is not whole entries. */
export function decodeCounts(bytes: Uint8Array, grid: CoverGrid | null): CountedSample {
	const width = grid ? ON_GRID_BYTES : OFF_GRID_BYTES;
	if (bytes.byteLength % width !== 0)
		throw new Error(
			`cover counts of ${bytes.byteLength} bytes are not whole ${width}-byte entries`
		);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const size = bytes.byteLength / width;
	const values = new Float64Array(size);
	const counts = new Float64Array(size);
	const steps = grid ? new Float64Array(size) : null;
	let n = 0;
	for (let i = 0; i < size; i++) {
		if (steps) {
			steps[i] = view.getInt32(i * width, true);
			values[i] = gridValue(steps[i], grid!);
		} else values[i] = view.getFloat64(i * width, true);
		counts[i] = view.getUint32(i * width + width - 4, true);
		n += counts[i];
	}
	return {
		values,
		counts,
		n,
		lattice: grid && steps ? { grid, steps, a: 0, b: 1 } : null
	};
}
