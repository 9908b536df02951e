import { error, type ActionFailure } from '@sveltejs/kit';
import { formMessage, type FormFailure } from '../forms';
import { InputError, NotFoundError, ReadOnlyError, StateError } from '../domainErrors';
import { ImportError } from '../import/errors';

/** For page loads: another organisation's record (or none) is a 404 page, read-only a 403. */
export async function loadOr404<T>(work: () => Promise<T>): Promise<T> {
	try {
		return await work();
	} catch (err) {
		if (err instanceof NotFoundError) error(404, err.message);
		if (err instanceof ReadOnlyError) error(403, err.message);
		throw err;
	}
}

/** For form actions: expected failures come back to the form with their message. */
export async function actOr<T>(
	form: FormData,
	work: () => Promise<T>
): Promise<T | ActionFailure<FormFailure>> {
	try {
		return await work();
	} catch (err) {
		if (err instanceof NotFoundError) error(404, err.message);
		if (err instanceof ReadOnlyError) return formMessage(403, form, err.message);
		if (err instanceof StateError) return formMessage(409, form, err.message);
		if (err instanceof InputError || err instanceof ImportError) {
			const errors =
				err instanceof InputError
					? Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v[0]]))
					: {};
			return formMessage(400, form, err.message, errors);
		}
		throw err;
	}
}
