import {
	DeleteObjectCommand,
	GetObjectCommand,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import { z } from 'zod';

/** Object storage settings: any S3-compatible service; the s3rver fake in development/tests. */
const storageEnvSchema = z.object({
	S3_ENDPOINT: z.url().optional(),
	S3_REGION: z.string().min(1).default('us-east-1'),
	S3_BUCKET: z.string().min(1, 'S3_BUCKET is required'),
	S3_ACCESS_KEY_ID: z.string().min(1, 'S3_ACCESS_KEY_ID is required'),
	S3_SECRET_ACCESS_KEY: z.string().min(1, 'S3_SECRET_ACCESS_KEY is required')
});

let client: { s3: S3Client; bucket: string } | null = null;

function storage() {
	if (!client) {
		const parsed = storageEnvSchema.safeParse(process.env);
		if (!parsed.success) {
			throw new Error(
				`Object storage settings are incomplete: ${parsed.error.issues.map((i) => i.message).join('; ')}`
			);
		}
		const env = parsed.data;
		client = {
			bucket: env.S3_BUCKET,
			s3: new S3Client({
				endpoint: env.S3_ENDPOINT,
				region: env.S3_REGION,
				// Path-style URLs (http://host/bucket/key): the fake and most S3-compatible services need them.
				forcePathStyle: true,
				// Newer SDKs send bodies aws-chunked with a trailing checksum by default; s3rver and
				// several S3-compatible services store that framing as the object's bytes.
				requestChecksumCalculation: 'WHEN_REQUIRED',
				responseChecksumValidation: 'WHEN_REQUIRED',
				credentials: {
					accessKeyId: env.S3_ACCESS_KEY_ID,
					secretAccessKey: env.S3_SECRET_ACCESS_KEY
				}
			})
		};
	}
	return client;
}

export async function putObject(
	key: string,
	body: Buffer | Readable,
	contentType: string,
	bytes: number
) {
	const { s3, bucket } = storage();
	await s3.send(
		new PutObjectCommand({
			Bucket: bucket,
			Key: key,
			Body: body,
			ContentType: contentType,
			ContentLength: bytes
		})
	);
}

export async function getObject(key: string) {
	const { s3, bucket } = storage();
	const result = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
	return { body: result.Body as Readable, bytes: result.ContentLength ?? null };
}

export async function deleteObject(key: string) {
	const { s3, bucket } = storage();
	await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

/** Closes the client's pooled sockets (graceful shutdown): they would keep the process alive. */
export function closeStorage(): void {
	client?.s3.destroy();
	client = null;
}
