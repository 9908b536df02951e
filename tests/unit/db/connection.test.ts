import { describe, expect, it } from 'vitest';
import {
	createSequelize,
	readDatabaseSettings,
	writesThroughSeveralNodes
} from '$lib/server/db/connection';

const base = { DB_NAME: 'fractile', DB_USER: 'fractile' };

describe('database settings for a cluster of writable nodes', () => {
	it('takes DB_HOSTS as the writable nodes, the first one as the instance’s host', async () => {
		const settings = readDatabaseSettings({
			...base,
			DB_HOSTS: '10.0.0.2:3306, 10.0.0.3:3307,10.0.0.4'
		});
		const sequelize = createSequelize(settings);
		try {
			expect(writesThroughSeveralNodes(sequelize)).toBe(true);
			expect([sequelize.config.host, Number(sequelize.config.port)]).toEqual(['10.0.0.2', 3306]);
		} finally {
			await sequelize.close();
		}
	});

	it('writes through one server when DB_HOSTS is empty or names one node', async () => {
		for (const hosts of ['', '10.0.0.2:3306']) {
			const sequelize = createSequelize(readDatabaseSettings({ ...base, DB_HOSTS: hosts }));
			try {
				expect(writesThroughSeveralNodes(sequelize)).toBe(false);
			} finally {
				await sequelize.close();
			}
		}
	});

	it('refuses read replicas beside a cluster, whose every node serves reads', () => {
		expect(() =>
			readDatabaseSettings({ ...base, DB_HOSTS: 'a:1,b:2', DB_READ_REPLICAS: 'c:3' })
		).toThrow(/DB_HOSTS.*DB_READ_REPLICAS/);
	});
});
