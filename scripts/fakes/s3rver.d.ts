// s3rver ships no types; the little of it the storage fake uses.
declare module 's3rver' {
	interface S3rverOptions {
		address?: string;
		port?: number;
		directory: string;
		silent?: boolean;
		configureBuckets?: { name: string; configs: unknown[] }[];
	}
	export default class S3rver {
		constructor(options: S3rverOptions);
		run(): Promise<unknown>;
		close(): Promise<void>;
	}
}
