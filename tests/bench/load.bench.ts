/**
 * `npm run bench:load` (scripts/bench-load.sh starts the built app): mixed load on loopback with
 * autocannon — the population overview (API and page), a population detail and sign-in, each
 * its share of the simulated users, all at once, with a 100,000-row import through the import
 * API started alongside (tests/bench/loadImport.ts), at 20 and then 50 concurrent users for
 * BENCH_SECONDS (20 s) each; then 100 users for BENCH_LONG_SECONDS (60 s) with imports one after
 * another for the whole run. BENCH_RUNS ("100:60", "20:20,50:20") picks runs as users:seconds.
 * Prints throughput, p50/p95/p99 and errors per part as a Markdown table for
 * docs/performance.md. It measures; it asserts nothing about time.
 */
import autocannon from 'autocannon';
import { loadTestEnv } from '../helpers/env';
import { DEMO_PASSWORD, DEMO_USERS, signInAs } from '../helpers/session';
import { importScenario, prepareImportSurvey, type ImportRun } from './loadImport';

loadTestEnv();
const APP = process.env.APP_URL ?? process.env.ORIGIN!;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 20);
const LONG_SECONDS = Number(process.env.BENCH_LONG_SECONDS ?? 60);

interface Run {
	users: number;
	seconds: number;
	/** Imports back to back for the whole run, rather than one started with it. */
	importsThroughout: boolean;
}

/** The runs: BENCH_RUNS as users:seconds pairs, or 20 and 50 users short and 100 users long. */
function runs(): Run[] {
	const listed = (process.env.BENCH_RUNS ?? '').split(',').filter(Boolean);
	const pairs = listed.length
		? listed.map((pair) => pair.split(':').map(Number) as [number, number])
		: ([
				[20, SECONDS],
				[50, SECONDS],
				[100, LONG_SECONDS]
			] as [number, number][]);
	return pairs.map(([users, seconds]) => ({ users, seconds, importsThroughout: users >= 100 }));
}

interface Part {
	name: string;
	share: number;
	request: (cookie: string) => autocannon.Request;
	/** The answer that counts as success (a sign-in redirects). */
	ok: number;
}

const PARTS: Part[] = [
	{ name: 'overview (API)', share: 0.3, ok: 200, request: get('/api/v1/assets/1/populations') },
	{ name: 'overview (page)', share: 0.15, ok: 200, request: get('/assets/1/populations') },
	{
		name: 'detail (API)',
		share: 0.35,
		ok: 200,
		request: get('/api/v1/assets/1/populations/detail?type=deck&exposure=XD3')
	},
	{ name: 'sign-in', share: 0.2, ok: 303, request: () => signInRequest() }
];

function get(path: string) {
	return (cookie: string): autocannon.Request => ({
		method: 'GET',
		path,
		headers: { cookie, accept: path.startsWith('/api/') ? 'application/json' : 'text/html' }
	});
}

function signInRequest(): autocannon.Request {
	const body = new URLSearchParams({ email: DEMO_USERS.researcher, password: DEMO_PASSWORD });
	return {
		method: 'POST',
		path: '/sign-in',
		body: body.toString(),
		headers: {
			'content-type': 'application/x-www-form-urlencoded',
			accept: 'text/html',
			origin: new URL(APP).origin
		}
	};
}

interface Figures {
	name: string;
	users: number;
	requests: number;
	perSecond: number;
	p50: number;
	p95: number;
	p99: number;
	errors: number;
}

const quantile = (sorted: number[], p: number) =>
	sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] : NaN;

/** One part at `connections` users; every response time is kept, for exact percentiles. */
async function runPart(
	part: Part,
	connections: number,
	cookie: string,
	seconds: number
): Promise<Figures> {
	const times: number[] = [];
	let wrong = 0;
	const instance = autocannon({
		url: APP,
		connections,
		duration: seconds,
		timeout: 30,
		requests: [part.request(cookie)]
	});
	instance.on('response', (_client, status, _bytes, ms) => {
		times.push(ms);
		if (status !== part.ok) wrong++;
	});
	const result = await instance;
	times.sort((a, b) => a - b);
	return {
		name: part.name,
		users: connections,
		requests: times.length,
		perSecond: times.length / seconds,
		p50: quantile(times, 0.5),
		p95: quantile(times, 0.95),
		p99: quantile(times, 0.99),
		errors: wrong + result.errors + result.timeouts
	};
}

/**
 * Every part at once, and one 100,000-row import started with them, or (importsThroughout)
 * one import after another until the run ends.
 */
async function mixed(run: Run, cookie: string, importSurveyId: number) {
	const counts = PARTS.map((p) => Math.max(1, Math.round(run.users * p.share)));
	const load = Promise.all(PARTS.map((p, i) => runPart(p, counts[i], cookie, run.seconds)));
	const imports: ImportRun[] = [];
	const ends = Date.now() + run.seconds * 1000;
	do {
		// Each import's rows differ from every other's (the run number shifts y by a metre, so it
		// stays small: y must stay under the import's 10 m limit).
		const number = run.users * 10 + imports.length;
		imports.push(await importScenario(APP, { cookie }, importSurveyId, number));
	} while (run.importsThroughout && Date.now() < ends);
	return { figures: await load, imports };
}

function table(rows: Figures[]): string {
	const f = (n: number) => (Number.isFinite(n) ? n.toFixed(0) : '—');
	const lines = rows.map(
		(r) =>
			`| ${r.name} | ${r.users} | ${r.requests} | ${r.perSecond.toFixed(1)} | ${f(r.p50)} | ${f(r.p95)} | ${f(r.p99)} | ${r.errors} |`
	);
	return [
		'| part | users | requests | req/s | p50 ms | p95 ms | p99 ms | errors |',
		'|---|---|---|---|---|---|---|---|',
		...lines
	].join('\n');
}

async function main() {
	const engineer = await signInAs('engineer', APP);
	const importSurveyId = await prepareImportSurvey(APP, engineer);
	for (const run of runs()) {
		const { figures, imports } = await mixed(run, engineer.cookie, importSurveyId);
		const total = figures.reduce((s, r) => s + r.perSecond, 0);
		const errors = figures.reduce((s, r) => s + r.errors, 0);
		console.log(
			`\n### ${run.users} concurrent users, ${run.seconds} s (total ${total.toFixed(1)} req/s, ${errors} error(s))\n`
		);
		console.log(table(figures));
		for (const imported of imports) console.log(`\n${imported.summary}`);
	}
}

main().catch((err) => {
	console.error(err);
	process.exit(1);
});
