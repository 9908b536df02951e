/**
 * Populations the engineer makes: members split out of a group, or any set of members of one
 * asset, saved with a name. Each is a list of member ids fed into the same population query and
 * judged by the same engine path as the automatic groups; a split also judges what is left of
 * the group it came from, so the page shows the two verdicts side by side.
 */
import { z } from 'zod';
import { UniqueConstraintError } from 'sequelize';
import { db, CustomPopulation, Member } from '$lib/server/db';
import { InputError, NotFoundError, ReadOnlyError } from '$lib/server/domainErrors';
import type { Actor } from '$lib/server/policy';
import { scopedAsset } from '$lib/server/access';
import { recordAudit } from '$lib/server/audit';
import { gatherAsOne, type PopulationKey } from './groups';
import type { MemberSpec } from './gather';
import { judgeGroup, type PopulationResult } from './service';
import type { MethodChoice } from './query';

const id = z.coerce.number().int().positive().max(4_294_967_295);

export const customPopulationSchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Give the population a name.')
		.max(120, 'The name is at most 120 characters.'),
	members: z
		.array(id, 'Choose the members by id.')
		.min(1, 'Choose at least one member.')
		.max(5000, 'At most 5000 members.'),
	/** The group the members are split out of, by its key ("deck|XD3"). */
	splitFrom: z
		.string()
		.trim()
		.regex(/^[a-z]+\|[A-Za-z0-9.+-]{1,24}$/, 'Split from a group key such as deck|XD3.')
		.optional()
});
export type CustomPopulationInput = z.infer<typeof customPopulationSchema>;

export interface CustomPopulationInfo {
	id: number;
	assetId: number;
	name: string;
	memberIds: number[];
	splitFrom: string | null;
	splitFromLabel: string | null;
	createdAt: string;
}

const info = (c: CustomPopulation): CustomPopulationInfo => ({
	id: c.id,
	assetId: c.assetId,
	name: c.name,
	memberIds: c.memberIds,
	splitFrom: c.splitFrom,
	splitFromLabel: c.splitFromLabel,
	createdAt: new Date(c.createdAt).toISOString()
});

/** The asset, when the actor's organisation owns it: a read-only share may look, not change. */
async function ownedAsset(actor: Actor, assetId: number) {
	const asset = await scopedAsset(actor, assetId, 'read');
	if (asset.organisationId !== actor.organisationId) {
		throw new ReadOnlyError('This asset is shared with you to read; its owner makes populations.');
	}
	return asset;
}

const duplicateName = (name: string) => {
	const message = `This asset already has a population named “${name}”.`;
	return new InputError(message, { name: [message] });
};

/** Save a custom population of an asset the actor's organisation owns; audited. */
export async function createCustomPopulation(
	actor: Actor,
	assetId: number,
	input: CustomPopulationInput
): Promise<CustomPopulationInfo> {
	await ownedAsset(actor, assetId);
	const memberIds = [...new Set(input.members)].sort((a, b) => a - b);
	const members = await Member.findAll({
		attributes: ['id', 'memberType', 'exposureClass'],
		where: { id: memberIds, assetId },
		raw: true
	});
	if (members.length !== memberIds.length) {
		const known = new Set(members.map((m) => m.id));
		const unknown = memberIds.find((m) => !known.has(m));
		throw new InputError(`Member ${unknown} is not a member of this asset.`, {
			members: [`Member ${unknown} is not a member of this asset.`]
		});
	}
	let splitFromLabel: string | null = null;
	if (input.splitFrom) {
		const [type, exposure] = input.splitFrom.split('|');
		const outside = members.find((m) => m.memberType !== type || m.exposureClass !== exposure);
		if (outside) {
			const message = `Member ${outside.id} is not in the group ${type} · ${exposure}.`;
			throw new InputError(message, { members: [message] });
		}
		// A split is judged beside what it leaves of the group: taking every member leaves nothing
		// to compare (the page's form refuses it too; this is the rule for every client).
		const inGroup = await Member.count({
			where: { assetId, memberType: type, exposureClass: exposure }
		});
		if (inGroup <= memberIds.length) {
			const message = `A split leaves at least one member in the group ${type} · ${exposure}; these are all ${inGroup} of its members.`;
			throw new InputError(message, { members: [message] });
		}
		splitFromLabel = `${type} · ${exposure}`;
	}
	try {
		return await db().transaction(async (transaction) => {
			const created = await CustomPopulation.create(
				{
					assetId,
					name: input.name,
					memberIds,
					splitFrom: input.splitFrom ?? null,
					splitFromLabel,
					createdBy: actor.userId
				},
				{ transaction }
			);
			await recordAudit(
				{
					action: 'population.custom.create',
					organisationId: actor.organisationId,
					userId: actor.userId,
					subjectType: 'custom_population',
					subjectId: created.id,
					detail: { assetId, name: input.name, memberIds, splitFrom: input.splitFrom ?? null }
				},
				transaction
			);
			return info(created);
		});
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicateName(input.name);
		throw err;
	}
}

export const renameSchema = z.object({ name: customPopulationSchema.shape.name });
export type RenameInput = z.infer<typeof renameSchema>;

/**
 * Rename a custom population of an asset the actor's organisation owns; audited with the old
 * and new names. Two renames to one name race on the unique index, as two saves do: one wins.
 */
export async function renameCustomPopulation(
	actor: Actor,
	assetId: number,
	customId: number,
	input: RenameInput
): Promise<CustomPopulationInfo> {
	await ownedAsset(actor, assetId);
	try {
		return await db().transaction(async (transaction) => {
			const row = await CustomPopulation.findOne({
				where: { id: customId, assetId },
				transaction,
				lock: transaction.LOCK.UPDATE
			});
			if (!row) throw new NotFoundError('The population');
			const before = row.name;
			row.name = input.name;
			await row.save({ transaction });
			await recordAudit(
				{
					action: 'population.custom.rename',
					organisationId: actor.organisationId,
					userId: actor.userId,
					subjectType: 'custom_population',
					subjectId: row.id,
					detail: { assetId, from: before, to: input.name }
				},
				transaction
			);
			return info(row);
		});
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicateName(input.name);
		throw err;
	}
}

/**
 * Delete a custom population of an asset the actor's organisation owns; audited with what it
 * held. Allowed even when an assessment carries it: a snapshot keeps its own copy of the
 * population (name, member ids and judged figures), so it reads the same after the delete.
 */
export async function deleteCustomPopulation(
	actor: Actor,
	assetId: number,
	customId: number
): Promise<void> {
	await ownedAsset(actor, assetId);
	await db().transaction(async (transaction) => {
		const row = await CustomPopulation.findOne({
			where: { id: customId, assetId },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!row) throw new NotFoundError('The population');
		await row.destroy({ transaction });
		await recordAudit(
			{
				action: 'population.custom.delete',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'custom_population',
				subjectId: row.id,
				detail: {
					assetId,
					name: row.name,
					memberIds: row.memberIds,
					splitFrom: row.splitFrom
				}
			},
			transaction
		);
	});
}

/** The custom populations of an asset (visibility is the caller's check), oldest first. */
export async function customPopulationsOf(
	assetId: number,
	ids?: readonly number[]
): Promise<CustomPopulationInfo[]> {
	if (ids && ids.length === 0) return [];
	const where = ids ? { assetId, id: [...ids] } : { assetId };
	const rows = await CustomPopulation.findAll({ where, order: [['id', 'ASC']] });
	if (ids && rows.length !== new Set(ids).size) throw new NotFoundError('The population');
	return rows.map(info);
}

export interface JudgedCustomPopulation {
	custom: CustomPopulationInfo;
	/** The chosen members' population, and for a split what is left of the source group. */
	populations: PopulationResult[];
}

function customKey(custom: CustomPopulationInfo, rest: boolean) {
	return (members: MemberSpec[]): PopulationKey => {
		const types = new Set(members.map((m) => m.memberType));
		const exposures = new Set(members.map((m) => m.exposureClass));
		return {
			memberType: types.size === 1 ? members[0].memberType : 'mixed',
			exposureClass: exposures.size === 1 ? members[0].exposureClass : 'mixed',
			customId: custom.id,
			...(rest ? { rest: true } : {})
		};
	};
}

/**
 * One custom population judged (and what is left of its source group), over the surveys in
 * scope; `part` picks one of the two. Chart data when `charts`.
 */
export async function judgeCustom(
	input: { assetId: number; surveyIds?: readonly number[]; choice: MethodChoice; charts?: boolean },
	custom: CustomPopulationInfo,
	part?: 'chosen' | 'rest'
) {
	const out: {
		result: PopulationResult;
		group: NonNullable<Awaited<ReturnType<typeof gatherAsOne>>>;
	}[] = [];
	const scope = { assetId: input.assetId, surveyIds: input.surveyIds };
	if (part !== 'rest') {
		const group = await gatherAsOne(
			{ ...scope, memberIds: custom.memberIds },
			customKey(custom, false)
		);
		if (group) {
			out.push({
				result: { ...judgeGroup(group, input.choice, input.charts ?? false), label: custom.name },
				group
			});
		}
	}
	if (custom.splitFrom && part !== 'chosen') {
		const [memberType, exposureClass] = custom.splitFrom.split('|');
		const chosen = new Set(custom.memberIds);
		const all = await Member.findAll({
			attributes: ['id'],
			where: { assetId: input.assetId, memberType, exposureClass },
			raw: true
		});
		const restIds = all.map((m) => m.id).filter((m) => !chosen.has(m));
		const group = await gatherAsOne({ ...scope, memberIds: restIds }, customKey(custom, true));
		if (group) {
			const label = `${custom.splitFromLabel} without ${custom.name}`;
			out.push({
				result: { ...judgeGroup(group, input.choice, input.charts ?? false), label },
				group
			});
		}
	}
	return out;
}

/** Every custom population of an asset judged, for the overview (no chart data). */
export async function customOverview(input: {
	assetId: number;
	surveyIds?: readonly number[];
	choice: MethodChoice;
	ids?: readonly number[];
	charts?: boolean;
}): Promise<JudgedCustomPopulation[]> {
	const customs = await customPopulationsOf(input.assetId, input.ids);
	const out: JudgedCustomPopulation[] = [];
	for (const custom of customs) {
		const judged = await judgeCustom(input, custom);
		out.push({ custom, populations: judged.map((j) => j.result) });
	}
	return out;
}
