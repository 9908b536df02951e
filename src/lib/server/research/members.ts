import { QueryTypes, type Sequelize } from 'sequelize';
import type { ResearchFilter } from './filter';
import { constructionDecade, type PseudonymKind } from './pseudonym';
import type { ResearchMember } from './schemas';
import { SELECTION_JOINS, selectionWhere } from './selection';

/** A selected member: its database id (never shown) beside its anonymised description. */
export interface SelectedMember {
	id: number;
	public: ResearchMember;
}

interface MemberRow {
	id: number;
	assetId: number;
	memberType: ResearchMember['memberType'];
	face: ResearchMember['face'];
	exposureClass: string;
	designCode: ResearchMember['designCode'];
	requirementSource: ResearchMember['requirementSource'];
	yearOfConstruction: number | null;
	cMinMm: number;
	cNomMm: number;
	deltaCDevMm: number;
	barDiameterMm: number | null;
	memberDepthMm: number | null;
	gridWidthMm: number | null;
	gridHeightMm: number | null;
}

/** Only these columns are read: names, labels, locations and notes never leave the database. */
const MEMBER_COLUMNS = `m.id, m.asset_id AS assetId, m.member_type AS memberType, m.face,
	m.exposure_class AS exposureClass, a.design_code AS designCode,
	m.requirement_source AS requirementSource, a.year_of_construction AS yearOfConstruction,
	m.c_min_mm AS cMinMm, m.c_nom_mm AS cNomMm, m.delta_c_dev_mm AS deltaCDevMm,
	m.bar_diameter_mm AS barDiameterMm, m.member_depth_mm AS memberDepthMm,
	m.grid_width_mm AS gridWidthMm, m.grid_height_mm AS gridHeightMm`;

/** Every member in the selection, keyed by database id, in id order. */
export async function selectedMembers(
	sequelize: Sequelize,
	filter: ResearchFilter,
	name: (kind: PseudonymKind, id: number) => string
): Promise<Map<number, SelectedMember>> {
	const where = selectionWhere(filter);
	const rows = await sequelize.query<MemberRow>(
		`SELECT ${MEMBER_COLUMNS} FROM members m ${SELECTION_JOINS} WHERE ${where.sql} ORDER BY m.id`,
		{ type: QueryTypes.SELECT, replacements: where.replacements }
	);
	return new Map(rows.map((row) => [row.id, { id: row.id, public: toResearchMember(row, name) }]));
}

function toResearchMember(
	row: MemberRow,
	name: (kind: PseudonymKind, id: number) => string
): ResearchMember {
	return {
		memberRef: name('member', row.id),
		assetRef: name('asset', row.assetId),
		memberType: row.memberType,
		face: row.face,
		exposureClass: row.exposureClass,
		designCode: row.designCode,
		requirementSource: row.requirementSource,
		constructionDecade: constructionDecade(row.yearOfConstruction),
		cMinMm: row.cMinMm,
		cNomMm: row.cNomMm,
		deltaCDevMm: row.deltaCDevMm,
		barDiameterSpecifiedMm: row.barDiameterMm,
		memberDepthMm: row.memberDepthMm,
		gridWidthMm: row.gridWidthMm,
		gridHeightMm: row.gridHeightMm
	};
}
