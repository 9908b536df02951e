/**
 * Benchmark of the analysis engine against numpy/scipy on the same data in the same run.
 * Run: npm run bench:analysis   (tsx tests/bench/analysis.bench.ts)
 * Prints times, the ratio engine/peer (≤ 1 means the engine is at least as fast), the largest
 * relative difference between the two sets of figures, and the engine's peak memory for 10^6.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
	assessPopulation,
	mulberry32,
	normalSampler,
	projectRequirement,
	type PopulationAssessment
} from '../../src/lib/analysis/index';

const PYTHON = '/usr/bin/python3';
const PEER = fileURLToPath(new URL('./analysis_peer.py', import.meta.url));
const REQUIREMENT = projectRequirement(45, 10, { deltaPlusMm: 15 }); // c_min 35, as in the peer
const OPTIONS = {
	ruleSet: 'full-review',
	model: 'normal',
	characteristicMethod: 'prediction'
} as const;

/** Seeded population: normal, mean 45 mm, SD 8 mm (cover readings of a typical survey). */
function population(n: number, seed = 20240604): Float64Array {
	const z = normalSampler(mulberry32(seed));
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) out[i] = Math.max(1, 45 + 8 * z());
	return out;
}

function ensurePeer(): void {
	const probe = spawnSync(PYTHON, ['-c', 'import numpy, scipy']);
	if (probe.status === 0) return;
	console.log('Installing python3-numpy and python3-scipy (Debian)…');
	execFileSync('apt-get', ['install', '-y', 'python3-numpy', 'python3-scipy'], {
		stdio: 'inherit'
	});
}

function bestOf(repeats: number, run: () => void): number {
	let best = Infinity;
	for (let r = 0; r < repeats; r++) {
		const start = performance.now();
		run();
		best = Math.min(best, performance.now() - start);
	}
	return best;
}

function engineTime(
	data: Float64Array,
	groups: number,
	repeats: number
): [number, PopulationAssessment] {
	const size = data.length / groups;
	let first: PopulationAssessment | null = null;
	const assessAll = () => {
		for (let g = 0; g < groups; g++) {
			const a = assessPopulation(data.subarray(g * size, (g + 1) * size), REQUIREMENT, OPTIONS);
			if (g === 0) first = a;
		}
	};
	assessAll(); // warm-up: let the JIT compile before timing
	const ms = bestOf(repeats, assessAll);
	return [ms, first as unknown as PopulationAssessment];
}

/** Engine figures in the peer's names, to compare the two. */
function engineFigures(a: PopulationAssessment): Record<string, number | boolean> {
	const rule = (id: string) => a.rules.find((r) => r.id === id)?.outcome === 'pass';
	const f = a.fractionBelowCMin;
	return {
		mean: a.description.meanMm,
		sd: a.description.sdMm,
		median: a.description.medianMm,
		skewness: a.description.skewness ?? NaN,
		p5: a.percentiles[0].valueMm,
		p10: a.percentiles[1].valueMm,
		adNormal: a.models.normal.andersonDarling?.statistic ?? NaN,
		adLognormal: a.models.lognormal?.andersonDarling?.statistic ?? NaN,
		ksNormal: a.models.normal.kolmogorovSmirnov?.statistic ?? NaN,
		ksLognormal: a.models.lognormal?.kolmogorovSmirnov?.statistic ?? NaN,
		normalP5: a.characteristic.normal.modelMm,
		lognormalP5: a.characteristic.lognormal?.modelMm ?? NaN,
		predictionNormal: a.characteristic.normal.predictionMm,
		toleranceNormal: a.characteristic.normal.toleranceMm,
		predictionLognormal: a.characteristic.lognormal?.predictionMm ?? NaN,
		toleranceLognormal: a.characteristic.lognormal?.toleranceMm ?? NaN,
		countBelow: f.count,
		cpUpper: f.upperBound,
		cpLower2: f.interval.lower,
		cpUpper2: f.interval.upper,
		fractionNormal: f.normal,
		fractionLognormal: f.lognormal ?? NaN,
		variablesNormal: f.variablesUpperBoundNormal,
		variablesLognormal: f.variablesUpperBoundLognormal ?? NaN,
		ruleEvery: rule('every-reading-min'),
		ruleCharacteristic: rule('characteristic-min'),
		ruleFraction: rule('fraction-below-min'),
		ruleExcess: rule('excess-cover')
	};
}

function largestDifference(
	ours: Record<string, number | boolean>,
	peer: Record<string, number | boolean>
): string {
	let worst = 0;
	let where = '';
	for (const [key, value] of Object.entries(ours)) {
		const other = peer[key];
		if (typeof value === 'boolean' || typeof other === 'boolean') {
			if (value !== other) return `rule ${key} differs`;
			continue;
		}
		const rel = Math.abs(value - other) / Math.max(1e-12, Math.abs(other));
		if (!(rel <= worst)) [worst, where] = [rel, key];
	}
	return `largest relative difference ${worst.toExponential(2)} (${where}), rules agree`;
}

function compare(label: string, data: Float64Array, groups: number, dir: string): void {
	const file = join(dir, `${label}.f64`);
	writeFileSync(file, new Uint8Array(data.buffer, data.byteOffset, data.byteLength));
	const [oursMs, first] = engineTime(data, groups, 3);
	const peerOut = execFileSync(PYTHON, [PEER, file, String(groups), '3'], { encoding: 'utf8' });
	const peer = JSON.parse(peerOut) as { ms: number; figures: Record<string, number | boolean> };
	console.log(
		`${label}: engine ${oursMs.toFixed(0)} ms, numpy/scipy ${peer.ms.toFixed(0)} ms, ratio ${(oursMs / peer.ms).toFixed(2)}`
	);
	console.log(`  ${largestDifference(engineFigures(first), peer.figures)}`);
}

/** Child mode: assess 10^6 readings once and report the process's peak resident memory. */
function memoryProbe(): void {
	assessPopulation(population(1_000_000), REQUIREMENT, OPTIONS);
	console.log(JSON.stringify({ maxRssMb: process.resourceUsage().maxRSS / 1024 }));
}

function main(): void {
	if (process.argv.includes('--memory-probe')) return memoryProbe();
	ensurePeer();
	const dir = mkdtempSync(join(tmpdir(), 'fractile-bench-'));
	try {
		console.log(`node ${process.version}; ${PYTHON} with numpy/scipy (Debian)`);
		compare('1 population of 1,000,000', population(1_000_000), 1, dir);
		compare('100 groups of 10,000', population(1_000_000, 99), 100, dir);
		const probe = spawnSync(
			process.execPath,
			[...process.execArgv, fileURLToPath(import.meta.url), '--memory-probe'],
			{ encoding: 'utf8' }
		);
		const { maxRssMb } = JSON.parse(probe.stdout.trim().split('\n').pop() ?? '{}') as {
			maxRssMb: number;
		};
		console.log(
			`peak resident memory, one assessment of 1,000,000 (whole process): ${maxRssMb.toFixed(0)} MB`
		);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

main();
