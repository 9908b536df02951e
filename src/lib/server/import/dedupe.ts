import type { ValidReading } from './validateRow';

const scratch = new Float64Array(1);
const scratchWords = new Uint32Array(scratch.buffer);

/** Mixes a 32-bit word into a hash (the murmur3 body's multiply-rotate step). */
function mix(hash: number, word: number): number {
	let k = Math.imul(word, 0xcc9e2d51);
	k = (k << 15) | (k >>> 17);
	hash ^= Math.imul(k, 0x1b873593);
	hash = (hash << 13) | (hash >>> 19);
	return (Math.imul(hash, 5) + 0xe6546b64) | 0;
}

/**
 * Two independent 32-bit hashes of a reading in one pass over its fields: every word goes into
 * both, the second after a different scramble. Module-level state and plain functions, so a row
 * allocates nothing (a million rows otherwise make a million closures for the collector).
 */
let high = 0;
let low = 0;

function word(w: number): void {
	high = mix(high, w);
	low = mix(low, w ^ 0x9e3779b9);
}

function numberWords(value: number | null): void {
	if (value === null) return word(0x7ff80001);
	scratch[0] = value;
	word(scratchWords[0]);
	word(scratchWords[1]);
}

function textWords(value: string | null): void {
	if (value === null) return word(0x85ebca6b);
	for (let i = 0; i < value.length; i++) word(value.charCodeAt(i));
	word(value.length);
}

/** Hashes `r` into `high` and `low`. */
function hashReading(r: ValidReading): void {
	high = 0x2545f491;
	low = 0x68e31da4;
	word(r.memberId);
	numberWords(r.xMm);
	numberWords(r.yMm);
	numberWords(r.coverMm);
	numberWords(r.barDiameterMm);
	numberWords(r.barSpacingMm);
	textWords(r.barDirection);
	textWords(r.note);
	high >>>= 0;
	low >>>= 0;
}

/**
 * Finds rows that repeat an earlier row exactly (same member, position, cover, bar, note).
 * Keeps a 64-bit hash and a row number per row in one typed array (12 bytes a row, open
 * addressing), not the rows: a million rows cost about 24 MB. Our own because no package we
 * use offers a compact seen-set. A false match needs a 64-bit collision (odds about n²/2^65,
 * 3e-8 for a million rows), and such a row would still be listed in the rejected rows with its
 * reason, never silently lost.
 */
export class DuplicateFinder {
	private capacity = 1 << 16;
	private size = 0;
	/** Slot i holds [high, low, row number] at 3i (row 0 = empty): one cache line a probe. */
	private slots = new Uint32Array(this.capacity * 3);

	/** The row number of an earlier identical row, or undefined (and remembers this one). */
	check(reading: ValidReading, rowNumber: number): number | undefined {
		hashReading(reading);
		const at = this.find(this.slots, this.capacity, high, low);
		if (this.slots[at + 2] !== 0) return this.slots[at + 2];
		this.slots[at] = high;
		this.slots[at + 1] = low;
		this.slots[at + 2] = rowNumber;
		if (++this.size * 2 > this.capacity) this.grow();
		return undefined;
	}

	/** The index of the hash's slot in `slots`, or of the empty slot where it belongs. */
	private find(slots: Uint32Array, capacity: number, h: number, l: number): number {
		const mask = capacity - 1;
		let at = (h & mask) * 3;
		while (slots[at + 2] !== 0 && (slots[at] !== h || slots[at + 1] !== l)) {
			at = at + 3 === capacity * 3 ? 0 : at + 3;
		}
		return at;
	}

	private grow(): void {
		const old = this.slots;
		this.capacity *= 2;
		this.slots = new Uint32Array(this.capacity * 3);
		for (let i = 0; i < old.length; i += 3) {
			if (old[i + 2] === 0) continue;
			const at = this.find(this.slots, this.capacity, old[i], old[i + 1]);
			this.slots[at] = old[i];
			this.slots[at + 1] = old[i + 1];
			this.slots[at + 2] = old[i + 2];
		}
	}
}
