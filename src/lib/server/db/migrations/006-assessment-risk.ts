import { DataTypes, QueryTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * The risk annex of an assessment: the engineer's durability parameters and the
 * figures computed from them with the population's readings, frozen with the assessment. The
 * assessment's snapshot carries no readings, so the projections (which need every cover) are
 * computed while the assessment is a draft and kept here; a trigger refuses to change or
 * delete the annex once its assessment has left the draft state.
 */
export const assessmentRisk: Migration = {
	name: '006-assessment-risk',
	async up({ context: qi }) {
		await qi.createTable(
			'assessment_risks',
			{
				id: idColumn,
				assessment_id: { ...reference('assessments'), unique: true },
				// The parameters as entered (defaults filled in), JSON text.
				parameters: { type: DataTypes.TEXT, allowNull: false },
				annex: { type: DataTypes.TEXT('long'), allowNull: false },
				annex_sha256: { type: DataTypes.CHAR(64), allowNull: false },
				engine_version: { type: DataTypes.STRING(32), allowNull: false },
				created_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		const guard = (event: 'UPDATE' | 'DELETE', name: string) =>
			qi.sequelize.query(
				`CREATE TRIGGER ${name} BEFORE ${event} ON assessment_risks FOR EACH ROW
				 BEGIN
				   IF (SELECT state FROM assessments WHERE id = OLD.assessment_id) <> 'draft' THEN
				     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'the risk annex of an approved assessment cannot be changed';
				   END IF;
				 END`,
				{ type: QueryTypes.RAW }
			);
		await guard('UPDATE', 'assessment_risks_freeze');
		await guard('DELETE', 'assessment_risks_keep');
	},
	async down({ context: qi }) {
		for (const name of ['assessment_risks_keep', 'assessment_risks_freeze']) {
			await qi.sequelize.query(`DROP TRIGGER IF EXISTS ${name}`, { type: QueryTypes.RAW });
		}
		await qi.dropTable('assessment_risks');
	}
};
