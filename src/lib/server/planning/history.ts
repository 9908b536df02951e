/**
 * Figures a plan takes from the asset's earlier readings: the standard deviation of a
 * population (member type × exposure class) in the latest other survey of the asset that read it.
 */
import { QueryTypes } from 'sequelize';
import { db } from '$lib/server/db';

export interface EarlierSpread {
	surveyId: number;
	surveyTitle: string;
	surveyDate: string;
	n: number;
	sdMm: number;
}

interface Row {
	surveyId: number;
	surveyTitle: string;
	surveyDate: string | Date;
	n: number | bigint;
	sdMm: number | null;
}

/**
 * The sample SD of cover (STDDEV_SAMP, n − 1) of a population in the most recent other survey
 * of the asset with at least 2 readings of it (by survey date, then id); null when none has.
 * Reads the readings by member, the leading key of their primary key.
 */
export async function earlierSpread(
	assetId: number,
	surveyId: number,
	memberType: string,
	exposureClass: string
): Promise<EarlierSpread | null> {
	const rows = await db().query<Row>(
		`SELECT s.id AS surveyId, s.title AS surveyTitle, s.survey_date AS surveyDate,
			COUNT(r.cover_mm) AS n, STDDEV_SAMP(r.cover_mm) AS sdMm
		FROM surveys s
		JOIN members m ON m.survey_id = s.id AND m.member_type = :memberType AND m.exposure_class = :exposureClass
		JOIN readings r ON r.member_id = m.id
		WHERE s.asset_id = :assetId AND s.id <> :surveyId
		GROUP BY s.id, s.title, s.survey_date
		HAVING COUNT(r.cover_mm) >= 2
		ORDER BY s.survey_date DESC, s.id DESC
		LIMIT 1`,
		{ type: QueryTypes.SELECT, replacements: { assetId, surveyId, memberType, exposureClass } }
	);
	const row = rows[0];
	if (!row || row.sdMm === null) return null;
	const date =
		row.surveyDate instanceof Date
			? row.surveyDate.toISOString().slice(0, 10)
			: String(row.surveyDate);
	return {
		surveyId: Number(row.surveyId),
		surveyTitle: row.surveyTitle,
		surveyDate: date,
		n: Number(row.n),
		sdMm: Number(row.sdMm)
	};
}
