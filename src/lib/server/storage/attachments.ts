import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import type { Transaction } from 'sequelize';
import { fileTypeFromFile } from 'file-type';
import sharp from 'sharp';
import { Attachment } from '../db/models';
import type { AttachmentKind } from '../db/models/Attachment';
import { recordAudit } from '../audit';
import { InputError } from '../domainErrors';
import { readSample, removeStaged, stageUpload } from '../import/stage';
import { sniffFormat } from '../import/sniff';
import { assertSurveyEditable } from '../intake/frozen';
import type { Actor } from '../policy';
import { scopedSurvey } from '../access';
import { deleteObject, putObject } from './s3';
import { sanitiseFileName } from './names';

export const ATTACHMENT_MAX_BYTES = 25 * 1024 * 1024;
const IMAGE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);
/** Types each kind may hold, judged from the bytes (SVG and HTML never: they can carry script). */
const ALLOWED: Record<AttachmentKind, (mime: string) => boolean> = {
	photo: (m) => IMAGE_TYPES.has(m),
	drawing: (m) => IMAGE_TYPES.has(m) || m === 'application/pdf',
	'meter-file': (m) => m !== 'text/html' && m !== 'image/svg+xml',
	other: (m) =>
		IMAGE_TYPES.has(m) ||
		m === 'application/pdf' ||
		m === 'text/plain' ||
		m.startsWith('application/vnd.openxmlformats')
};

async function contentTypeOf(path: string, fileName: string): Promise<string> {
	const type = await fileTypeFromFile(path);
	if (type) return type.mime;
	// No magic number: text if it reads as text (a meter's CSV export), else opaque bytes.
	const isText = await sniffFormat(await readSample(path), fileName).then(
		() => true,
		() => false
	);
	return isText ? 'text/plain' : 'application/octet-stream';
}

async function thumbnail(path: string): Promise<Buffer | null> {
	try {
		return await sharp(path)
			.rotate()
			.resize(320, 320, { fit: 'inside' })
			.jpeg({ quality: 75 })
			.toBuffer();
	} catch {
		return null; // a damaged image keeps its bytes; it just has no thumbnail
	}
}

export interface AttachmentUpload {
	kind: AttachmentKind;
	fileName: string;
	caption: string | null;
	memberId: number | null;
}

/**
 * Stores a file with a survey: size limited while streaming, type judged from the bytes, name
 * sanitised, a thumbnail for images. Objects are written first and removed again if the record
 * cannot be, so nothing is left half-recorded.
 */
export async function uploadAttachment(
	actor: Actor,
	surveyId: number,
	input: AttachmentUpload,
	body: ReadableStream<Uint8Array> | Readable,
	/** Runs in the record's transaction (a site sync takes its photo's client id there). */
	claim?: (attachmentId: number, transaction: Transaction) => Promise<void>
) {
	const { survey } = await scopedSurvey(actor, surveyId, 'write');
	assertSurveyEditable(survey);
	const staged = await stageUpload(body, ATTACHMENT_MAX_BYTES);
	const keys: string[] = [];
	try {
		if (staged.bytes === 0) throw new InputError('The file is empty.', { file: ['Empty file.'] });
		const fileName = sanitiseFileName(input.fileName);
		const contentType = await contentTypeOf(staged.path, fileName);
		if (!ALLOWED[input.kind](contentType)) {
			throw new InputError(`A ${input.kind} cannot be a file of type ${contentType}.`, {
				file: [`Type ${contentType} is not accepted here.`]
			});
		}
		const storageKey = `attachments/${survey.id}/${randomUUID()}`;
		// The thumbnail is made before anything is stored: the gap between the two objects, where
		// storage going away would strand the first, stays as short as the network allows.
		const thumb = IMAGE_TYPES.has(contentType) ? await thumbnail(staged.path) : null;
		await putObject(storageKey, createReadStream(staged.path), contentType, staged.bytes);
		keys.push(storageKey);
		let thumbnailKey: string | null = null;
		if (thumb) {
			thumbnailKey = `${storageKey}.thumb.jpg`;
			await putObject(thumbnailKey, thumb, 'image/jpeg', thumb.length);
			keys.push(thumbnailKey);
		}
		return await Attachment.sequelize!.transaction(async (transaction) => {
			const attachment = await Attachment.create(
				{
					surveyId: survey.id,
					memberId: input.memberId,
					kind: input.kind,
					fileName,
					contentType,
					byteSize: staged.bytes,
					sha256: staged.sha256,
					storageKey,
					thumbnailKey,
					caption: input.caption,
					uploadedByUserId: actor.userId
				},
				{ transaction }
			);
			await recordAudit(
				{
					action: 'attachment.uploaded',
					organisationId: actor.organisationId,
					userId: actor.userId,
					subjectType: 'attachment',
					subjectId: attachment.id,
					detail: { fileName, contentType, bytes: staged.bytes }
				},
				transaction
			);
			await claim?.(attachment.id, transaction);
			return attachment;
		});
	} catch (err) {
		await removeObjects(keys);
		throw err;
	} finally {
		await removeStaged(staged.path);
	}
}

/** Removes what a failed upload stored; an object storage would not let go of is logged. */
async function removeObjects(keys: string[]): Promise<void> {
	await Promise.all(
		keys.map((key) =>
			deleteObject(key).catch((err) =>
				console.error(`object ${key} was left in storage by a failed upload:`, err.message)
			)
		)
	);
}

/** A survey's attachments, newest first (the caller has checked the survey is visible). */
export function listAttachments(surveyId: number): Promise<Attachment[]> {
	return Attachment.findAll({ where: { surveyId }, order: [['id', 'DESC']] });
}
