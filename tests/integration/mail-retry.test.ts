import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { SMTPServer } from 'smtp-server';
import { freePort, startBuiltApp } from '../helpers/server';
import { httpClient } from '../helpers/session';
import { signUpNewOrganisation, uniqueEmail } from '../helpers/accounts';
import { scratchDatabase } from '../helpers/database';
import { createMigrator } from '../../src/lib/server/db/migrator';

/**
 * A copy of the app whose SMTP relay is down: mail is kept and retried, the admin sees it
 * failing, and once a relay answers on that port the retry loop delivers it, once.
 * The copy runs on a scratch database of its own, so the shared app's retry loop (which would
 * send through the usual fake) cannot reach this outbox.
 */
let app: Awaited<ReturnType<typeof startBuiltApp>>;
let relayPort: number;
let scratch: Awaited<ReturnType<typeof scratchDatabase>>;
let db: Sequelize;
let relay: SMTPServer | null = null;

beforeAll(async () => {
	relayPort = await freePort();
	scratch = await scratchDatabase('mail_retry');
	db = scratch.sequelize;
	await createMigrator(db).up();
	app = await startBuiltApp({
		DB_NAME: `${process.env.DB_NAME}_mail_retry`,
		SMTP_PORT: String(relayPort),
		MAIL_RETRY_INTERVAL_MS: '200',
		MAIL_RETRY_FIRST_DELAY_MS: '200'
	});
});
afterAll(async () => {
	await app?.stop();
	relay?.close();
	await scratch?.drop();
});

async function outboxRow(to: string) {
	const [row] = await db.query<{ state: string; attempts: number; last_error: string | null }>(
		'SELECT state, attempts, last_error FROM mail_outbox WHERE to_address = ? ORDER BY id DESC LIMIT 1',
		{ replacements: [to], type: QueryTypes.SELECT }
	);
	return row;
}

async function until<T>(
	check: () => Promise<T | undefined | false>,
	timeoutMs = 10_000
): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const value = await check();
		if (value) return value;
		if (Date.now() > deadline) throw new Error('timed out');
		await new Promise((r) => setTimeout(r, 100));
	}
}

describe('mail when the relay is down', () => {
	it('is kept, shown to the admin as not delivered, and sent once the relay is back', async () => {
		const { client } = await signUpNewOrganisation('relay-down', app.origin);
		const admin = httpClient({}, client.cookie, app.origin);
		const email = uniqueEmail('held');
		expect(
			(await admin.postForm('/organisation/members?/invite', { email, role: 'engineer' })).status
		).toBe(303);

		const held = await until(async () => {
			const row = await outboxRow(email);
			return row && row.attempts >= 1 && row;
		});
		expect(held.state).toBe('queued');
		expect(held.last_error).toBeTruthy();
		expect(await (await admin.get('/organisation/members')).text()).toContain('Mail not delivered');

		const received: string[] = [];
		relay = new SMTPServer({
			authOptional: true,
			disabledCommands: ['STARTTLS'],
			onData(stream, session, callback) {
				let data = '';
				stream.on('data', (chunk: Buffer) => (data += chunk.toString()));
				stream.on('end', () => {
					received.push(data);
					callback();
				});
			}
		});
		await new Promise<void>((resolve) => relay!.listen(relayPort, '127.0.0.1', resolve));
		const sent = await until(async () => {
			const row = await outboxRow(email);
			return row?.state === 'sent' && row;
		});
		expect(sent.state).toBe('sent');
		await new Promise((r) => setTimeout(r, 500));
		expect(received.filter((m) => m.includes(email))).toHaveLength(1);
	});
});
