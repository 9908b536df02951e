import { error } from '@sveltejs/kit';

/** Ids are INT UNSIGNED columns. */
const MAX_ID = 4_294_967_295;

/**
 * The one parser of a record id in a path ("/surveys/12"). Anything that is not an id names no
 * record, so it answers 404 like an id that is unknown or another organisation's: never 400 (the
 * path is not a field the caller filled in) and never 500.
 */
export function pathId(value: string | undefined): number {
	if (!/^\d{1,10}$/.test(value ?? '')) error(404, 'Not found.');
	const id = Number(value);
	if (id < 1 || id > MAX_ID) error(404, 'Not found.');
	return id;
}
