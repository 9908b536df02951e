/**
 * Rebuilds every member's summaries (reading count and cover counts) from the readings themselves
 * and compares them with what is stored, to the bit. `npm run db:check-summaries` runs it; the
 * integration tests run it after each kind of write. Reads only; repairing is rebuildCoverCounts.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { countedFromSorted } from '../../analysis/countedSample';
import { decodeCounts, encodeCounts } from './coverCountCodec';

export interface SummaryMismatch {
	memberId: number;
	problem: string;
}

export interface SummaryCheck {
	membersChecked: number;
	readingsChecked: number;
	mismatches: SummaryMismatch[];
}

const MEMBERS_PER_PASS = 200;

function sameArray(a: Float64Array, b: Float64Array): boolean {
	if (a.length !== b.length) return false;
	for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
	return true;
}

/** Compares every member's stored summaries with those rebuilt from its readings. */
export async function checkCoverSummaries(sequelize: Sequelize): Promise<SummaryCheck> {
	const result: SummaryCheck = { membersChecked: 0, readingsChecked: 0, mismatches: [] };
	let after = 0;
	for (;;) {
		const members = await sequelize.query<{ id: number }>(
			`SELECT id FROM members WHERE id > ? ORDER BY id LIMIT ${MEMBERS_PER_PASS}`,
			{ type: QueryTypes.SELECT, replacements: [after] }
		);
		if (members.length === 0) break;
		const ids = members.map((m) => m.id);
		after = ids[ids.length - 1];
		// One transaction's snapshot for the readings and the rows, so a write in between cannot
		// show as a mismatch.
		await sequelize.transaction(async (transaction) => {
			const readings = await sequelize.query<{ memberId: number; coverMm: number }>(
				'SELECT member_id AS memberId, cover_mm AS coverMm FROM readings WHERE member_id IN (:ids)',
				{ type: QueryTypes.SELECT, replacements: { ids }, transaction }
			);
			const rows = await sequelize.query<{
				memberId: number;
				n: number;
				den: number | null;
				factor: number | null;
				distinct: number;
				counts: Buffer | null;
			}>(
				`SELECT member_id AS memberId, reading_count AS n, grid_den AS den,
				        grid_factor AS factor, distinct_covers AS \`distinct\`, cover_counts AS counts
				   FROM member_cover_sets WHERE member_id IN (:ids)`,
				{ type: QueryTypes.SELECT, replacements: { ids }, transaction }
			);
			const lists = new Map<number, number[]>();
			for (const r of readings) {
				const list = lists.get(r.memberId) ?? [];
				list.push(Number(r.coverMm));
				lists.set(r.memberId, list);
			}
			const byMember = new Map(rows.map((r) => [r.memberId, r]));
			for (const id of ids) {
				const covers = Float64Array.from(lists.get(id) ?? []).sort();
				result.membersChecked++;
				result.readingsChecked += covers.length;
				const row = byMember.get(id);
				const bad = (problem: string) => result.mismatches.push({ memberId: id, problem });
				if (!row) {
					if (covers.length > 0) bad(`${covers.length} readings but no summary row`);
					continue;
				}
				if (Number(row.n) !== covers.length)
					bad(`reading_count ${row.n}, readings ${covers.length}`);
				if (row.counts === null) {
					bad('cover counts not written');
					continue;
				}
				const grid =
					row.den === null || row.factor === null
						? null
						: { den: Number(row.den), factor: Number(row.factor) };
				const stored = decodeCounts(row.counts, grid);
				const rebuilt = countedFromSorted(covers);
				const rebuiltGrid = rebuilt.lattice?.grid ?? null;
				if (JSON.stringify(grid) !== JSON.stringify(rebuiltGrid))
					bad(`grid ${JSON.stringify(grid)}, readings give ${JSON.stringify(rebuiltGrid)}`);
				if (Number(row.distinct) !== rebuilt.values.length)
					bad(`distinct_covers ${row.distinct}, readings give ${rebuilt.values.length}`);
				if (!sameArray(stored.values, rebuilt.values) || !sameArray(stored.counts, rebuilt.counts))
					bad('cover counts differ from readings');
				else if (!Buffer.from(row.counts).equals(encodeCounts(rebuilt).bytes))
					bad('cover counts are not in the form the codec writes');
			}
		});
	}
	return result;
}
