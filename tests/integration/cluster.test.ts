/**
 * Two app processes writing through different nodes of a three-node Galera cluster
 * (scripts/cluster.sh, which npm test starts before the integration tests), one node killed in
 * the middle of an import and started again (docs/scaling.md, "A Galera cluster").
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { parseEnv } from 'node:util';
import mariadb from 'mariadb';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { ImportProgress, initModels, Member, MemberCoverSet } from '../../src/lib/server/db/models';
import { expandCounted } from '../../src/lib/analysis';
import { decodeCounts } from '../../src/lib/server/readings/coverCountCodec';
import { clearAllData, isDatabaseEmpty, loadDemoScenario } from '../../seeds/load';
import {
	importEnded,
	importView,
	readingsCsv,
	startImport,
	startMachine,
	uploadImport,
	type Machine
} from '../helpers/importHttp';
import { actorFor, countReadings, freshSurvey } from '../helpers/intake';
import { httpClient, signInAs } from '../helpers/session';
import { until } from '../helpers/until';

const cluster = parseEnv(readFileSync('.env.cluster', 'utf8')) as Record<string, string>;
const node = (n: 1 | 2 | 3) => `127.0.0.1:${cluster[`GALERA_PORT_${n}`]}`;
const credentials = {
	DB_NAME: cluster.DB_NAME,
	DB_USER: cluster.DB_USER,
	DB_PASSWORD: cluster.DB_PASSWORD,
	DB_READ_REPLICAS: ''
};
// Each app process prefers its own node; the test's own checks prefer the third.
const appOnNode1 = { ...credentials, DB_HOSTS: [node(1), node(2), node(3)].join(',') };
const appOnNode2 = { ...credentials, DB_HOSTS: [node(2), node(3), node(1)].join(',') };
const checksOnNode3 = { ...credentials, DB_HOSTS: [node(3), node(2), node(1)].join(',') };

// Large enough that the import is still running when the node dies (several seconds here).
const ROWS = 300_000;
/** The abandoned-import sweep's words (src/lib/server/import/abandoned.ts). */
const ABANDONED_MESSAGE =
	'The import stopped before it finished (the server handling it ended, or lost its database connection); nothing was written. Start it again.';
const LOST =
	'The connection to the database was lost during the import; nothing was written. Start the import again.';

// The nodes' data folders: .local, or /var/tmp when the checkout is out of the nodes' user's
// reach (scripts/lib.sh, galera_root).
const DATA_ROOT = cluster.GALERA_DATA_ROOT || '.local';
const NODE_1_LOG = `${DATA_ROOT}/mariadb-galera1/mysqld.log`;

const clusterScript = (...args: string[]) =>
	execFileSync('bash', ['scripts/cluster.sh', ...args], { stdio: 'pipe' });

/** One node's own answer, as root over its socket: not through the app's failover. */
async function onNode<T>(n: 1 | 2 | 3, sql: string): Promise<T[]> {
	const connection = await mariadb.createConnection({
		socketPath: `${DATA_ROOT}/mariadb-galera${n}/mysqld.sock`,
		user: 'root',
		database: cluster.DB_NAME,
		bigIntAsNumber: true,
		decimalAsNumber: true
	});
	try {
		return (await connection.query(sql)) as T[];
	} finally {
		await connection.end();
	}
}

async function appConnections(n: 1 | 2 | 3): Promise<number> {
	const [row] = await onNode<{ n: number }>(
		n,
		`SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE USER = '${cluster.DB_USER}'`
	);
	return Number(row.n);
}

/** Readings that are the same reading twice (same member and position): none may exist. */
async function doubledReadings(sequelize: Sequelize, surveyId: number): Promise<number> {
	const [row] = await sequelize.query<{ n: number }>(
		`SELECT COUNT(*) - COUNT(DISTINCT r.member_id, r.x_mm, r.y_mm) AS n
		   FROM readings r JOIN members m ON m.id = r.member_id WHERE m.survey_id = ?`,
		{ replacements: [surveyId], type: QueryTypes.SELECT }
	);
	return Number(row.n);
}

/** Every member's stored cover counts equal its readings' covers, as a multiset, to the bit. */
async function expectCountsInStep(sequelize: Sequelize, surveyId: number) {
	const members = await Member.findAll({ where: { surveyId }, attributes: ['id'] });
	for (const { id } of members) {
		const rows = await sequelize.query<{ c: number }>(
			'SELECT cover_mm AS c FROM readings WHERE member_id = ? ORDER BY cover_mm',
			{ replacements: [id], type: QueryTypes.SELECT }
		);
		const stored = await MemberCoverSet.findByPk(id);
		const grid =
			stored?.gridDen == null || stored.gridFactor == null
				? null
				: { den: Number(stored.gridDen), factor: Number(stored.gridFactor) };
		const covers = stored?.coverCounts
			? Array.from(expandCounted(decodeCounts(stored.coverCounts, grid)))
			: [];
		expect(covers, `member ${id}`).toEqual(rows.map((r) => Number(r.c)));
		if (stored) expect(stored.readingCount).toBe(covers.length);
	}
}

/** Each node's checksum of the tables an import writes (CHECKSUM TABLE reads every row). */
async function checksums(n: 1 | 2 | 3): Promise<string> {
	const rows = await onNode<{ Table: string; Checksum: number }>(
		n,
		'CHECKSUM TABLE readings, member_cover_sets, import_batches, audit_events'
	);
	return rows.map((r) => `${r.Table.split('.')[1]}=${r.Checksum}`).join(' ');
}

async function uploadAndStart(machine: Machine, surveyId: number, csv: Buffer) {
	const upload = await uploadImport(machine, surveyId, 'bay-readings.csv', csv);
	expect(upload.status).toBe(201);
	const started = await startImport(machine, upload.body.batchId, upload.body.preview.settings, {});
	expect(started.status).toBe(202);
	return upload.body.batchId as number;
}

describe('two app processes on a three-node Galera cluster', () => {
	let sequelize: Sequelize;
	let onNode1: Machine;
	let onNode2: Machine;

	beforeAll(async () => {
		sequelize = createSequelize(readDatabaseSettings(checksOnNode3));
		initModels(sequelize);
		await createMigrator(sequelize).up();
		if (!(await isDatabaseEmpty(sequelize))) await clearAllData(sequelize);
		await loadDemoScenario(sequelize);
		[onNode1, onNode2] = await Promise.all([startMachine(appOnNode1), startMachine(appOnNode2)]);
	});

	afterAll(async () => {
		await Promise.all([onNode1?.app.stop(), onNode2?.app.stop()]);
		// Whatever happened above, the cluster is left whole for the next run.
		clusterScript('start-node', '1');
		await sequelize?.close();
	});

	it('writes through each process its own node, and reads the other process’s write at once', async () => {
		const engineerOn1 = await signInAs('engineer', onNode1.app.origin);
		const name = `cluster check ${Date.now()}`;
		const created = await engineerOn1.postJson('/api/v1/tokens', { name, expiresInDays: 30 });
		expect(created.status).toBe(201);
		// The session written through node 1 is honoured through node 2, and the token is listed
		// there at once: each session waits for the cluster's commits before it reads.
		const engineerOn2 = httpClient({}, engineerOn1.cookie, onNode2.app.origin);
		const listed = await engineerOn2.get('/api/v1/tokens');
		expect(listed.status).toBe(200);
		const body = (await listed.json()) as { tokens: { name: string }[] };
		expect(body.tokens.map((t) => t.name)).toContain(name);
		// Each process holds connections to its own first node (the test's go to node 3).
		expect(await appConnections(1)).toBeGreaterThan(0);
		expect(await appConnections(2)).toBeGreaterThan(0);
		// The import path under test is LOAD DATA LOCAL, and the node does not split it.
		const [settings] = await onNode<{ localInfile: number; splitting: number; rows: number }>(
			2,
			'SELECT @@GLOBAL.local_infile AS localInfile, @@wsrep_load_data_splitting AS splitting, @@wsrep_max_ws_rows AS `rows`'
		);
		expect(settings).toEqual({ localInfile: 1, splitting: 0, rows: 0 });
	});

	it('survives a node killed mid-import: the import completes or fails whole, the app answers, the node rejoins', async () => {
		const actor = await actorFor('surveyor@kestrel-lane.example');
		const [one, two] = [await freshSurvey(actor), await freshSurvey(actor)];
		const csv = readingsCsv(ROWS);
		const batchOn1 = await uploadAndStart(onNode1, one.survey.id, csv);
		await until(
			'the import through node 1 writing',
			async () => ((await ImportProgress.findByPk(batchOn1))?.rowsWritten ?? 0) > 0,
			60_000,
			25
		);
		// Asked through the other node, whose process list does not hold the import's connection,
		// the running import is still running (the abandoned-import sweep runs on every such read).
		expect((await importView(onNode2, batchOn1)).state).toBe('running');
		const batchOn2 = await uploadAndStart(onNode2, two.survey.id, csv);

		clusterScript('kill', '1');
		const killedAt = Date.now();

		// The process whose node died answers again through another node.
		const health = () =>
			fetch(`${onNode1.app.origin}/api/health`).then(
				(r) => r.status,
				() => 0
			);
		await until(
			'the app on node 1 answering through another node',
			async () => (await health()) === 200,
			30_000,
			250
		);
		console.log(`node 1 killed; the app on it answered again after ${Date.now() - killedAt} ms`);
		const viewOn1 = await onNode1.surveyor.get('/api/v1/surveys/' + one.survey.id + '/members');
		expect(viewOn1.status).toBe(200);

		const [ended1, ended2] = await Promise.all([
			importEnded(onNode1, batchOn1),
			importEnded(onNode2, batchOn2)
		]);
		// Killed under it: either it committed before the node died, or nothing of it remains.
		if (ended1.state === 'completed') {
			expect(ended1.rowsImported).toBe(ROWS);
			expect(await countReadings(sequelize, { surveyId: one.survey.id })).toBe(ROWS);
		} else {
			// Failed by its own process (the connection lost) or, when that process's report comes
			// after the heartbeat went stale, by the abandoned-import sweep: nothing written either way.
			expect([ended1.state, ended1.rowsImported]).toEqual(['failed', 0]);
			expect([LOST, ABANDONED_MESSAGE]).toContain(ended1.errorMessage);
			expect(await countReadings(sequelize, { surveyId: one.survey.id })).toBe(0);
		}
		// The other process's import, through a node that stayed up, is untouched.
		expect([ended2.state, ended2.rowsImported]).toEqual(['completed', ROWS]);
		expect(await countReadings(sequelize, { surveyId: two.survey.id })).toBe(ROWS);

		if (ended1.state === 'failed') {
			// Started again through the same process, it now writes through a surviving node.
			const retry = await uploadAndStart(onNode1, one.survey.id, csv);
			const done = await importEnded(onNode1, retry);
			expect([done.state, done.rowsImported]).toEqual(['completed', ROWS]);
		}
		for (const { survey } of [one, two]) {
			expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(ROWS);
			expect(await doubledReadings(sequelize, survey.id)).toBe(0);
			await expectCountsInStep(sequelize, survey.id);
		}
		// Ids drawn on different nodes never collide (the sequence steps by node offset).
		const [ids] = await sequelize.query<{ n: number; distinctIds: number }>(
			'SELECT COUNT(*) AS n, COUNT(DISTINCT id) AS distinctIds FROM readings',
			{ type: QueryTypes.SELECT }
		);
		expect(Number(ids.distinctIds)).toBe(Number(ids.n));

		// The killed node rejoins and then holds what the others hold.
		const logBefore = readFileSync(NODE_1_LOG).length;
		clusterScript('start-node', '1');
		// Only the write-sets it missed (IST from a survivor's gcache), not a full copy.
		const rejoinLog = readFileSync(NODE_1_LOG).subarray(logBefore).toString();
		expect(rejoinLog).toMatch(/Receiving IST: \d+ writesets/);
		expect(rejoinLog).not.toMatch(/Prepared IST receiver for 0-/);
		const [state] = await onNode<{ VARIABLE_VALUE: string }>(
			1,
			"SELECT VARIABLE_VALUE FROM information_schema.GLOBAL_STATUS WHERE VARIABLE_NAME = 'WSREP_LOCAL_STATE_COMMENT'"
		);
		expect(state.VARIABLE_VALUE).toBe('Synced');
		const [onRejoined] = await onNode<{ n: number }>(
			1,
			`SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id WHERE m.survey_id = ${one.survey.id}`
		);
		expect(Number(onRejoined.n)).toBe(ROWS);
		expect(await checksums(1)).toBe(await checksums(2));
		expect(await checksums(3)).toBe(await checksums(2));
	}, 300_000);
});
