import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessCalibrated, fitCalibration } from '../../src/lib/analysis';
import type { AssessmentSnapshot } from '../../src/lib/server/assessments/snapshot';
import { Assessment } from '../../src/lib/server/db/models';
import type { CalibrationOutcome, PopulationResult } from '../../src/lib/server/populations';
import { mm } from '../../src/lib/format';
import { approveDirectly } from '../helpers/assessments';
import { overlappingLines, textLines } from '../helpers/pdfLayout';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName, coversBySql } from '../helpers/actors';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

describe('the check-hole calibration chosen over the population detail API', () => {
	let sequelize: Sequelize;
	let carParkId: number;
	let engineer: HttpClient;
	let every: string;
	beforeAll(async () => {
		sequelize = testSequelize();
		carParkId = await assetIdByName(sequelize, CAR_PARK);
		await anonymousClient().get('/api/health');
		engineer = await signInAs('engineer');
		const surveys = await sequelize.query<{ id: number }>(
			'SELECT id FROM surveys WHERE asset_id = ? ORDER BY id',
			{ replacements: [carParkId], type: QueryTypes.SELECT }
		);
		every = surveys.map((s) => s.id).join(',');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function detail(query: string) {
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?surveys=${every}&${query}`,
			JSON_ACCEPT
		);
		return {
			status: response.status,
			body: (await response.json()) as {
				population: PopulationResult;
				calibration: CalibrationOutcome | null;
				error?: { code: string; field?: string; message: string };
			}
		};
	}

	/** The holes of the group's members straight from SQL, not through the service. */
	const holesBySql = (memberType: string, exposureClass: string) =>
		sequelize.query<{ r: number; m: number }>(
			`SELECT h.meter_reading_mm AS r, h.measured_cover_mm AS m FROM verification_holes h
			   JOIN members m ON m.id = h.member_id
			  WHERE m.asset_id = ? AND m.member_type = ? AND m.exposure_class = ? ORDER BY h.id`,
			{ replacements: [carParkId, memberType, exposureClass], type: QueryTypes.SELECT }
		);

	it('calibration=apply gives the engine’s calibrated assessment of the same readings and holes, and says whether the outcome changes', async () => {
		const { status, body } = await detail('type=deck&exposure=XD3&calibration=apply');
		expect(status).toBe(200);
		const outcome = body.calibration!;
		expect(outcome.problem).toBeNull();
		const holes = await holesBySql('deck', 'XD3');
		expect(holes.length).toBeGreaterThanOrEqual(3);
		const covers = await coversBySql(sequelize, carParkId, 'deck', 'XD3');
		const calibration = fitCalibration(
			holes.map((h) => h.r),
			holes.map((h) => h.m)
		);
		// The engine on readings and holes read by SQL here (the service reads cover counts).
		const engine = assessCalibrated(covers, calibration, body.population.requirement.requirement, {
			fractileP: 0.05,
			confidence: 0.95,
			percentileType: 7,
			model: 'best-fit',
			characteristicMethod: 'prediction',
			charts: true
		});
		expect(outcome.calibrated!.calibration).toEqual(JSON.parse(JSON.stringify(calibration)));
		expect(outcome.calibrated!.spread.slope).toBeCloseTo(engine.spread.slope, 12);
		expect(outcome.calibrated!.assessment.characteristic.chosenMm).toBeCloseTo(
			engine.assessment.characteristic.chosenMm,
			9
		);
		expect(outcome.calibrated!.assessment.verdict).toBe(engine.assessment.verdict);
		expect(outcome.calibrated!.predictiveShareBelowCMin).toBeCloseTo(
			engine.predictiveShareBelowCMin,
			12
		);
		expect(outcome.asRead).toBe(body.population.assessment!.verdict);
		const same = outcome.asRead === outcome.calibrated!.assessment.verdict;
		expect(outcome.sentence).toMatch(
			same
				? /^Applying the check-hole calibration does not change the outcome/
				: /^Applying the check-hole calibration changes the outcome from/
		);
		expect(outcome.method).toMatch(/s·√\(1 \+ 1\/n \+ \(r − r̄\)²\/Sxx\)/);
	});

	it('leaves the calibration out unless asked, and refuses an unknown choice naming the field', async () => {
		const plain = await detail('type=deck&exposure=XD3');
		expect(plain.status).toBe(200);
		expect(plain.body.calibration).toBeNull();
		const bad = await detail('type=deck&exposure=XD3&calibration=yes');
		expect(bad.status).toBe(400);
		expect(bad.body.error?.field).toBe('calibration');
		expect(bad.body.error?.message).toBe('calibration: The calibration is none or apply.');
	});

	it('a population without check holes says in words why nothing was applied', async () => {
		const holes = await holesBySql('column', 'XD3');
		const { status, body } = await detail('type=column&exposure=XD3&calibration=apply');
		expect(status).toBe(200);
		expect(body.calibration!.calibrated).toBeNull();
		// The demo drills no check holes in the columns.
		expect(holes.length).toBe(0);
		expect(body.calibration!.problem).toBe(
			'The calibration needs at least 3 check holes; there are 0.'
		);
		expect(body.calibration!.sentence).toMatch(/^The check-hole calibration was not applied\./);
	});

	/** A draft saved over the API, and its snapshot as stored. */
	async function saveOverApi(body: Record<string, unknown>) {
		const response = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
			title: 'Deck cover with the meter calibrated',
			...body
		});
		const saved = (await response.json()) as {
			assessment?: { id: number };
			error?: { field?: string; message: string };
		};
		if (response.status !== 201) return { status: response.status, saved, snapshot: null };
		const read = await engineer.get(`/api/v1/assessments/${saved.assessment!.id}`, JSON_ACCEPT);
		const { assessment } = (await read.json()) as { assessment: { snapshot: AssessmentSnapshot } };
		return { status: response.status, saved, snapshot: assessment.snapshot };
	}

	it('an assessment saved with the calibration keeps, for each population, what the detail page shows, and its report prints it', async () => {
		const { status, saved, snapshot } = await saveOverApi({ calibration: 'apply' });
		expect(status).toBe(201);
		expect(snapshot!.calibration).toBe('apply');
		const deck = snapshot!.populations.find(
			(p) => p.key.memberType === 'deck' && p.key.exposureClass === 'XD3'
		)!;
		// The same surveys through the detail API: one engine, one answer.
		const surveys = snapshot!.scope.surveyIds!.join(',');
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?surveys=${surveys}&type=deck&exposure=XD3&calibration=apply`,
			JSON_ACCEPT
		);
		const fromPage = ((await response.json()) as { calibration: CalibrationOutcome }).calibration;
		expect(deck.calibration!.problem).toBeNull();
		expect(deck.calibration!.calibrated!.calibration).toEqual(fromPage.calibrated!.calibration);
		expect(deck.calibration!.calibrated!.assessment.characteristic.chosenMm).toBe(
			fromPage.calibrated!.assessment.characteristic.chosenMm
		);
		expect(deck.calibration!.sentence).toBe(fromPage.sentence);
		// The verdict kept as the assessment's is that of the readings as logged.
		expect(deck.calibration!.asRead).toBe(deck.assessment!.verdict);
		// Every population says something: calibrated, or why not.
		for (const p of snapshot!.populations) expect(p.calibration?.sentence).toBeTruthy();

		const row = (await Assessment.findByPk(saved.assessment!.id))!;
		await approveDirectly(row);
		const pdf = await engineer.get(`/api/v1/assessments/${row.id}/report`);
		expect(pdf.status).toBe(200);
		mkdirSync('test-results', { recursive: true });
		const file = 'test-results/report-calibrated.pdf';
		writeFileSync(file, Buffer.from(await pdf.arrayBuffer()));
		const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Check-hole calibration');
		expect(text).toContain(deck.calibration!.sentence.slice(0, 40));
		// The table's rows carry the snapshot's figures as the report formats them.
		const asLogged = mm(deck.assessment!.characteristic.chosenMm);
		const calibrated = mm(deck.calibration!.calibrated!.assessment.characteristic.chosenMm);
		expect(text).toMatch(new RegExp(`As logged +${asLogged.replace('.', '\\.')}`));
		expect(text).toMatch(new RegExp(`Calibrated +${calibrated.replace('.', '\\.')}`));
		expect(text).toMatch(/From \d+ check holes: measured = /);
		const clashes = overlappingLines(textLines(file)).map(
			([a, b]) => `page ${a.page}: “${a.text}” over “${b.text}”`
		);
		expect(clashes).toEqual([]);
	});

	it('an assessment saved without the calibration carries none, and an unknown choice is refused naming the field', async () => {
		const { status, snapshot } = await saveOverApi({});
		expect(status).toBe(201);
		expect(snapshot!.calibration).toBeUndefined();
		expect(snapshot!.populations.every((p) => p.calibration === undefined)).toBe(true);
		const bad = await saveOverApi({ calibration: 'yes' });
		expect(bad.status).toBe(400);
		expect(bad.saved.error?.field).toBe('calibration');
	});
});
