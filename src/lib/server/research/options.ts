import { QueryTypes, type Sequelize } from 'sequelize';
import { SELECTION_JOINS, selectionWhere } from './selection';
import { researchFilterSchema } from './filter';
import { db } from '../db';

/** The values each filter can take within the research data, for the explorer's checkboxes. */
export interface FilterOptions {
	memberType: string[];
	exposureClass: string[];
	face: string[];
	designCode: string[];
	decade: number[];
	cNomMm: number[];
}

export async function filterOptions(sequelize: Sequelize = db()): Promise<FilterOptions> {
	const where = selectionWhere(researchFilterSchema.parse({}));
	const rows = await sequelize.query<{
		memberType: string;
		exposureClass: string;
		face: string;
		designCode: string;
		decade: number | null;
		cNomMm: number;
	}>(
		`SELECT DISTINCT m.member_type AS memberType, m.exposure_class AS exposureClass, m.face,
		        a.design_code AS designCode,
		        a.year_of_construction - MOD(a.year_of_construction, 10) AS decade,
		        ROUND(m.c_nom_mm, 1) AS cNomMm
		   FROM members m ${SELECTION_JOINS} WHERE ${where.sql}`,
		{ type: QueryTypes.SELECT, replacements: where.replacements }
	);
	const distinct = <T>(pick: (r: (typeof rows)[number]) => T | null) =>
		[...new Set(rows.map(pick).filter((v): v is T => v !== null))].sort((a, b) =>
			typeof a === 'number' && typeof b === 'number' ? a - b : String(a).localeCompare(String(b))
		);
	return {
		memberType: distinct((r) => r.memberType),
		exposureClass: distinct((r) => r.exposureClass),
		face: distinct((r) => r.face),
		designCode: distinct((r) => r.designCode),
		decade: distinct((r) => (r.decade == null ? null : Number(r.decade))),
		cNomMm: distinct((r) => Number(r.cNomMm))
	};
}
