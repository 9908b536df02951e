/**
 * Benchmark of the analysis engine against vectorised numpy/scipy, same data, same run.
 * Run: npm run bench:analysis   (tsx tests/bench/analysis.bench.ts [--runs N])
 *
 * Data: RUNS + 1 sets (one for the warm-up) of 100 groups each, seeded, every group a
 * different size drawn without replacement from 50..20,000 over all sets, so no group in any
 * timed run shares a size (and so a remembered tolerance factor) with any other group the
 * process has seen; readings normal 45 ± 8 mm logged on the 0.1 mm grid. Each run is timed
 * once on data neither side has seen; medians over the runs.
 *
 * Table 1, the overview's per-group assessment: assessPopulation on each group against the
 * peer's n, mean, SD, P5/P50/P95, count below c_min, Clopper–Pearson bound, normal
 * characteristic, prediction and tolerance limit (scipy.stats.nct.ppf for all groups at once).
 * The engine computes more than the peer (both fits' Anderson–Darling and Kolmogorov–Smirnov,
 * the lognormal figures, variables-method bounds, rules): its time is for all of that.
 * Table 2, the plain per-group summary from raw arrays: the engine's counting pass over the
 * readings' grid steps (countedFromGridReadings), then its counted figures, against numpy with
 * np.partition. Both tables compare every group's figures and stop (exit code 1) past TOLERANCE.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
	assessPopulation,
	countBelowCounted,
	countedFromGridReadings,
	momentsCounted,
	mulberry32,
	normalSampler,
	percentileCounted,
	projectRequirement,
	type PopulationAssessment
} from '../../src/lib/analysis/index';

// python3 on PATH: the machine's scipy 1.17.1 (the Debian /usr/bin/python3 has 1.10.1 or none).
const PYTHON = 'python3';
const PEER = fileURLToPath(new URL('./analysis_peer.py', import.meta.url));
const REQUIREMENT = projectRequirement(45, 10, { deltaPlusMm: 15 }); // c_min 35, as in the peer
const C_MIN = 35;
const OPTIONS = {
	ruleSet: 'full-review',
	model: 'normal',
	characteristicMethod: 'prediction'
} as const;
const GROUPS = 100;
const SMALLEST = 50;
const LARGEST = 20_000;
/**
 * Largest relative difference accepted between engine and peer, any group. Sums and order
 * statistics (n, mean, SD, percentiles, counts) are computed exactly or nearly so on both sides;
 * figures through a t, noncentral t or beta quantile differ by the two solvers' accuracy
 * (jstat's Student t inverse is good to about 1e-8 relative).
 */
const TOLERANCE = {
	direct: 1e-12,
	solved: 1e-6,
	solvedKeys: { cpUpper: 1, normalP5: 1, predictionNormal: 1, toleranceNormal: 1 }
} as const;
type Kind = 'direct' | 'solved';
/** The meter's step: 0.1 mm, so a reading is k/10 mm for a whole k. */
const STEPS_PER_MM = 10;
/** The readings' grid: 0.1 mm steps, as the import stores them (k / 10). */
const GRID = { den: STEPS_PER_MM, factor: 1 };

type Figures = Record<string, number[]>;
interface RunSet {
	data: Float64Array;
	sizes: number[];
}

/** Group sizes for `sets` sets of GROUPS, all different (a seeded shuffle of SMALLEST..LARGEST). */
function distinctSizes(sets: number, seed: number): number[][] {
	const random = mulberry32(seed);
	const pool = Array.from({ length: LARGEST - SMALLEST + 1 }, (_, i) => SMALLEST + i);
	for (let i = pool.length - 1; i > 0; i--) {
		const j = Math.floor(random() * (i + 1));
		[pool[i], pool[j]] = [pool[j], pool[i]];
	}
	return Array.from({ length: sets }, (_, s) => pool.slice(s * GROUPS, (s + 1) * GROUPS));
}

function makeSet(sizes: number[], seed: number): RunSet {
	const z = normalSampler(mulberry32(seed));
	const data = new Float64Array(sizes.reduce((a, b) => a + b, 0));
	for (let i = 0; i < data.length; i++)
		data[i] = Math.max(1, Math.round((45 + 8 * z()) * STEPS_PER_MM)) / STEPS_PER_MM;
	return { data, sizes };
}

function groupsOf(set: RunSet): Float64Array[] {
	const out: Float64Array[] = [];
	let at = 0;
	for (const size of set.sizes) {
		out.push(set.data.subarray(at, at + size));
		at += size;
	}
	return out;
}

function median(values: number[]): number {
	const s = [...values].sort((a, b) => a - b);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function timed(run: () => void): number {
	const start = performance.now();
	run();
	return performance.now() - start;
}

/** Table 1's figures of one assessment, in the peer's names. */
function assessedFigures(a: PopulationAssessment): Record<string, number> {
	const at = (p: number) => a.percentiles.find((q) => q.p === p)!.valueMm;
	return {
		n: a.description.n,
		mean: a.description.meanMm,
		sd: a.description.sdMm,
		p5: at(0.05),
		p50: a.description.medianMm,
		p95: at(0.95),
		countBelow: a.fractionBelowCMin.count,
		cpUpper: a.fractionBelowCMin.upperBound,
		normalP5: a.characteristic.normal.modelMm,
		predictionNormal: a.characteristic.normal.predictionMm,
		toleranceNormal: a.characteristic.normal.toleranceMm
	};
}

/** Table 2's figures of one group, from its counted sample. */
function summaryFigures(x: Float64Array): Record<string, number> {
	const sample = countedFromGridReadings(x, GRID);
	const { n, mean, sd } = momentsCounted(sample);
	return {
		n,
		mean,
		sd,
		p5: percentileCounted(sample, 0.05),
		p50: percentileCounted(sample, 0.5),
		p95: percentileCounted(sample, 0.95),
		fractionBelow: countBelowCounted(sample, C_MIN) / n
	};
}

/**
 * Largest relative difference over every figure of every group, per tolerance class; throws
 * past the class's tolerance.
 */
function compareFigures(table: string, ours: Record<string, number>[], peer: Figures): string {
	const worst = { direct: [0, ''], solved: [0, ''] } as Record<Kind, [number, string]>;
	for (const [key, column] of Object.entries(peer)) {
		if (column.length !== ours.length)
			throw new Error(`${table}: peer gave ${column.length} groups`);
		const kind: Kind = key in TOLERANCE.solvedKeys ? 'solved' : 'direct';
		column.forEach((other, g) => {
			const value = ours[g][key];
			const diff =
				value === other ? 0 : Math.abs(value - other) / Math.max(1e-300, Math.abs(other));
			if (!(diff <= worst[kind][0])) worst[kind] = [diff, `${key}, group ${g} (n ${ours[g].n})`];
		});
	}
	const lines = (['direct', 'solved'] as const)
		.filter((kind) => worst[kind][1] !== '' || kind === 'direct')
		.map(
			(kind) =>
				`${kind === 'direct' ? 'sums and order statistics' : 'quantile-solved figures'}: largest relative difference ${worst[kind][0].toExponential(2)} at ${worst[kind][1] || 'none (all equal)'} (tolerance ${TOLERANCE[kind]})`
		);
	for (const kind of ['direct', 'solved'] as const)
		if (!(worst[kind][0] <= TOLERANCE[kind])) {
			process.exitCode = 1;
			throw new Error(`${table}: engine and peer disagree beyond tolerance: ${lines.join('; ')}`);
		}
	return lines.join('\n  ');
}

function runPeer(mode: 'assess' | 'summary', dir: string, runs: number) {
	const out = execFileSync(PYTHON, [PEER, mode, dir, String(runs)], { encoding: 'utf8' });
	return JSON.parse(out) as { ms: number[]; figures: Figures };
}

function table(
	title: string,
	mode: 'assess' | 'summary',
	sets: RunSet[],
	warm: RunSet,
	dir: string,
	one: (x: Float64Array) => Record<string, number>
): void {
	for (const g of groupsOf(warm)) one(g); // warm-up: let the JIT compile before timing
	let first: Record<string, number>[] = [];
	const engineMs = sets.map((set, r) =>
		timed(() => {
			const figures = groupsOf(set).map(one);
			if (r === 0) first = figures;
		})
	);
	const peer = runPeer(mode, dir, sets.length);
	const ratios = engineMs.map((ms, r) => ms / peer.ms[r]);
	const fmt = (xs: number[]) => xs.map((x) => x.toFixed(0)).join(', ');
	console.log(`\n${title}`);
	console.log(
		`  engine ms per run:      ${fmt(engineMs)}  → median ${median(engineMs).toFixed(0)}`
	);
	console.log(`  numpy/scipy ms per run: ${fmt(peer.ms)}  → median ${median(peer.ms).toFixed(0)}`);
	console.log(
		`  ratio engine/peer per run: ${ratios.map((x) => x.toFixed(2)).join(', ')}  → median ${median(ratios).toFixed(2)}`
	);
	console.log(`  ${compareFigures(title, first, peer.figures)}`);
}

/** Child mode: assess 10^6 readings once and report the process's peak resident memory. */
function memoryProbe(): void {
	assessPopulation(makeSet([1_000_000], 20240604).data, REQUIREMENT, OPTIONS);
	console.log(JSON.stringify({ maxRssMb: process.resourceUsage().maxRSS / 1024 }));
}

function main(): void {
	if (process.argv.includes('--memory-probe')) return memoryProbe();
	const runsArg = process.argv.indexOf('--runs');
	const runs = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 5;
	if (spawnSync(PYTHON, ['-c', 'import numpy, scipy']).status !== 0)
		throw new Error(`${PYTHON} cannot import numpy and scipy: the peer needs them`);
	const versions = execFileSync(
		PYTHON,
		['-c', 'import numpy, scipy; print("numpy", numpy.__version__, "scipy", scipy.__version__)'],
		{ encoding: 'utf8' }
	).trim();
	const sizes = distinctSizes(runs + 1, 20261204);
	const warm = makeSet(sizes[runs], 7);
	const sets = sizes.slice(0, runs).map((s, r) => makeSet(s, 1000 + r));
	const dir = mkdtempSync(join(tmpdir(), 'fractile-bench-'));
	const write = (name: string, set: RunSet) => {
		writeFileSync(join(dir, `${name}.f64`), new Uint8Array(set.data.buffer));
		writeFileSync(
			join(dir, `${name}.sizes`),
			new Uint8Array(BigInt64Array.from(set.sizes.map(BigInt)).buffer)
		);
	};
	try {
		write('warm', warm);
		sets.forEach((set, r) => write(String(r), set));
		const total = sets.reduce((a, s) => a + s.data.length, 0) / runs;
		console.log(`node ${process.version}; ${PYTHON} with ${versions}`);
		console.log(
			`${runs} timed runs of ${GROUPS} groups, sizes ${SMALLEST}..${LARGEST} all different, ≈ ${Math.round(total).toLocaleString('en')} readings a run (0.1 mm grid)`
		);
		table(
			'Table 1 — per-group assessment (assessPopulation vs numpy/scipy incl. nct.ppf)',
			'assess',
			sets,
			warm,
			dir,
			(x) => assessedFigures(assessPopulation(x, REQUIREMENT, OPTIONS))
		);
		table(
			'Table 2 — plain per-group summary from raw arrays (counting pass vs np.partition)',
			'summary',
			sets,
			warm,
			dir,
			summaryFigures
		);
		const probe = spawnSync(
			process.execPath,
			[...process.execArgv, fileURLToPath(import.meta.url), '--memory-probe'],
			{ encoding: 'utf8' }
		);
		const { maxRssMb } = JSON.parse(probe.stdout.trim().split('\n').pop() ?? '{}') as {
			maxRssMb: number;
		};
		console.log(
			`\npeak resident memory, one assessment of 1,000,000 (whole process): ${maxRssMb.toFixed(0)} MB`
		);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

main();
