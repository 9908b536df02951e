import { QueryTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * The database itself refuses to rewrite a signed snapshot: once an assessment has left the
 * draft state its snapshot and checksum cannot change and the row cannot be deleted, whatever
 * code runs (the service and the model hook check first; this is the last line).
 */
export const assessmentFreeze: Migration = {
	name: '005-assessment-freeze',
	async up({ context: qi }) {
		const sequelize = qi.sequelize;
		await sequelize.query(
			`CREATE TRIGGER assessments_freeze_snapshot BEFORE UPDATE ON assessments FOR EACH ROW
			 BEGIN
			   IF OLD.state <> 'draft' AND (NOT (NEW.snapshot <=> OLD.snapshot)
			       OR NOT (NEW.snapshot_sha256 <=> OLD.snapshot_sha256)
			       OR NOT (NEW.engine_version <=> OLD.engine_version)) THEN
			     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an approved assessment snapshot cannot be changed';
			   END IF;
			   IF OLD.state <> 'draft' AND NEW.state = 'draft' THEN
			     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an approved assessment cannot return to draft';
			   END IF;
			 END`,
			{ type: QueryTypes.RAW }
		);
		await sequelize.query(
			`CREATE TRIGGER assessments_keep_signed BEFORE DELETE ON assessments FOR EACH ROW
			 BEGIN
			   IF OLD.state <> 'draft' THEN
			     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an approved assessment cannot be deleted';
			   END IF;
			 END`,
			{ type: QueryTypes.RAW }
		);
	},
	async down({ context: qi }) {
		await qi.sequelize.query('DROP TRIGGER IF EXISTS assessments_keep_signed', {
			type: QueryTypes.RAW
		});
		await qi.sequelize.query('DROP TRIGGER IF EXISTS assessments_freeze_snapshot', {
			type: QueryTypes.RAW
		});
	}
};
