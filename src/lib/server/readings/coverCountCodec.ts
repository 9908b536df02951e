/**
 * A member's cover counts as stored (member_cover_sets.cover_counts): each distinct cover once
 * with its number of readings, ascending. Both forms are exact: decoding gives the same doubles
 * as readings.cover_mm.
 *
 * On the meter's grid (the usual case, migration 017) the entries are variable-length integers:
 * the first grid step k (signed, ZigZag), then for each entry the gap to the previous step less
 * one, and each entry's count — unsigned LEB128 varints, 7 bits a byte, lowest first, the high
 * bit set on every byte but the last (the encoding of Protocol Buffers' `uint32`/`sint32`). A
 * member of 1,000 readings at 0.1 mm has gaps and counts under 128, so an entry takes 2 bytes
 * rather than the 8 of a fixed int32 step and uint32 count (migration 012's form): research over
 * 10^8 readings reads a quarter of the bytes. Off every grid (covers from a calculation) an
 * entry is the cover itself (float64) and its count (uint32), 12 bytes.
 *
 * Written here rather than taken from a package: the protobuf libraries' readers work on whole
 * messages, and the research gathering needs to add a row's counts straight from its bytes
 * without allocating (`readGridCounts`).
 */
import { type CountedSample, countedFromSorted } from '../../analysis/countedSample';
import { type CoverGrid, gridSteps, gridValue } from '../../analysis/coverGrid';

const OFF_GRID_BYTES = 12;
/** A uint32 needs at most 5 varint bytes; the first step's ZigZag of an int32 also fits in 5. */
const MAX_VARINT_BYTES = 5;

export interface StoredCounts {
	grid: CoverGrid | null;
	distinct: number;
	bytes: Buffer;
}

/** ZigZag: 0, −1, 1, −2, … → 0, 1, 2, 3, … (arithmetic, so the whole int32 range is safe). */
const zigzag = (k: number) => (k >= 0 ? 2 * k : -2 * k - 1);
const unzigzag = (z: number) => (z % 2 === 0 ? z / 2 : -(z + 1) / 2);

function writeVarint(out: number[], value: number): void {
	let v = value;
	while (v >= 128) {
		out.push((v % 128) + 128);
		v = Math.floor(v / 128);
	}
	out.push(v);
}

/** The stored form of a counted sample (its grid as detected, or none). */
export function encodeCounts(sample: CountedSample): StoredCounts {
	const { values, counts } = sample;
	const grid =
		sample.lattice && sample.lattice.a === 0 && sample.lattice.b === 1 ? sample.lattice.grid : null;
	if (!grid) {
		const bytes = Buffer.alloc(values.length * OFF_GRID_BYTES);
		for (let i = 0; i < values.length; i++) {
			bytes.writeDoubleLE(values[i], i * OFF_GRID_BYTES);
			bytes.writeUInt32LE(counts[i], i * OFF_GRID_BYTES + 8);
		}
		return { grid, distinct: values.length, bytes };
	}
	const out: number[] = [];
	let previous = 0;
	for (let i = 0; i < values.length; i++) {
		const k = gridSteps(values[i], grid)!;
		writeVarint(out, i === 0 ? zigzag(k) : k - previous - 1);
		writeVarint(out, counts[i]);
		previous = k;
	}
	return { grid, distinct: values.length, bytes: Buffer.from(out) };
}

/** Counts of sorted covers, ready to store. */
export function encodeSortedCovers(sorted: Float64Array): StoredCounts {
	return encodeCounts(countedFromSorted(sorted));
}

/** Where grid counts are decoded into; grown by readGridCounts when a row holds more. */
export interface GridCountsBuffer {
	steps: Int32Array;
	counts: Float64Array;
}

export function gridCountsBuffer(size = 1024): GridCountsBuffer {
	return { steps: new Int32Array(size), counts: new Float64Array(size) };
}

const malformed = (why: string) => new Error(`cover counts are malformed: ${why}`);

/**
 * The entries of grid counts decoded into `into` (grown if need be); returns how many there
 * are. Throws on bytes that end inside an entry or hold an over-long varint. The one reader of
 * the grid form: decodeCounts and the research gathering both come through here.
 */
export function readGridCounts(bytes: Uint8Array, into: GridCountsBuffer): number {
	// Every entry takes at least 2 bytes, so this bounds the entries before decoding.
	const most = bytes.length >> 1;
	if (into.steps.length < most) {
		into.steps = new Int32Array(most);
		into.counts = new Float64Array(most);
	}
	const { steps, counts } = into;
	let at = 0;
	let size = 0;
	let previous = 0;
	const end = bytes.length;
	while (at < end) {
		for (let part = 0; part < 2; part++) {
			let value = 0;
			let scale = 1;
			for (let i = 0; ; i++) {
				if (at >= end) throw malformed(`${end} bytes end inside entry ${size + 1}`);
				if (i === MAX_VARINT_BYTES) throw malformed(`entry ${size + 1} has an over-long number`);
				const b = bytes[at++];
				value += (b & 127) * scale;
				if (b < 128) break;
				scale *= 128;
			}
			if (value > 0xffffffff) throw malformed(`entry ${size + 1} holds a number past 32 bits`);
			if (part === 0) {
				previous = size === 0 ? unzigzag(value) : previous + value + 1;
				if (previous > 0x7fffffff) throw malformed(`entry ${size + 1} is past the grid's range`);
				steps[size] = previous;
			} else counts[size] = value;
		}
		size++;
	}
	return size;
}

/** decodeCounts' working space, reused from row to row (it copies out what it returns). */
const scratch = gridCountsBuffer();

/** A counted sample back from its stored form; throws on bytes that are not whole entries. */
export function decodeCounts(bytes: Uint8Array, grid: CoverGrid | null): CountedSample {
	if (grid) {
		const size = readGridCounts(bytes, scratch);
		const buffer = scratch;
		const steps = Float64Array.from(buffer.steps.subarray(0, size));
		const counts = buffer.counts.slice(0, size);
		const values = new Float64Array(size);
		let n = 0;
		for (let i = 0; i < size; i++) {
			values[i] = gridValue(steps[i], grid);
			n += counts[i];
		}
		return { values, counts, n, lattice: { grid, steps, a: 0, b: 1 } };
	}
	if (bytes.byteLength % OFF_GRID_BYTES !== 0)
		throw malformed(`${bytes.byteLength} bytes are not whole ${OFF_GRID_BYTES}-byte entries`);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const size = bytes.byteLength / OFF_GRID_BYTES;
	const values = new Float64Array(size);
	const counts = new Float64Array(size);
	let n = 0;
	for (let i = 0; i < size; i++) {
		values[i] = view.getFloat64(i * OFF_GRID_BYTES, true);
		counts[i] = view.getUint32(i * OFF_GRID_BYTES + 8, true);
		n += counts[i];
	}
	return { values, counts, n, lattice: null };
}
