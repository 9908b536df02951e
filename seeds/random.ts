import { mulberry32, normalSampler } from '../src/lib/analysis/durability/prng';

/**
 * The demo scenario's seeded generator, so every seed run writes the same readings: the engine's
 * own seeded uniform (mulberry32) and Box–Muller normals, with the shapes the scenario needs.
 */
export class SeededRandom {
	readonly next: () => number;
	private readonly standardNormal: () => number;

	constructor(seed: number) {
		this.next = mulberry32(seed);
		this.standardNormal = normalSampler(this.next);
	}

	between(low: number, high: number): number {
		return low + (high - low) * this.next();
	}

	integer(low: number, high: number): number {
		return Math.floor(this.between(low, high + 1));
	}

	normal(mean: number, sd: number): number {
		return mean + sd * this.standardNormal();
	}

	/** Lognormal whose own mean and standard deviation (not the log's) are given. */
	lognormal(mean: number, sd: number): number {
		const sigma2 = Math.log(1 + (sd * sd) / (mean * mean));
		const mu = Math.log(mean) - sigma2 / 2;
		return Math.exp(this.normal(mu, Math.sqrt(sigma2)));
	}
}
