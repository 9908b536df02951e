/**
 * Writes the demo's measurements (seeds/measurements.ts) inside the seed's transaction: the
 * surveys are submitted or approved already, so the intake services (which refuse a frozen
 * survey) are not the way in; the rows are what those services write, increments included.
 */
import type { Transaction } from 'sequelize';
import {
	Asset,
	CarbonationTest,
	ChlorideIncrement,
	ChlorideProfile,
	Member,
	Survey
} from '../src/lib/server/db/models';
import { incrementRows } from '../src/lib/server/intake/chloride';
import { carParkProfiles, officeCarbonationTests } from './measurements';
import { demoAssets } from './scenario';

async function membersOf(assetIndex: number, transaction: Transaction) {
	const plan = demoAssets[assetIndex];
	const asset = await Asset.findOne({ where: { name: plan.name }, transaction });
	const survey = await Survey.findOne({
		where: { assetId: asset!.id, title: plan.surveys[0].title },
		transaction
	});
	const members = await Member.findAll({ where: { surveyId: survey!.id }, transaction });
	const idOf = (label: string) => {
		const found = members.find((m) => m.label === label);
		if (!found) throw new Error(`demo measurements: no member ${label}`);
		return found.id;
	};
	return { plan, idOf };
}

export async function loadDemoMeasurements(transaction: Transaction) {
	const carPark = await membersOf(0, transaction);
	const profiles = carParkProfiles(
		carPark.plan.yearOfConstruction,
		carPark.plan.surveys[0].surveyDate
	);
	for (const { memberLabel, input } of profiles) {
		const { increments, ...fields } = input;
		const profile = await ChlorideProfile.create(
			{ ...fields, memberId: carPark.idOf(memberLabel) },
			{ transaction }
		);
		await ChlorideIncrement.bulkCreate(incrementRows(profile.id, increments), { transaction });
	}
	const office = await membersOf(1, transaction);
	const tests = officeCarbonationTests(
		office.plan.yearOfConstruction,
		office.plan.surveys[0].surveyDate
	);
	for (const { memberLabel, input } of tests) {
		await CarbonationTest.create({ ...input, memberId: office.idOf(memberLabel) }, { transaction });
	}
	return { chlorideProfiles: profiles.length, carbonationTests: tests.length };
}
