import type { ValidReading } from './validateRow';

// FNV-1a, 32 bits (http://www.isthe.com/chongo/tech/comp/fnv/), two offsets for two hashes.
function fnv1a(text: string, offset: number): number {
	let hash = offset;
	for (let i = 0; i < text.length; i++) {
		hash ^= text.charCodeAt(i);
		hash = Math.imul(hash, 0x01000193);
	}
	return hash >>> 0;
}

/**
 * Finds rows that repeat an earlier row exactly (same member, position, cover, bar, note).
 * Keeps a 52-bit hash per row, not the rows, so a million rows cost tens of MB, not hundreds.
 * Written here because no package we use offers a compact seen-set; a false match needs two
 * 32-bit hashes to collide at once (odds about n² / 2^53: 1e-4 for a million rows), and the
 * row then appears in the rejected rows with its reason, so it is never silently lost.
 */
export class DuplicateFinder {
	private readonly seen = new Map<number, number>();

	/** The row number of an earlier identical row, or undefined (and remembers this one). */
	check(reading: ValidReading, rowNumber: number): number | undefined {
		const key = `${reading.memberId}|${reading.xMm}|${reading.yMm}|${reading.coverMm}|${reading.barDiameterMm}|${reading.barSpacingMm}|${reading.barDirection}|${reading.note}`;
		const hash = fnv1a(key, 0x811c9dc5) * 0x100000 + (fnv1a(key, 0x050c5d1f) >>> 12);
		const earlier = this.seen.get(hash);
		if (earlier !== undefined) return earlier;
		this.seen.set(hash, rowNumber);
		return undefined;
	}
}
