import { error, redirect, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { formMessage, parseForm, type FormFailure } from './forms';
import type { Action, Actor } from '../policy';
import { authorize } from './actor';
import { GoneError, InputError, NotFoundError, ReadOnlyError, StateError } from '../domainErrors';
import { ImportError } from '../import/errors';

/**
 * For page loads (and actions that answer with an error page rather than the form): another
 * organisation's record (or none) is a 404 page, read-only a 403, a refused state change a 409,
 * a withdrawn link a 410, input the data refuses a 400.
 */
export async function loadOr404<T>(work: () => Promise<T>): Promise<T> {
	try {
		return await work();
	} catch (err) {
		if (err instanceof NotFoundError) error(404, err.message);
		if (err instanceof ReadOnlyError) error(403, err.message);
		if (err instanceof StateError) error(409, err.message);
		if (err instanceof GoneError) error(410, err.message);
		if (err instanceof InputError) error(400, err.message);
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
		if (err instanceof GoneError) error(410, err.message);
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

/**
 * A form action that saves a record and sends the browser on (303), written once: the policy
 * for `action`, the form validated with `schema` (a 400 naming each bad field, values echoed),
 * then `work` on the path's ids, whose expected failures come back to the form (see actOr).
 */
export function savingAction<S extends z.ZodType, T, P extends Partial<Record<string, string>>>(
	action: Action,
	schema: S,
	work: (actor: Actor, input: z.infer<S>, params: P) => Promise<T>,
	next: (saved: T) => string
) {
	return async ({
		locals,
		request,
		params
	}: Pick<RequestEvent<P>, 'locals' | 'request' | 'params'>) => {
		const actor = authorize(locals, action);
		const parsed = await parseForm(request, schema);
		if (!parsed.ok) return parsed.failure;
		// The redirect is thrown inside actOr, which passes on what it does not expect.
		return actOr(parsed.form, async () => {
			redirect(303, next(await work(actor, parsed.data, params)));
		});
	};
}
