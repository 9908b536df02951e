/**
 * Expected failures of the data layer. Routes turn them into responses (404, 403, 409, 400);
 * anything else is unexpected and goes to handleError.
 */
export class NotFoundError extends Error {
	/** `what` names the record asked for; `message` replaces the sentence where one is fixed. */
	constructor(what: string, message = `${what} was not found.`) {
		super(message);
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

/** The record existed but is gone for good (a withdrawn or expired link): a 410. */
export class GoneError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'GoneError';
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
