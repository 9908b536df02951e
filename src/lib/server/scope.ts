import { error } from '@sveltejs/kit';
import type { Actor } from './policy';

/**
 * A record of the actor's organisation, or 404. Another organisation's record is "not found",
 * never "forbidden", so that ids reveal nothing. Use after `authorize` in every route with an id.
 * (Assets shared read-only with the actor's organisation are the assets issue's own check.)
 */
export function ownRecord<T extends { organisationId: number }>(
	record: T | null | undefined,
	actor: Actor
): T {
	if (!record || record.organisationId !== actor.organisationId) error(404, 'Not found.');
	return record;
}
