import { QueryTypes, type Sequelize } from 'sequelize';
import { hashPassword } from '../src/lib/server/auth/password';
import {
	Asset,
	AssetShare,
	ImportBatch,
	Member,
	Membership,
	Organisation,
	Reading,
	Survey,
	User,
	VerificationHole
} from '../src/lib/server/db/models';
import { READING_INSERT_FIELDS } from '../src/lib/server/db/models/Reading';
import { useDatabase } from '../src/lib/server/db';
import { rebuildCoverCounts } from '../src/lib/server/readings/coverSets';
import { signOffDemoAssessments } from './assessments';
import { loadDemoMeasurements } from './loadMeasurements';
import { generateHoles, generateReadings, specifiedCover } from './generate';
import { SeededRandom } from './random';
import {
	DEMO_PASSWORD,
	demoAssessments,
	demoAssets,
	demoOrganisations,
	demoPeople,
	type DemoSurveyPlan
} from './scenario';

export const DEMO_SEED = 20_240_312;

export async function isDatabaseEmpty(sequelize: Sequelize): Promise<boolean> {
	const row = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM organisations', {
		type: QueryTypes.SELECT,
		plain: true
	});
	return Number(row?.n ?? 0) === 0;
}

/**
 * Empties every table but the migration record. The tables are read from the schema rather than
 * listed here, so a table a later migration adds is emptied too (a hand list once missed the
 * custom populations, whose names then collided with the next run's). Sequences (reading ids)
 * are not tables and keep counting.
 */
export async function clearAllData(sequelize: Sequelize): Promise<void> {
	const tables = await sequelize.query<{ name: string }>(
		`SELECT table_name AS name FROM information_schema.tables
		 WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND table_name <> 'schema_migrations'`,
		{ type: QueryTypes.SELECT }
	);
	await sequelize.query('SET FOREIGN_KEY_CHECKS = 0', { type: QueryTypes.RAW });
	try {
		for (const { name } of tables)
			await sequelize.query(`TRUNCATE TABLE \`${name}\``, { type: QueryTypes.RAW });
	} finally {
		await sequelize.query('SET FOREIGN_KEY_CHECKS = 1', { type: QueryTypes.RAW });
	}
}

/**
 * Writes the demo scenario: the records in one transaction, then the assessments through the
 * app's services (each its own transaction, as in the app). All of it or nothing: if signing off
 * fails, every table is emptied again.
 */
export async function loadDemoScenario(
	sequelize: Sequelize
): Promise<{ readings: number; members: number; assessments: number }> {
	const counts = await loadRecords(sequelize);
	// The services reach the database through db(): make it this instance, not a second pool.
	useDatabase(sequelize);
	try {
		const ids = await signOffDemoAssessments(demoAssessments);
		return { ...counts, assessments: ids.length };
	} catch (e) {
		await clearAllData(sequelize);
		throw e;
	}
}

async function loadRecords(sequelize: Sequelize): Promise<{ readings: number; members: number }> {
	const rng = new SeededRandom(DEMO_SEED);
	const passwordHash = await hashPassword(DEMO_PASSWORD);
	let readingCount = 0;
	let memberCount = 0;
	await sequelize.transaction(async (transaction) => {
		const orgIds = new Map<string, number>();
		for (const org of demoOrganisations) {
			const created = await Organisation.create(org, { transaction });
			orgIds.set(org.name, created.id);
		}
		const userIds = new Map<string, number>();
		for (const person of demoPeople) {
			const organisationId = orgIds.get(person.organisation)!;
			const user = await User.create(
				{
					email: person.email,
					displayName: person.displayName,
					passwordHash,
					activeOrganisationId: organisationId
				},
				{ transaction }
			);
			await Membership.create(
				{ userId: user.id, organisationId, role: person.role },
				{ transaction }
			);
			userIds.set(person.email, user.id);
		}
		const consultancyId = orgIds.get(demoOrganisations[0].name)!;
		for (const plan of demoAssets) {
			const asset = await Asset.create(
				{
					organisationId: consultancyId,
					name: plan.name,
					locationText: plan.locationText,
					description: plan.description,
					yearOfConstruction: plan.yearOfConstruction,
					designCode: 'EN 1992-1-1',
					unitSystem: 'mm',
					designServiceLifeYears: plan.designServiceLifeYears,
					researchOptIn: plan.researchOptIn,
					researchOptInChangedAt: plan.researchOptIn ? new Date('2025-01-15T09:00:00Z') : null
				},
				{ transaction }
			);
			for (const grantee of plan.sharedWith) {
				await AssetShare.create(
					{ assetId: asset.id, organisationId: orgIds.get(grantee)!, sharedByUserId: null },
					{ transaction }
				);
			}
			for (const surveyPlan of plan.surveys) {
				const counts = await loadSurvey(asset.id, surveyPlan, userIds, rng, transaction);
				readingCount += counts.readings;
				memberCount += counts.members;
			}
		}
		await loadDemoMeasurements(transaction);
	});
	return { readings: readingCount, members: memberCount };
}

async function loadSurvey(
	assetId: number,
	plan: DemoSurveyPlan,
	userIds: Map<string, number>,
	rng: SeededRandom,
	transaction: import('sequelize').Transaction
) {
	const surveyorUserId = userIds.get(plan.surveyorEmail) ?? null;
	const reviewed = plan.status === 'approved' || plan.status === 'returned';
	const survey = await Survey.create(
		{
			assetId,
			title: plan.title,
			surveyDate: plan.surveyDate,
			surveyorUserId,
			surveyorName: null,
			meterMake: plan.meterMake,
			meterSerial: plan.meterSerial,
			meterCalibration: plan.meterCalibration,
			status: plan.status,
			notes: plan.notes,
			submittedAt: plan.status === 'draft' ? null : new Date(`${plan.surveyDate}T17:00:00Z`),
			reviewedAt: reviewed ? new Date(`${plan.surveyDate}T17:00:00Z`) : null,
			reviewedByUserId: reviewed ? (userIds.get('engineer@kestrel-lane.example') ?? null) : null
		},
		{ transaction }
	);
	const batch = await ImportBatch.create(
		{
			surveyId: survey.id,
			createdByUserId: surveyorUserId,
			sourceFormat: 'csv',
			fileName: `${plan.surveyDate}-meter-log.csv`,
			fileSha256: null,
			fileBytes: null,
			state: 'completed',
			finishedAt: new Date(`${plan.surveyDate}T18:00:00Z`)
		},
		{ transaction }
	);
	let readings = 0;
	const memberReadings: { memberId: number; rows: ReturnType<typeof generateReadings> }[] = [];
	for (const memberPlan of plan.members) {
		const specified = specifiedCover(memberPlan);
		const member = await Member.create(
			{
				surveyId: survey.id,
				assetId,
				label: memberPlan.label,
				memberType: memberPlan.memberType,
				face: memberPlan.face,
				exposureClass: memberPlan.exposureClass,
				requirementSource: 'EN 1992-1-1',
				structuralClass: 'S4',
				...specified,
				deltaPlusMm: 15,
				barDiameterMm: memberPlan.barDiameterMm,
				barSpacingMm: memberPlan.barSpacingMm,
				spacingToleranceMm: 25,
				memberDepthMm: memberPlan.memberDepthMm,
				gridWidthMm: memberPlan.gridWidthMm,
				gridHeightMm: memberPlan.gridHeightMm
			},
			{ transaction }
		);
		const rows = generateReadings(memberPlan, rng, plan.resolutionMm);
		memberReadings.push({ memberId: member.id, rows });
		for (let start = 0; start < rows.length; start += 5000) {
			const chunk = rows
				.slice(start, start + 5000)
				.map((r) => ({ ...r, memberId: member.id, importBatchId: batch.id, note: null }));
			await Reading.bulkCreate(chunk, {
				transaction,
				validate: false,
				hooks: false,
				fields: [...READING_INSERT_FIELDS]
			});
		}
		readings += rows.length;
	}
	for (let i = 0; i < plan.verificationHoleCount; i++) {
		const target = memberReadings[(i * 3) % memberReadings.length];
		const [hole] = generateHoles(target.rows, 1, rng);
		await VerificationHole.create(
			{
				...hole,
				label: `H${i + 1}`,
				memberId: target.memberId,
				barDiameterMm: null,
				method: 'drilled'
			},
			{ transaction }
		);
	}
	const [range] = await Reading.sequelize!.query<{ first: number; last: number }>(
		'SELECT MIN(id) AS first, MAX(id) AS last FROM readings WHERE member_id IN (:members)',
		{
			type: QueryTypes.SELECT,
			replacements: { members: memberReadings.map((m) => m.memberId) },
			transaction
		}
	);
	await batch.update(
		{
			rowsTotal: readings,
			rowsImported: readings,
			firstReadingId: range?.first ?? null,
			lastReadingId: range?.last ?? null
		},
		{ transaction }
	);
	// The members' summary rows, as an import keeps them (src/lib/server/readings/coverSets.ts).
	await rebuildCoverCounts(
		transaction,
		memberReadings.map((m) => m.memberId)
	);
	return { readings, members: plan.members.length };
}

export interface DemoSummary {
	counts: Record<string, number>;
	/** Every measurement as stored, in id order (the seeded generator must give the same). */
	measurements: { carbonation: unknown[]; chloride: unknown[] };
	/** Each assessment with its snapshot and annex, the moment of computing left out. */
	assessments: { title: string; state: string; snapshot: unknown; annex: unknown }[];
	populations: {
		memberType: string;
		exposureClass: string;
		n: number;
		meanMm: number;
		sdMm: number;
		minMm: number;
		maxMm: number;
	}[];
}

/** Counts and per-population figures, for checking that two seed runs agree. */
export async function summariseDemo(sequelize: Sequelize): Promise<DemoSummary> {
	const counts: Record<string, number> = {};
	for (const table of [
		'organisations',
		'users',
		'memberships',
		'assets',
		'asset_shares',
		'surveys',
		'members',
		'readings',
		'verification_holes',
		'carbonation_tests',
		'chloride_profiles',
		'chloride_increments',
		'assessments',
		'assessment_risks'
	]) {
		const row = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${table}\``, {
			type: QueryTypes.SELECT,
			plain: true
		});
		counts[table] = Number(row?.n);
	}
	const populations = await sequelize.query<DemoSummary['populations'][number]>(
		`SELECT m.member_type AS memberType, m.exposure_class AS exposureClass, COUNT(*) AS n,
		        ROUND(AVG(r.cover_mm), 6) AS meanMm, ROUND(STDDEV_SAMP(r.cover_mm), 6) AS sdMm,
		        MIN(r.cover_mm) AS minMm, MAX(r.cover_mm) AS maxMm
		   FROM readings r JOIN members m ON m.id = r.member_id
		  GROUP BY m.member_type, m.exposure_class ORDER BY m.member_type, m.exposure_class`,
		{ type: QueryTypes.SELECT }
	);
	return {
		counts,
		assessments: await assessmentContents(sequelize),
		measurements: {
			carbonation: await sequelize.query(
				`SELECT m.label AS member, c.label, c.x_mm, c.y_mm, c.tested_on, c.depths_mm, c.depth_min_mm,
				        c.depth_mean_mm, c.depth_max_mm, c.method
				   FROM carbonation_tests c JOIN members m ON m.id = c.member_id ORDER BY c.id`,
				{ type: QueryTypes.SELECT }
			),
			chloride: await sequelize.query(
				`SELECT p.label, p.basis, p.binder_content_kg_m3, p.initial_content_percent, i.position,
				        i.from_mm, i.to_mm, i.chloride_percent, i.outermost
				   FROM chloride_profiles p JOIN chloride_increments i ON i.profile_id = p.id
				  ORDER BY p.id, i.position`,
				{ type: QueryTypes.SELECT }
			)
		},
		populations: populations.map((p) => ({
			...p,
			n: Number(p.n),
			meanMm: Number(p.meanMm),
			sdMm: Number(p.sdMm)
		}))
	};
}

/** The stored assessments as plain objects, without the computing time (the one thing a rerun changes). */
async function assessmentContents(sequelize: Sequelize): Promise<DemoSummary['assessments']> {
	const rows = await sequelize.query<{
		title: string;
		state: string;
		snapshot: string;
		annex: string | null;
	}>(
		`SELECT a.title, a.state, a.snapshot, r.annex FROM assessments a
		   LEFT JOIN assessment_risks r ON r.assessment_id = a.id ORDER BY a.id`,
		{ type: QueryTypes.SELECT }
	);
	const timeless = (text: string | null) => {
		if (text === null) return null;
		const { computedAt: _computedAt, ...rest } = JSON.parse(text) as Record<string, unknown>;
		return rest;
	};
	return rows.map((r) => ({
		title: r.title,
		state: r.state,
		snapshot: timeless(r.snapshot),
		annex: timeless(r.annex)
	}));
}
