/**
 * A problem with the file or the request that the user can act on; its message is shown as is.
 * Anything else thrown during an import is unexpected and is logged, not shown.
 */
export class ImportError extends Error {
	constructor(
		readonly code: string,
		message: string,
		readonly status = 400
	) {
		super(message);
		this.name = 'ImportError';
	}
}
