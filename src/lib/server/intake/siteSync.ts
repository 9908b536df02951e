import type { Readable } from 'node:stream';
import { UniqueConstraintError, type Transaction } from 'sequelize';
import { Member, SyncBatch, type Survey } from '../db/models';
import { InputError, StateError } from '../domainErrors';
import { ImportError } from '../import/errors';
import type { SiteBatch } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { scopedSurvey } from '../access';
import { uploadAttachment } from '../storage/attachments';
import { assertSurveyEditable, assertSurveyEditableLocked, frozenReason } from './frozen';
import { recordHole } from './holes';
import { importGridRows } from './manualEntry';

export interface SiteSyncAnswer {
	batchId: string;
	/** 'now' when this request wrote the batch; 'earlier' when a previous send already had. */
	received: 'now' | 'earlier';
	readings: number;
	holes: number;
	importBatchId: number | null;
	attachmentId: number | null;
}

const answerFrom = (row: SyncBatch, received: 'now' | 'earlier'): SiteSyncAnswer => ({
	batchId: row.clientBatchId,
	received,
	readings: row.readingsReceived,
	holes: row.holesReceived,
	importBatchId: row.importBatchId,
	attachmentId: row.attachmentId
});

function earlierSend(surveyId: number, clientBatchId: string) {
	return SyncBatch.findOne({ where: { surveyId, clientBatchId } });
}

const ALREADY = 'already-received';

/**
 * Takes the batch id inside the writing transaction, after the survey row's lock: a submit
 * either waits for this batch or is seen by it, and of two sends of one batch the second waits
 * on the unique key and then fails, writing nothing.
 */
async function claimBatch(
	survey: Survey,
	row: { clientBatchId: string; kind: 'entries' | 'photo' } & Partial<SyncBatch>,
	actor: Actor,
	transaction: Transaction
) {
	await assertSurveyEditableLocked(survey, transaction).catch((err) => {
		throw err instanceof StateError ? new ImportError('frozen', err.message, 409) : err;
	});
	try {
		await SyncBatch.create(
			{
				surveyId: survey.id,
				readingsReceived: 0,
				holesReceived: 0,
				importBatchId: null,
				attachmentId: null,
				receivedByUserId: actor.userId,
				...row
			},
			{ transaction }
		);
	} catch (err) {
		if (err instanceof UniqueConstraintError) {
			throw new ImportError(ALREADY, 'This batch was already received.', 200);
		}
		throw err;
	}
}

/** After a refused write: a send that won meanwhile answers; a frozen survey says so. */
async function afterRefusal(survey: Survey, clientBatchId: string, message: string) {
	const winner = await earlierSend(survey.id, clientBatchId);
	if (winner) return answerFrom(winner, 'earlier');
	await survey.reload();
	const reason = frozenReason(survey);
	if (reason) throw new StateError(reason);
	throw new InputError(message);
}

/**
 * A device's queued readings and check holes for one survey, written together through the
 * entry grid's own door (the import path: same checks, one transaction, all or nothing), once
 * per batch id whatever how often it is sent.
 */
export async function receiveSiteBatch(
	actor: Actor,
	surveyId: number,
	batch: SiteBatch
): Promise<SiteSyncAnswer> {
	const { survey } = await scopedSurvey(actor, surveyId, 'write');
	const earlier = await earlierSend(survey.id, batch.batchId);
	if (earlier) return answerFrom(earlier, 'earlier');
	assertSurveyEditable(survey);
	const members = await Member.findAll({ where: { surveyId }, attributes: ['id', 'label'] });
	const labelOf = new Map(members.map((m) => [m.id, m.label]));
	const stray = [...batch.readings, ...batch.holes].find((e) => !labelOf.has(e.memberId));
	if (stray) {
		throw new InputError(`Member ${stray.memberId} is not a member of this survey.`, {
			memberId: ['Not a member of this survey.']
		});
	}
	const claim = async (transaction: Transaction) => {
		await claimBatch(
			survey,
			{
				clientBatchId: batch.batchId,
				kind: 'entries',
				readingsReceived: batch.readings.length,
				holesReceived: batch.holes.length
			},
			actor,
			transaction
		);
		for (const [i, { memberId, clientId: _c, ...hole }] of batch.holes.entries()) {
			await recordHole(actor, memberId, hole, transaction).catch((err) => {
				if (!(err instanceof InputError)) throw err;
				throw new ImportError('hole-refused', `Hole ${i + 1} (${hole.label}): ${err.message}`);
			});
		}
	};
	if (batch.readings.length === 0) {
		try {
			await SyncBatch.sequelize!.transaction(claim);
		} catch (err) {
			if (!(err instanceof ImportError)) throw err;
			return afterRefusal(survey, batch.batchId, err.message);
		}
	} else {
		const outcome = await importGridRows({
			actor,
			survey,
			fileName: `site entries ${batch.batchId}`,
			units: batch.units,
			rows: batch.readings.map(({ memberId, clientId: _c, ...r }) => ({
				...r,
				memberLabel: labelOf.get(memberId)!
			})),
			claim
		});
		if (outcome.state !== 'completed') {
			return afterRefusal(survey, batch.batchId, outcome.message);
		}
		await SyncBatch.update(
			{ importBatchId: outcome.batchId },
			{ where: { surveyId, clientBatchId: batch.batchId } }
		);
	}
	return answerFrom((await earlierSend(survey.id, batch.batchId))!, 'now');
}

/** A photo of a location taken on site, stored once per client id. */
export async function receiveSitePhoto(
	actor: Actor,
	surveyId: number,
	photo: { clientId: string; memberId: number; fileName: string; caption: string | null },
	body: ReadableStream<Uint8Array> | Readable
): Promise<SiteSyncAnswer> {
	const { survey } = await scopedSurvey(actor, surveyId, 'write');
	const earlier = await earlierSend(survey.id, photo.clientId);
	if (earlier) return answerFrom(earlier, 'earlier');
	const member = await Member.findOne({ where: { id: photo.memberId, surveyId } });
	if (!member) {
		throw new InputError(`Member ${photo.memberId} is not a member of this survey.`, {
			memberId: ['Not a member of this survey.']
		});
	}
	try {
		await uploadAttachment(
			actor,
			surveyId,
			{ kind: 'photo', fileName: photo.fileName, caption: photo.caption, memberId: member.id },
			body,
			(attachmentId, transaction) =>
				claimBatch(
					survey,
					{ clientBatchId: photo.clientId, kind: 'photo', attachmentId },
					actor,
					transaction
				)
		);
	} catch (err) {
		if (!(err instanceof ImportError)) throw err;
		return afterRefusal(survey, photo.clientId, err.message);
	}
	return answerFrom((await earlierSend(survey.id, photo.clientId))!, 'now');
}
