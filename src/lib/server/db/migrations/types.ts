import type { QueryInterface } from 'sequelize';

/** A migration as umzug runs it: the query interface comes in as the context. */
export interface Migration {
	name: string;
	up: (params: { context: QueryInterface }) => Promise<void>;
	down: (params: { context: QueryInterface }) => Promise<void>;
}
