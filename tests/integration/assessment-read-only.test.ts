import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { signInAs } from '../helpers/session';

/** An approved assessment's page shows its signed values as text, not as fields to type in. */
describe('an approved assessment page', () => {
	let sequelize: Sequelize;
	beforeAll(() => {
		sequelize = testSequelize();
	});
	afterAll(() => sequelize.close());

	it('shows the durability parameters as values, with no input and no save', async () => {
		const row = await sequelize.query<{ id: number }>(
			"SELECT id FROM assessments WHERE state = 'approved' ORDER BY id LIMIT 1",
			{ type: QueryTypes.SELECT, plain: true }
		);
		expect(row, 'the demo has an approved assessment').toBeTruthy();
		const engineer = await signInAs('engineer');
		const html = await (await engineer.get(`/assessments/${row!.id}`)).text();
		const section = html.match(/<section id="durability"[\s\S]*?<\/section>/)?.[0] ?? '';
		expect(section).toContain('Durability parameters');
		expect(section).toContain('data-testid="durability-value"');
		expect(section).not.toMatch(/<input/);
		expect(section).not.toContain('Save the parameters');
		expect(section).toContain('can no longer change');
	});
});
