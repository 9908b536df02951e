import {
	DeleteObjectCommand,
	GetObjectCommand,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import { z } from 'zod';
import { StorageUnavailableError } from '../domainErrors';
import { isStorageUnreachable } from './unreachable';

/** Object storage settings: any S3-compatible service; the s3rver fake in development/tests. */
const storageEnvSchema = z.object({
	S3_ENDPOINT: z.url().optional(),
	S3_REGION: z.string().min(1).default('us-east-1'),
	S3_BUCKET: z.string().min(1, 'S3_BUCKET is required'),
	S3_ACCESS_KEY_ID: z.string().min(1, 'S3_ACCESS_KEY_ID is required'),
	S3_SECRET_ACCESS_KEY: z.string().min(1, 'S3_SECRET_ACCESS_KEY is required'),
	// docs/scaling.md, "Timeouts": why these values.
	S3_CONNECT_TIMEOUT_MS: z.coerce.number().int().min(100).default(3_000),
	S3_REQUEST_TIMEOUT_MS: z.coerce.number().int().min(100).default(20_000)
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
				// Every wait bounded, so storage that is down or hung is a prompt 503, not a held
				// request: the SDK's defaults wait for ever on a connect or an answer.
				requestHandler: {
					connectionTimeout: env.S3_CONNECT_TIMEOUT_MS,
					requestTimeout: env.S3_REQUEST_TIMEOUT_MS,
					throwOnRequestTimeout: true,
					// No bytes either way for this long while a download streams: the service is stuck.
					socketTimeout: env.S3_REQUEST_TIMEOUT_MS
				},
				// One retry for a passing fault, not the default two, so the worst wait stays near two
				// request timeouts. Streamed bodies (uploads) are never retried by the SDK.
				maxAttempts: 2,
				credentials: {
					accessKeyId: env.S3_ACCESS_KEY_ID,
					secretAccessKey: env.S3_SECRET_ACCESS_KEY
				}
			})
		};
	}
	return client;
}

/** Runs one storage call; an outage becomes StorageUnavailableError, logged for operators. */
async function call<T>(operation: string, key: string, request: () => Promise<T>): Promise<T> {
	try {
		return await request();
	} catch (err) {
		if (!isStorageUnreachable(err)) throw err;
		const e = err as { name?: string; code?: string; message?: string };
		console.warn(
			`object storage unavailable (${operation} ${key}): ${e.code ?? e.name} ${e.message ?? ''}`
		);
		// No `cause`: the socket error's code would make handleError take it for the database.
		throw new StorageUnavailableError();
	}
}

export async function putObject(
	key: string,
	body: Buffer | Readable,
	contentType: string,
	bytes: number
) {
	const { s3, bucket } = storage();
	await call('PUT', key, () =>
		s3.send(
			new PutObjectCommand({
				Bucket: bucket,
				Key: key,
				Body: body,
				ContentType: contentType,
				ContentLength: bytes
			})
		)
	);
}

export async function getObject(key: string) {
	const { s3, bucket } = storage();
	const result = await call('GET', key, () =>
		s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }))
	);
	return { body: result.Body as Readable, bytes: result.ContentLength ?? null };
}

/** Like getObject, but null when storage holds no object under `key` (S3's 404 NoSuchKey). */
export async function getObjectIfStored(key: string) {
	try {
		return await getObject(key);
	} catch (err) {
		const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
		if (e.name === 'NoSuchKey' || e.$metadata?.httpStatusCode === 404) return null;
		throw err;
	}
}

export async function deleteObject(key: string) {
	const { s3, bucket } = storage();
	await call('DELETE', key, () => s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key })));
}

/** Closes the client's pooled sockets (graceful shutdown): they would keep the process alive. */
export function closeStorage(): void {
	client?.s3.destroy();
	client = null;
}
