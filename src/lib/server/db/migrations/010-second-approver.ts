import { DataTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * An organisation setting: the engineer who prepared an assessment may not approve it alone
 * (a second engineer checks first, as consultancies expect). On by default, for organisations
 * that exist now as for new ones; an admin may turn it off.
 */
export const secondApprover: Migration = {
	name: '010-second-approver',
	async up({ context: qi }) {
		await qi.addColumn('organisations', 'second_approver_required', {
			type: DataTypes.BOOLEAN,
			allowNull: false,
			defaultValue: true
		});
	},
	async down({ context: qi }) {
		await qi.removeColumn('organisations', 'second_approver_required');
	}
};
