/**
 * Expected failures of the data layer. Routes turn them into responses (404, 403, 409, 400);
 * anything else is unexpected and goes to handleError.
 */
export class NotFoundError extends Error {
	constructor(what: string) {
		super(`${what} was not found.`);
		this.name = 'NotFoundError';
	}
}

/** Visible to the actor but not theirs to change (an asset shared read-only). */
export class ReadOnlyError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'ReadOnlyError';
	}
}

/** The record is in a state that does not allow the change (a submitted survey, say). */
export class StateError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'StateError';
	}
}

/** Input that passed its schema but breaks a rule of the data (a duplicate label, say). */
export class InputError extends Error {
	constructor(
		message: string,
		readonly fieldErrors: Record<string, string[]> = {}
	) {
		super(message);
		this.name = 'InputError';
	}
}

/** Object storage did not answer (refused, timed out, or a 5xx): the request is a plain 503. */
export class StorageUnavailableError extends Error {
	constructor() {
		super(
			'File storage cannot be reached right now, so the file was not saved and nothing was recorded. Try again in a few minutes.'
		);
		this.name = 'StorageUnavailableError';
	}
}
