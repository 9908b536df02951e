import type { ValidReading } from './validateRow';

const scratch = new Float64Array(1);
const scratchWords = new Uint32Array(scratch.buffer);

/** Mixes a 32-bit word into a hash (the murmur3 finaliser's multiply-rotate step). */
function mix(hash: number, word: number): number {
	let k = Math.imul(word, 0xcc9e2d51);
	k = (k << 15) | (k >>> 17);
	hash ^= Math.imul(k, 0x1b873593);
	hash = (hash << 13) | (hash >>> 19);
	return (Math.imul(hash, 5) + 0xe6546b64) | 0;
}

function mixNumber(hash: number, value: number | null): number {
	if (value === null) return mix(hash, 0x9e3779b9);
	scratch[0] = value;
	return mix(mix(hash, scratchWords[0]), scratchWords[1]);
}

function mixText(hash: number, value: string | null): number {
	if (value === null) return mix(hash, 0x85ebca6b);
	for (let i = 0; i < value.length; i++) hash = mix(hash, value.charCodeAt(i));
	return mix(hash, value.length);
}

function hashReading(r: ValidReading, seed: number): number {
	let h = mix(seed, r.memberId);
	h = mixNumber(h, r.xMm);
	h = mixNumber(h, r.yMm);
	h = mixNumber(h, r.coverMm);
	h = mixNumber(h, r.barDiameterMm);
	h = mixNumber(h, r.barSpacingMm);
	h = mixText(h, r.barDirection);
	return mixText(h, r.note) >>> 0;
}

/**
 * Finds rows that repeat an earlier row exactly (same member, position, cover, bar, note).
 * Keeps a 64-bit hash and a row number per row in typed arrays (12 bytes a row, open
 * addressing), not the rows: a million rows cost about 24 MB. Our own because no package we
 * use offers a compact seen-set. A false match needs a 64-bit collision (odds about n²/2^65,
 * 3e-8 for a million rows), and such a row would still be listed in the rejected rows with its
 * reason, never silently lost.
 */
export class DuplicateFinder {
	private capacity = 1 << 16;
	private size = 0;
	private high = new Uint32Array(this.capacity);
	private low = new Uint32Array(this.capacity);
	private rows = new Int32Array(this.capacity); // row number, 0 = empty slot

	/** The row number of an earlier identical row, or undefined (and remembers this one). */
	check(reading: ValidReading, rowNumber: number): number | undefined {
		const high = hashReading(reading, 0x2545f491);
		const low = hashReading(reading, 0x68e31da4);
		const found = this.find(high, low);
		if (this.rows[found] !== 0) return this.rows[found];
		this.high[found] = high;
		this.low[found] = low;
		this.rows[found] = rowNumber;
		if (++this.size * 2 > this.capacity) this.grow();
		return undefined;
	}

	private find(high: number, low: number): number {
		const mask = this.capacity - 1;
		let slot = high & mask;
		while (this.rows[slot] !== 0 && (this.high[slot] !== high || this.low[slot] !== low)) {
			slot = (slot + 1) & mask;
		}
		return slot;
	}

	private grow(): void {
		const [high, low, rows] = [this.high, this.low, this.rows];
		this.capacity *= 2;
		this.high = new Uint32Array(this.capacity);
		this.low = new Uint32Array(this.capacity);
		this.rows = new Int32Array(this.capacity);
		for (let i = 0; i < rows.length; i++) {
			if (rows[i] === 0) continue;
			const slot = this.find(high[i], low[i]);
			this.high[slot] = high[i];
			this.low[slot] = low[i];
			this.rows[slot] = rows[i];
		}
	}
}
