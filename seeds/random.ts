/**
 * A seeded pseudo-random generator for the demo scenario, so every seed run writes the same
 * readings. Our own: neither jstat nor simple-statistics offers a seedable generator.
 * mulberry32 (T. Ettinger, public domain) for uniforms; Box–Muller for normals.
 */
export class SeededRandom {
	private state: number;
	private spareNormal: number | null = null;

	constructor(seed: number) {
		this.state = seed >>> 0;
	}

	/** Uniform on [0, 1). */
	next(): number {
		this.state = (this.state + 0x6d2b79f5) >>> 0;
		let t = this.state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	}

	between(low: number, high: number): number {
		return low + (high - low) * this.next();
	}

	integer(low: number, high: number): number {
		return Math.floor(this.between(low, high + 1));
	}

	/** Normal with the given mean and standard deviation (Box–Muller, both values used). */
	normal(mean: number, sd: number): number {
		if (this.spareNormal !== null) {
			const z = this.spareNormal;
			this.spareNormal = null;
			return mean + sd * z;
		}
		let u = 0;
		while (u === 0) u = this.next();
		const v = this.next();
		const r = Math.sqrt(-2 * Math.log(u));
		this.spareNormal = r * Math.sin(2 * Math.PI * v);
		return mean + sd * r * Math.cos(2 * Math.PI * v);
	}

	/** Lognormal whose own mean and standard deviation (not the log's) are given. */
	lognormal(mean: number, sd: number): number {
		const sigma2 = Math.log(1 + (sd * sd) / (mean * mean));
		const mu = Math.log(mean) - sigma2 / 2;
		return Math.exp(this.normal(mu, Math.sqrt(sigma2)));
	}
}
