/**
 * The import part of the load bench: while the mixed load runs, an engineer imports a
 * 100,000-row CSV through the built app's import API (upload → start → poll, as the import
 * page does) into a survey of a bench asset of its own, so the overview under load keeps the
 * demo's figures. Every HTTP answer of the import counts: anything but the expected status is
 * an error.
 */
export interface ImportRun {
	summary: string;
	seconds: number;
	errors: number;
}

const ROWS = 100_000;
const MEMBERS = 20;

type Client = { cookie: string };

function csvText(run: number): string {
	const lines = ['Member,X (mm),Y (mm),Cover (mm)'];
	for (let i = 0; i < ROWS; i++) {
		const cover = (20 + ((i * 7919 + run) % 400) / 10).toFixed(1);
		// (member, x, y) unique within a run and across runs: no row repeats another.
		const x = (Math.floor(i / MEMBERS) % 500) * 10;
		const y = Math.floor(i / (MEMBERS * 500)) * 10 + run * 1000;
		lines.push(`LB-${1 + (i % MEMBERS)},${x},${y},${cover}`);
	}
	return lines.join('\n') + '\n';
}

async function call(app: string, client: Client, path: string, init: RequestInit = {}) {
	return fetch(new URL(path, app), {
		...init,
		headers: {
			cookie: client.cookie,
			origin: new URL(app).origin,
			accept: 'application/json',
			...(init.headers ?? {})
		}
	});
}

async function postJson(app: string, client: Client, path: string, body: unknown) {
	return call(app, client, path, {
		method: 'POST',
		body: JSON.stringify(body),
		headers: { 'content-type': 'application/json' }
	});
}

async function expectStatus(response: Response, status: number, what: string) {
	if (response.status !== status) {
		throw new Error(`${what}: ${response.status} ${(await response.text()).slice(0, 300)}`);
	}
	return response.json();
}

/** A bench asset with one draft survey and its members, made over the API (untimed). */
export async function prepareImportSurvey(app: string, client: Client): Promise<number> {
	const { asset } = await expectStatus(
		await postJson(app, client, '/api/v1/assets', {
			name: `Load bench import ${Date.now()}`,
			designCode: 'EN 1992-1-1',
			designServiceLifeYears: 50
		}),
		201,
		'create asset'
	);
	const { survey } = await expectStatus(
		await postJson(app, client, `/api/v1/assets/${asset.id}/surveys`, {
			title: 'Load bench survey',
			surveyDate: '2026-11-30'
		}),
		201,
		'create survey'
	);
	const table = [
		'label\ttype\tface\texposure\tbar diameter',
		...Array.from({ length: MEMBERS }, (_, i) => `LB-${i + 1}\tslab\ttop\tXC3\t12`)
	].join('\n');
	await expectStatus(
		await postJson(app, client, `/api/v1/surveys/${survey.id}/members/bulk`, { table }),
		201,
		'create members'
	);
	return survey.id;
}

/** One import of 100,000 rows, timed from upload to completion. */
export async function importScenario(
	app: string,
	client: Client,
	surveyId: number,
	run: number
): Promise<ImportRun> {
	const started = performance.now();
	let errors = 0;
	try {
		const uploaded = await expectStatus(
			await call(app, client, `/api/v1/surveys/${surveyId}/imports?fileName=load-${run}.csv`, {
				method: 'POST',
				body: csvText(run),
				headers: { 'content-type': 'text/csv' }
			}),
			201,
			'upload'
		);
		const { mixedDecimalMarks: _mixed, ...settings } = uploaded.preview.settings;
		await expectStatus(
			await postJson(app, client, `/api/v1/imports/${uploaded.batchId}/start`, {
				mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
				options: settings,
				confirmDuplicate: true
			}),
			202,
			'start'
		);
		for (;;) {
			const response = await call(app, client, `/api/v1/imports/${uploaded.batchId}`);
			if (response.status !== 200) errors++;
			const status = response.status === 200 ? (await response.json()).import : null;
			if (status && status.state !== 'running') {
				if (status.state !== 'completed' || status.rowsImported !== ROWS) {
					throw new Error(`import ended ${status.state}: ${status.errorMessage}`);
				}
				break;
			}
			await new Promise((r) => setTimeout(r, 250));
		}
	} catch (err) {
		errors++;
		console.error(err);
	}
	const seconds = (performance.now() - started) / 1000;
	return {
		seconds,
		errors,
		summary: `Import of ${ROWS.toLocaleString('en')} rows under this load: ${seconds.toFixed(1)} s end to end (${Math.round(ROWS / seconds).toLocaleString('en')} rows/s), ${errors} error(s).`
	};
}
