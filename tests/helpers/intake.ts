import { Readable } from 'node:stream';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
	Asset,
	ImportBatch,
	Member,
	Membership,
	Organisation,
	Survey,
	User
} from '../../src/lib/server/db/models';
import { receiveUpload, startImport } from '../../src/lib/server/import/batches';
import {
	columnMappingSchema,
	importOptionsSchema,
	type ImportOptions
} from '../../src/lib/server/import/mapping';
import type { Actor } from '../../src/lib/server/policy';
import { testSequelize } from './database';

/** The demo user with `email` as an actor in their organisation. */
export async function actorFor(email: string): Promise<Actor> {
	const user = await User.findOne({ where: { email } });
	const membership = await Membership.findOne({ where: { userId: user!.id } });
	return { userId: user!.id, organisationId: membership!.organisationId, role: membership!.role };
}

let counter = 0;

/** A fresh asset of `actor`'s organisation (so earlier runs' files are not duplicates). */
export async function freshAsset(actor: Actor) {
	return Asset.create({
		organisationId: actor.organisationId,
		name: `Intake test asset ${Date.now()}-${++counter}`,
		locationText: null,
		yearOfConstruction: null,
		designCode: 'EN 1992-1-1',
		designServiceLifeYears: 50
	});
}

/** A fresh draft survey on a fresh asset of `actor`'s organisation, with members of `labels`. */
export async function freshSurvey(
	actor: Actor,
	labels: string[] = ['M-01', 'M-02', 'M-03'],
	onAsset?: Asset
) {
	counter++;
	const asset = onAsset ?? (await freshAsset(actor));
	const survey = await Survey.create({
		assetId: asset.id,
		title: `Intake test survey ${Date.now()}-${counter}`,
		surveyDate: '2026-03-02',
		surveyorUserId: actor.userId,
		surveyorName: null,
		meterMake: null,
		meterSerial: null,
		meterCalibration: null
	});
	const members = [];
	for (const label of labels) {
		members.push(
			await Member.create({
				surveyId: survey.id,
				assetId: asset.id,
				label,
				memberType: 'slab',
				face: 'top',
				exposureClass: 'XC3',
				requirementSource: 'EN 1992-1-1',
				structuralClass: 'S4',
				cMinMm: 25,
				cNomMm: 35,
				deltaCDevMm: 10,
				deltaPlusMm: null,
				barDiameterMm: 12,
				barSpacingMm: 200,
				spacingToleranceMm: null,
				memberDepthMm: 200,
				gridWidthMm: 5000,
				gridHeightMm: 5000
			})
		);
	}
	return { asset, survey, members };
}

/** An organisation that is not the demo's, with a user, an asset, a survey and a member. */
export async function otherOrganisation() {
	const slug = `other-${Date.now()}-${++counter}`;
	const org = await Organisation.create({ name: `Other Org ${slug}`, slug });
	const user = await User.create({
		email: `${slug}@other.example`,
		displayName: 'Other Person',
		passwordHash: null,
		activeOrganisationId: org.id
	});
	await Membership.create({ userId: user.id, organisationId: org.id, role: 'engineer' });
	const actor: Actor = { userId: user.id, organisationId: org.id, role: 'engineer' };
	return { actor, ...(await freshSurvey(actor, ['OTHER-01'])) };
}

export const standardMapping = columnMappingSchema.parse({ memberLabel: 0, x: 1, y: 2, cover: 3 });

export function options(overrides: Partial<ImportOptions> = {}): ImportOptions {
	return importOptionsSchema.parse({ headerRowIndex: 0, ...overrides });
}

/** Uploads and imports `content` the way the routes do, waiting for the end. */
export async function importFile(
	actor: Actor,
	surveyId: number,
	fileName: string,
	content: string | Buffer,
	mapping = standardMapping,
	opts: Partial<ImportOptions> = {}
) {
	const upload = await receiveUpload(
		actor,
		surveyId,
		fileName,
		Readable.from([Buffer.from(content)])
	);
	const { mixedDecimalMarks, ...detected } = upload.preview.settings;
	void mixedDecimalMarks;
	const started = await startImport(actor, upload.batchId, {
		mapping,
		options: options({ ...detected, ...opts }),
		confirmDuplicate: false,
		saveTemplateAs: null
	});
	const outcome = await started.done;
	const batch = await ImportBatch.findByPk(upload.batchId);
	return { upload, outcome, batch: batch! };
}

export async function countReadings(
	sequelize: Sequelize,
	where: { surveyId?: number; batchId?: number }
) {
	const sql = where.batchId
		? 'SELECT COUNT(*) AS n FROM readings WHERE import_batch_id = ?'
		: 'SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id WHERE m.survey_id = ?';
	const [row] = await sequelize.query<{ n: number }>(sql, {
		replacements: [where.batchId ?? where.surveyId],
		type: QueryTypes.SELECT
	});
	return Number(row.n);
}

export function csv(lines: string[]): string {
	return lines.join('\n') + '\n';
}

export { testSequelize };
