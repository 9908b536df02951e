/**
 * A member's cover set as stored beside its readings: every cover in mm, sorted ascending, as
 * IEEE 754 doubles, little-endian, 8 bytes each. Exact (the same doubles as readings.cover_mm),
 * so every statistic the engine draws from it equals one drawn from the readings themselves.
 */

const BYTES_PER_COVER = 8;

/** The stored form of sorted covers. */
export function encodeCovers(sortedCoversMm: Float64Array): Buffer {
	const bytes = Buffer.alloc(sortedCoversMm.length * BYTES_PER_COVER);
	for (let i = 0; i < sortedCoversMm.length; i++)
		bytes.writeDoubleLE(sortedCoversMm[i], i * BYTES_PER_COVER);
	return bytes;
}

/** Covers back from their stored form; throws on a length that is not a whole number of covers. */
export function decodeCovers(bytes: Uint8Array): Float64Array {
	if (bytes.byteLength % BYTES_PER_COVER !== 0) {
		throw new Error(`a cover set of ${bytes.byteLength} bytes is not whole 8-byte covers`);
	}
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const covers = new Float64Array(bytes.byteLength / BYTES_PER_COVER);
	for (let i = 0; i < covers.length; i++) covers[i] = view.getFloat64(i * BYTES_PER_COVER, true);
	return covers;
}

/** Two ascending arrays as one ascending array. Cost O(a + b). */
export function mergeSorted(a: Float64Array, b: Float64Array): Float64Array {
	const merged = new Float64Array(a.length + b.length);
	let i = 0;
	let j = 0;
	let k = 0;
	while (i < a.length && j < b.length) merged[k++] = a[i] <= b[j] ? a[i++] : b[j++];
	while (i < a.length) merged[k++] = a[i++];
	while (j < b.length) merged[k++] = b[j++];
	return merged;
}

/**
 * Covers gathered per member while an import streams, in growable typed arrays (8 bytes a
 * reading, not a JS number in an array): a million readings hold 8 MB, not ~30 MB of boxes.
 */
export class CoverCollector {
	private readonly byMember = new Map<number, { values: Float64Array; length: number }>();

	add(memberId: number, coverMm: number): void {
		let entry = this.byMember.get(memberId);
		if (!entry) this.byMember.set(memberId, (entry = { values: new Float64Array(256), length: 0 }));
		if (entry.length === entry.values.length) {
			const grown = new Float64Array(entry.values.length * 2);
			grown.set(entry.values);
			entry.values = grown;
		}
		entry.values[entry.length++] = coverMm;
	}

	/** Each member's covers, sorted ascending, by member id. */
	sortedByMember(): Map<number, Float64Array> {
		const out = new Map<number, Float64Array>();
		for (const [memberId, { values, length }] of this.byMember)
			out.set(memberId, values.slice(0, length).sort());
		return out;
	}
}
