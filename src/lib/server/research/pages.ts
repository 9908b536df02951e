import type { Sequelize } from 'sequelize';
import { encodeCursor } from '../api/cursor';
import type { ResearchFilter } from './filter';
import { selectedMembers } from './members';
import { pseudonymMaker } from './pseudonym';
import { readingBatch, type ReadingPosition } from './readings';
import type { ResearchMember, ResearchReading } from './schemas';

/** Paged research reads for the API: the same selection as the exports, a page at a time. */
export async function researchMembers(
	sequelize: Sequelize,
	idSecret: string,
	filter: ResearchFilter
): Promise<ResearchMember[]> {
	const members = await selectedMembers(sequelize, filter, pseudonymMaker(idSecret));
	return [...members.values()].map((m) => m.public);
}

export async function researchReadingPage(
	sequelize: Sequelize,
	idSecret: string,
	filter: ResearchFilter,
	after: ReadingPosition,
	limit: number
): Promise<{ readings: ResearchReading[]; nextCursor: string | null }> {
	const members = await selectedMembers(sequelize, filter, pseudonymMaker(idSecret));
	const first = await readingBatch(sequelize, members, after, limit);
	if (first.last === null || first.rows.length < limit) {
		return { readings: first.rows, nextCursor: null };
	}
	const more = await readingBatch(sequelize, members, first.last, 1);
	return {
		readings: first.rows,
		nextCursor: more.last === null ? null : encodeCursor(first.last.id, first.last.memberId)
	};
}
