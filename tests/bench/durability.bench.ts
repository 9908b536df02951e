/**
 * Benchmark of the durability engine, with scipy's curve_fit as the peer in the same run.
 * Run: npm run bench:durability   (tsx tests/bench/durability.bench.ts)
 * 1. Fit 1,000 invented chloride profiles in the engine and with scipy.optimize.curve_fit
 *    (tests/bench/durability_peer.py) on the same data; print times, the ratio engine/scipy
 *    (≤ 1 means the engine is at least as fast) and the largest relative difference of Cs, Da.
 * 2. The projection with its band for 100,000 cover readings and 20 profiles: fit the
 *    profiles, sort the covers, project 21 ages with 1,000 bootstrap replicates, rank the
 *    sensitivity — the whole path a risk page would take (target under 1 s).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
	type ChlorideProfile,
	depassivationSensitivity,
	erfc,
	fitChlorideProfile,
	mulberry32,
	normalSampler,
	projectMeasuredDepassivation,
	toSortedCovers
} from '../../src/lib/analysis/index';

// python3 on PATH: the machine's scipy 1.17.1 (the Debian /usr/bin/python3 has 1.10.1 or none).
const PYTHON = 'python3';
const PEER = fileURLToPath(new URL('./durability_peer.py', import.meta.url));
const EDGES = [0, 4, 8, 12, 16, 20, 25, 30, 40, 50];

/** Invented profiles: Cs 2–5 %, Da lognormal about 30 mm²/year (≈ 1e-12 m²/s), 10–40 years, 4 % noise. */
function profiles(count: number, seed: number): ChlorideProfile[] {
	const u = mulberry32(seed);
	const z = normalSampler(u);
	return Array.from({ length: count }, () => {
		const cs = 2 + 3 * u();
		const da = 30 * Math.exp(0.5 * z());
		const age = 10 + 30 * u();
		const increments = EDGES.slice(0, -1).map((from, i) => {
			const x = (from + EDGES[i + 1]) / 2;
			const c = 0.05 + (cs - 0.05) * erfc(x / (2 * Math.sqrt(da * age)));
			return { fromMm: from, toMm: EDGES[i + 1], content: Math.max(0, c * (1 + 0.04 * z())) };
		});
		return { ageYears: age, initialContent: 0.05, increments };
	});
}

/** Best wall time and best CPU time of this process (ms) over the repeats, after a warm-up. */
function bestOf<T>(repeats: number, run: () => T): [number, number, T] {
	let result = run(); // warm-up: let the JIT compile before timing
	let best = Infinity;
	let bestCpu = Infinity;
	for (let r = 0; r < repeats; r++) {
		const start = performance.now();
		const cpu = process.cpuUsage();
		result = run();
		const used = process.cpuUsage(cpu);
		best = Math.min(best, performance.now() - start);
		bestCpu = Math.min(bestCpu, (used.user + used.system) / 1000);
	}
	return [best, bestCpu, result];
}

function ensurePeer(): void {
	if (spawnSync(PYTHON, ['-c', 'import numpy, scipy']).status === 0) return;
	throw new Error(`${PYTHON} cannot import numpy and scipy: the peer needs them`);
}

function fitBenchmark(dir: string): void {
	const list = profiles(1000, 20261204);
	const file = join(dir, 'profiles.json');
	const forPeer = list.map((p) => ({
		age: p.ageYears,
		ci: p.initialContent,
		x: p.increments.slice(1).map((i) => (i.fromMm + i.toMm) / 2),
		y: p.increments.slice(1).map((i) => i.content)
	}));
	writeFileSync(file, JSON.stringify(forPeer));
	// Rounds alternate engine and peer so that both meet the same load on a shared machine.
	type Peer = { ms: number; cpuMs: number; msJacobian: number; cpuMsJacobian: number };
	let fits = list.map((p) => fitChlorideProfile(p));
	let peer: Peer & { fits: ([number, number] | null)[] } = {
		ms: Infinity,
		cpuMs: Infinity,
		msJacobian: Infinity,
		cpuMsJacobian: Infinity,
		fits: []
	};
	let [oursMs, oursCpu] = [Infinity, Infinity];
	const ratios: number[] = [];
	for (let round = 0; round < 5; round++) {
		const [ms, cpu, result] = bestOf(1, () => list.map((p) => fitChlorideProfile(p)));
		const out = JSON.parse(
			execFileSync(PYTHON, [PEER, file, '1'], { encoding: 'utf8' })
		) as typeof peer;
		ratios.push(ms / out.ms);
		[oursMs, oursCpu, fits] = [Math.min(oursMs, ms), Math.min(oursCpu, cpu), result];
		peer = {
			ms: Math.min(peer.ms, out.ms),
			cpuMs: Math.min(peer.cpuMs, out.cpuMs),
			msJacobian: Math.min(peer.msJacobian, out.msJacobian),
			cpuMsJacobian: Math.min(peer.cpuMsJacobian, out.cpuMsJacobian),
			fits: out.fits
		};
	}
	ratios.sort((a, b) => a - b);
	let worst = 0;
	let both = 0;
	fits.forEach((f, i) => {
		const s = peer.fits[i];
		if (f.status !== 'fitted' || !s) return;
		both++;
		worst = Math.max(
			worst,
			Math.abs(f.surfaceContent / s[0] - 1),
			Math.abs(f.dMm2PerYear / s[1] - 1)
		);
	});
	const refused = fits.filter((f) => f.status === 'refused').length;
	console.log(
		`fit 1,000 profiles, best of 5 alternating rounds: engine ${oursMs.toFixed(1)} ms wall ` +
			`(${oursCpu.toFixed(1)} ms CPU), curve_fit ${peer.ms.toFixed(0)} ms wall (${peer.cpuMs.toFixed(0)} ms CPU): ` +
			`ratio ${(oursMs / peer.ms).toFixed(3)} wall, ${(oursCpu / peer.cpuMs).toFixed(3)} CPU, ` +
			`median of the rounds' ratios ${ratios[2].toFixed(3)}`
	);
	console.log(
		`  curve_fit with the analytic jac: ${peer.msJacobian.toFixed(0)} ms wall (${peer.cpuMsJacobian.toFixed(0)} ms CPU), ` +
			`ratio ${(oursMs / peer.msJacobian).toFixed(3)} wall`
	);
	console.log(
		`  engine refused ${refused}, scipy failed ${peer.fits.filter((f) => !f).length}; ` +
			`largest relative difference of Cs, Da over ${both} fitted by both: ${worst.toExponential(2)}`
	);
}

function projectionBenchmark(): void {
	const z = normalSampler(mulberry32(7));
	const covers = Float64Array.from({ length: 100_000 }, () => Math.max(1, 45 + 8 * z()));
	const twenty = profiles(20, 99);
	const ages = Array.from({ length: 21 }, (_, i) => i * 5);
	const run = () => {
		const sorted = toSortedCovers(covers);
		const front = {
			kind: 'chloride' as const,
			fits: twenty.map((p) => fitChlorideProfile(p, { ageingExponent: 0.3 })),
			criticalContent: 0.6
		};
		const projection = projectMeasuredDepassivation(sorted, front, { agesYears: ages });
		const sensitivity = depassivationSensitivity(sorted, front, {
			designLifeYears: 50,
			criticalContentSd: 0.15,
			ageingExponentSd: 0.1
		});
		return { projection, sensitivity };
	};
	const coldStart = performance.now();
	run();
	const coldMs = performance.now() - coldStart;
	const [ms, cpuMs, result] = bestOf(3, run);
	const at50 = result.projection.atAges[10];
	console.log(
		`projection, 100,000 readings × 20 profiles, 21 ages, 1,000 replicates + sensitivity: ` +
			`${ms.toFixed(0)} ms wall, ${cpuMs.toFixed(0)} ms CPU (best of 3; the first, cold run ${coldMs.toFixed(0)} ms wall)`
	);
	console.log(
		`  share at 50 years ${at50.share.toFixed(3)}, band ${at50.band.map((b) => b.share.toFixed(3)).join(' / ')}; ` +
			`most sensitive: ${result.sensitivity.inputs[0].input}`
	);
}

function main(): void {
	ensurePeer();
	const dir = mkdtempSync(join(tmpdir(), 'fractile-durability-'));
	try {
		console.log(
			`node ${process.version}; ${PYTHON} with scipy ${execFileSync(PYTHON, ['-c', 'import scipy; print(scipy.__version__)'], { encoding: 'utf8' }).trim()}`
		);
		fitBenchmark(dir);
		projectionBenchmark();
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

main();
