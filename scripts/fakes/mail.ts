// A local stand-in for an SMTP relay, for development and tests only: accepts every message on
// 127.0.0.1 and keeps it as an .eml file in MAIL_FAKE_DIR, where the dev outbox page and the
// tests read it. `tsx scripts/fakes/mail.ts`
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

const port = Number(process.env.SMTP_PORT ?? 2525);
const dir = process.env.MAIL_FAKE_DIR ?? '.local/mail';
mkdirSync(dir, { recursive: true });
let counter = 0;

const server = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	size: 10 * 1024 * 1024,
	onData(stream, session, callback) {
		const chunks: Buffer[] = [];
		stream.on('data', (chunk: Buffer) => chunks.push(chunk));
		stream.on('end', () => {
			const name = `${Date.now()}-${process.pid}-${++counter}.eml`;
			writeFileSync(join(dir, name), Buffer.concat(chunks));
			callback();
		});
	}
});

server.on('error', (err) => console.error(`mail fake: ${err.message}`));
server.listen(port, '127.0.0.1', () =>
	console.log(`mail fake listening on 127.0.0.1:${port}, keeping mail in ${dir}`)
);
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
