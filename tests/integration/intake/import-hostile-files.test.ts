import { readFile, rm } from 'node:fs/promises';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, ImportBatch } from '../../../src/lib/server/db/models';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../../helpers/intake';
import {
	importEnded,
	readingsCsv,
	startImport,
	startMachine,
	uploadImport,
	type Machine
} from '../../helpers/importHttp';
import { buildXlsx, sheetXml } from '../../helpers/xlsx';

/** Generous for CI: the readers give the event loop a turn every few milliseconds. */
const WORST_HEALTH_MS = 200;

const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

async function newSurvey() {
	return (await freshSurvey(await actorFor('surveyor@kestrel-lane.example'))).survey;
}

/** CPU time (ms) the app's process has used, all its threads (/proc/PID/stat, 100 ticks/s). */
async function cpuMs(pid: number): Promise<number> {
	const fields = (await readFile(`/proc/${pid}/stat`, 'utf8')).split(') ')[1].split(' ');
	return (Number(fields[11]) + Number(fields[12])) * 10; // utime, stime (fields 14, 15)
}

/**
 * The slowest /api/health answer while `work` runs (asked every few ms, a new socket each).
 * An answer counts only as long as the app used the CPU meanwhile: on a machine whose two cores
 * other jobs share, the app also waits for a core without holding its event loop.
 */
async function worstHealthLatency(machine: Machine, work: () => Promise<unknown>) {
	let running = true;
	const latencies: number[] = [];
	const probe = (async () => {
		while (running) {
			const [started, cpuBefore] = [performance.now(), await cpuMs(machine.app.pid)];
			const response = await fetch(`${machine.app.origin}/api/health`, {
				headers: { connection: 'close' }
			});
			await response.arrayBuffer();
			const busy = (await cpuMs(machine.app.pid)) - cpuBefore;
			latencies.push(Math.min(performance.now() - started, busy + 10));
			await new Promise((r) => setTimeout(r, 5));
		}
	})();
	try {
		await work();
	} finally {
		running = false;
		await probe;
	}
	let worst = 0;
	for (const ms of latencies) worst = Math.max(worst, ms);
	return { worst, samples: latencies.length };
}

const header = ['Member', 'X', 'Y', 'Cover'];

describe('hostile and careless files over HTTP: the server keeps answering and says what is wrong', () => {
	let sequelize: Sequelize;
	let machine: Machine;

	beforeAll(async () => {
		sequelize = testSequelize();
		machine = await startMachine();
	});
	afterAll(async () => {
		await machine?.app.stop();
		if (machine) await rm(machine.stagingDir, { recursive: true, force: true });
		await sequelize?.close();
	});

	/**
	 * Previews and imports `content` until /api/health stayed under the bound throughout, at most
	 * three times. A stall of the event loop by the file repeats every time; a slow answer now and
	 * then (a garbage collection, a loaded machine) does not.
	 */
	async function expectLoopFree(
		name: string,
		content: Buffer,
		contentType: string,
		readings: number
	) {
		const bound = WORST_HEALTH_MS;
		const tries: { previewMs: number; importMs: number }[] = [];
		for (let attempt = 0; attempt < 3; attempt++) {
			const { survey, previewed, imported, view } = await previewAndImport(
				name,
				content,
				contentType
			);
			expect(view.state, view.errorMessage ?? '').toBe('completed');
			expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(readings);
			tries.push({ previewMs: Math.round(previewed.worst), importMs: Math.round(imported.worst) });
			if (previewed.worst < bound && imported.worst < bound) break;
		}
		console.log(
			`${name}: worst /api/health latency (CPU-bound part) per try (ms):`,
			JSON.stringify(tries)
		);
		const last = tries[tries.length - 1];
		expect(last.previewMs).toBeLessThan(bound);
		expect(last.importMs).toBeLessThan(bound);
	}

	/** Uploads (the preview) and imports `content`, measuring /api/health all the while. */
	async function previewAndImport(name: string, content: Buffer, contentType: string) {
		const survey = await newSurvey();
		let upload: Awaited<ReturnType<typeof uploadImport>> | null = null;
		const previewed = await worstHealthLatency(machine, async () => {
			upload = await uploadImport(machine, survey.id, name, content, contentType);
		});
		const uploaded = upload as unknown as Awaited<ReturnType<typeof uploadImport>>;
		expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
		const batchId: number = uploaded.body.batchId;
		const settings: Record<string, unknown> = uploaded.body.preview.settings;
		let view: Awaited<ReturnType<typeof importEnded>> | null = null;
		const imported = await worstHealthLatency(machine, async () => {
			const start = await startImport(machine, batchId, settings);
			expect(start.status).toBe(202);
			view = await importEnded(machine, batchId);
		});
		return { survey, batchId, previewed, imported, view: view! };
	}

	it('a sheet with rows 1, 2 and 1,048,576 is previewed and imported with the event loop free (health < 200 ms)', async () => {
		const content = buildXlsx([
			{
				name: 'Readings',
				xml: sheetXml([
					{ r: 1, cells: header },
					{ r: 2, cells: ['M-01', 0, 0, 30] },
					{ r: 1_048_576, cells: ['M-02', 0, 0, 31] }
				])
			}
		]);
		expect(content.length).toBeLessThan(2000);
		await expectLoopFree('sparse.xlsx', content, XLSX, 2);
	});

	it('a sheet of 300,000 empty rows between readings keeps the event loop free in preview and run', async () => {
		const body: string[] = [];
		for (let r = 4; r < 300_004; r++) body.push(`<row r="${r}"/>`);
		const xml = sheetXml([
			{ r: 1, cells: header },
			{ r: 2, cells: ['M-01', 0, 0, 30] },
			{ r: 3, cells: ['M-01', 10, 0, 31] },
			{ r: 300_004, cells: ['M-02', 0, 0, 32] }
		]).replace('<row r="300004">', body.join('') + '<row r="300004">');
		const content = buildXlsx([{ name: 'Readings', xml }]);
		await expectLoopFree('blank-rows.xlsx', content, XLSX, 3);
	});

	it('a CSV with 600,000 blank lines between readings keeps the event loop free in the run', async () => {
		const content = Buffer.concat([
			Buffer.from('Member,X,Y,Cover\nM-01,0,0,30\nM-01,10,0,31\n'),
			Buffer.alloc(600_000, '\n'),
			Buffer.from('M-02,0,0,32\n')
		]);
		await expectLoopFree('blank-lines.csv', content, 'text/csv', 3);
	});

	it('a sheet numbering a row 3,000,000 is refused at once, naming the row', async () => {
		const survey = await newSurvey();
		const content = buildXlsx([
			{
				name: 'Readings',
				xml: sheetXml([
					{ r: 1, cells: header },
					{ r: 2, cells: ['M-01', 0, 0, 30] },
					{ r: 3_000_000, cells: ['M-02', 0, 0, 31] }
				])
			}
		]);
		const upload = await uploadImport(machine, survey.id, 'far.xlsx', content, XLSX);
		expect(upload.status).toBe(400);
		expect(upload.body.error.message).toMatch(/a row numbered 3000000 \(after row 2\)/);
	});

	it('an XLSX declaring 1,000 bytes of shared strings but holding 50 MB is refused as it inflates; the app stays up', async () => {
		const survey = await newSurvey();
		const item = '<si><t>' + 'x'.repeat(1000) + '</t></si>';
		const strings = Buffer.from(
			'<?xml version="1.0"?><sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">' +
				item.repeat(50_000) +
				'</sst>'
		);
		const content = buildXlsx(
			[{ name: 'Readings', xml: sheetXml([{ cells: header }, { cells: ['M-01', 0, 0, 30] }]) }],
			{ xml: strings, declaredSize: 1000 }
		);
		expect(content.length).toBeLessThan(500_000);
		const upload = await uploadImport(machine, survey.id, 'hidden-bomb.xlsx', content, XLSX);
		expect(upload.status).toBe(400);
		expect(upload.body.error.message).toMatch(
			/xl\/sharedStrings\.xml unpacks to more than the 1000 bytes its zip directory declares/
		);
		expect(await ImportBatch.count({ where: { surveyId: survey.id } })).toBe(0);
		expect((await fetch(`${machine.app.origin}/api/health`)).status).toBe(200);
	});

	it('an unescaped & in row 4,000 fails the import naming the sheet and row, nothing written; a second sheet is warned about', async () => {
		const survey = await newSurvey();
		// Far enough down that the preview (the first rows) has read the sheet well before it.
		const rows = [{ cells: header as (string | number)[] }];
		for (let i = 0; i < 5000; i++)
			rows.push({ cells: [`M-0${1 + (i % 3)}`, i * 10, 0, 30 + (i % 100) / 10] });
		const xml = sheetXml(rows).replace('<v>39980</v>', '<v>39980 & more</v>');
		const content = buildXlsx([
			{ name: 'Readings', xml },
			{ name: 'Bay 2', xml: sheetXml([{ cells: header }]) }
		]);
		const upload = await uploadImport(machine, survey.id, 'broken.xlsx', content, XLSX);
		expect(upload.status).toBe(201);
		expect(upload.body.preview.warnings).toEqual([
			expect.stringMatching(/2 sheets; only the first, "Readings", was read. Not read: "Bay 2"/)
		]);
		const start = await startImport(machine, upload.body.batchId, upload.body.preview.settings);
		expect(start.status).toBe(202);
		const view = await importEnded(machine, upload.body.batchId);
		expect(view.state).toBe('failed');
		expect(view.errorMessage).toMatch(/The sheet "Readings" is damaged after row 3999/);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
	});

	it('a second sheet is named in the warnings of a completed import', async () => {
		const survey = await newSurvey();
		const content = buildXlsx([
			{ name: 'Readings', xml: sheetXml([{ cells: header }, { cells: ['M-01', 0, 0, 30] }]) },
			{ name: 'Bay 2', xml: sheetXml([{ cells: header }, { cells: ['M-02', 0, 0, 31] }]) }
		]);
		const upload = await uploadImport(machine, survey.id, 'two.xlsx', content, XLSX);
		await startImport(machine, upload.body.batchId, upload.body.preview.settings);
		const ended = await importEnded(machine, upload.body.batchId);
		expect(ended.state).toBe('completed');
		const view = await (
			await machine.surveyor.get(`/api/v1/imports/${upload.body.batchId}`)
		).json();
		expect(view.import.warnings).toEqual([expect.stringMatching(/Not read: "Bay 2"/)]);
	});

	it('misleading messages: an empty file, UTF-16 text and a #DIV/0! cell each get a true one', async () => {
		const survey = await newSurvey();
		const empty = await uploadImport(machine, survey.id, 'empty.csv', Buffer.alloc(0));
		expect(empty.status).toBe(400);
		expect(empty.body.error.message).toMatch(/^The file is empty \(0 bytes\)/);
		const utf16 = Buffer.concat([
			Buffer.from([0xff, 0xfe]),
			Buffer.from('Member,X,Y,Cover\r\nM-01,0,0,30\r\n', 'utf16le')
		]);
		const wide = await uploadImport(machine, survey.id, 'wide.csv', utf16);
		expect(wide.status).toBe(400);
		expect(wide.body.error.message).toMatch(/text in UTF-16/);
		expect(wide.body.error.message).not.toMatch(/audio|mpeg/);
		const xml = sheetXml([{ cells: header }, { cells: ['M-01', 0, 0, 30] }]).replace(
			'</sheetData>',
			'<row r="3"><c r="A3" t="inlineStr"><is><t>M-02</t></is></c><c r="B3"><v>0</v></c><c r="C3"><v>0</v></c><c r="D3" t="e"><f>1/0</f><v>#DIV/0!</v></c></row></sheetData>'
		);
		const upload = await uploadImport(
			machine,
			survey.id,
			'div0.xlsx',
			buildXlsx([{ name: 'Readings', xml }]),
			XLSX
		);
		await startImport(machine, upload.body.batchId, upload.body.preview.settings);
		// The default refuses the whole file for one failing row; the message names row and cell.
		const ended = await importEnded(machine, upload.body.batchId);
		expect(ended.state).toBe('failed');
		expect(ended.errorMessage).toMatch(
			/Row 3: cover holds the spreadsheet error #DIV\/0! \(a formula that failed in the spreadsheet\), not a number/
		);
		const rejected = await machine.surveyor.get(`/api/v1/imports/${upload.body.batchId}/rejected`);
		expect(await rejected.text()).toMatch(
			/^3,"cover holds the spreadsheet error #DIV\/0! \(a formula that failed in the spreadsheet\), not a number",M-02/m
		);
	});

	it('two starts of the same import at once: one wins, the other gets 409; readings written once and undone whole', async () => {
		for (let attempt = 0; attempt < 4; attempt++) {
			const survey = await newSurvey();
			const upload = await uploadImport(
				machine,
				survey.id,
				`twice-${attempt}.csv`,
				readingsCsv(20_000)
			);
			expect(upload.status).toBe(201);
			const batchId = upload.body.batchId as number;
			const settings = upload.body.preview.settings;
			const starts = await Promise.all([
				startImport(machine, batchId, settings),
				startImport(machine, batchId, settings)
			]);
			expect(starts.map((s) => s.status).sort()).toEqual([202, 409]);
			expect((await importEnded(machine, batchId)).state).toBe('completed');
			expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(20_000);
			expect(
				await AuditEvent.count({
					where: {
						action: 'import.completed',
						subjectType: 'import_batch',
						subjectId: String(batchId)
					}
				})
			).toBe(1);
			const undo = await machine.surveyor.postJson(`/api/v1/imports/${batchId}/undo`, {});
			expect(undo.status).toBe(200);
			expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
		}
	});
});
