import { z } from 'zod';
import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { auditLogPage } from '$lib/server/auditLog';

const pageSchema = z.coerce.number().int().min(1).max(1_000_000).catch(1);

/** One page of the organisation's audit events, newest first, in words. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'audit:read');
	return auditLogPage(actor, pageSchema.parse(event.url.searchParams.get('page') ?? 1));
};
