import type { Sequelize } from 'sequelize';
import { db } from '../db';
import { researchIdSecret } from './source';

/** The database and the pseudonym secret, as the research routes hand them to the service. */
export function researchContext(): { sequelize: Sequelize; idSecret: string } {
	return { sequelize: db(), idSecret: researchIdSecret() };
}
