import type { ResearchFilter } from './filter';

/**
 * The SQL of a research selection. Always: the asset is opted in (consent is read at query
 * time, so revoking removes the asset from every later view and export) and the survey has been
 * submitted or approved (a draft may still be half-entered). The filter's lists narrow it.
 * Aliases: a = assets, s = surveys, m = members.
 */
export interface SqlWhere {
	sql: string;
	replacements: Record<string, unknown>;
}

/** Joins from members m to their survey and asset, for the WHERE below. */
export const SELECTION_JOINS = `JOIN surveys s ON s.id = m.survey_id JOIN assets a ON a.id = m.asset_id`;

const CONDITIONS: Record<keyof ResearchFilter, string> = {
	memberType: 'm.member_type IN (:memberType)',
	exposureClass: 'm.exposure_class IN (:exposureClass)',
	face: 'm.face IN (:face)',
	designCode: 'a.design_code IN (:designCode)',
	decade: '(a.year_of_construction - MOD(a.year_of_construction, 10)) IN (:decade)',
	// c_nom is stored as a double; compare at 0.1 mm so 45 matches 45.0000001 from a conversion.
	cNomMm: 'ROUND(m.c_nom_mm, 1) IN (:cNomMm)'
};

export function selectionWhere(filter: ResearchFilter): SqlWhere {
	const parts = ['a.research_opt_in = 1', "s.status IN ('submitted', 'approved')"];
	const replacements: Record<string, unknown> = {};
	for (const field of Object.keys(CONDITIONS) as (keyof ResearchFilter)[]) {
		const values = filter[field];
		if (values.length === 0) continue;
		parts.push(CONDITIONS[field]);
		replacements[field] =
			field === 'cNomMm' ? (values as number[]).map((v) => Math.round(v * 10) / 10) : values;
	}
	return { sql: parts.join(' AND '), replacements };
}
