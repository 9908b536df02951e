import { isHttpError, isRedirect } from '@sveltejs/kit';
import { apiError } from './http';
import {
	GoneError,
	InputError,
	NotFoundError,
	ReadOnlyError,
	StateError,
	StorageUnavailableError
} from '../domainErrors';
import { ImportError } from '../import/errors';

/** Turns the data layer's expected errors into the API's error shape; rethrows the rest. */
export function toApiError(err: unknown): never {
	if (isHttpError(err) || isRedirect(err)) throw err;
	if (err instanceof NotFoundError) apiError(404, 'not_found', err.message);
	if (err instanceof ReadOnlyError) apiError(403, 'read_only', err.message);
	if (err instanceof StateError) apiError(409, 'conflict', err.message);
	if (err instanceof GoneError) apiError(410, 'gone', err.message);
	if (err instanceof InputError) {
		apiError(400, 'invalid_input', err.message, Object.keys(err.fieldErrors)[0]);
	}
	if (err instanceof ImportError) apiError(err.status, err.code, err.message);
	if (err instanceof StorageUnavailableError) apiError(503, 'storage_unavailable', err.message);
	throw err;
}

/** Runs a route's data work, answering expected failures in the API's shape. */
export async function api<T>(work: () => Promise<T>): Promise<T> {
	try {
		return await work();
	} catch (err) {
		toApiError(err);
	}
}

/**
 * Why an upload route got no body to read (SvelteKit gives none to an empty body, nor to a
 * request without a Content-Type): an empty file is named as such, not as a missing header.
 */
export function noBodyAnswer(request: Request): never {
	const length = request.headers.get('content-length');
	if (length === '0' || request.headers.get('content-type')) {
		apiError(
			400,
			'empty-file',
			'The file is empty (0 bytes): it holds nothing to read. Choose the file again; if it is empty on your computer too, export it again.',
			'file'
		);
	}
	apiError(400, 'empty-file', 'Send the file as the request body, with a Content-Type header.');
}
