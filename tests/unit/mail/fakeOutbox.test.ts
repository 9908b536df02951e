import { describe, expect, it } from 'vitest';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { addressesIn, parseMail, readFakeOutbox } from '$lib/server/mail/fakeOutbox';
describe('parseMail', () => {
	it('reads headers and decodes a quoted-printable body', () => {
		const raw = [
			'To: a@b.example',
			'Subject: Choose a new',
			' Fractile password',
			'Content-Transfer-Encoding: quoted-printable',
			'',
			'Hello =C3=89mile, a long line that wra=',
			'ps.'
		].join('\r\n');
		const mail = parseMail('1.eml', raw);
		expect(mail.subject).toBe('Choose a new Fractile password');
		expect(mail.to).toBe('a@b.example');
		expect(mail.text).toBe('Hello Émile, a long line that wraps.');
	});
});

describe('readFakeOutbox', () => {
	const mail = (to: string, subject: string) =>
		`To: ${to}\r\nSubject: ${subject}\r\n\r\nbody of ${subject}`;

	it('gives only mail to the one address, received since the given time, newest first', async () => {
		const dir = await mkdtemp(join(tmpdir(), 'outbox-'));
		try {
			await writeFile(join(dir, '1000-1-1.eml'), mail('me@a.example', 'before my account'));
			await writeFile(join(dir, '2000-1-2.eml'), mail('me@a.example', 'mine'));
			await writeFile(join(dir, '2500-1-3.eml'), mail('victim@b.example', 'their reset link'));
			await writeFile(join(dir, '3000-1-4.eml'), mail('Me <ME@a.example>', 'mine again'));
			await writeFile(join(dir, '3500-1-5.eml'), mail('notme@a.example', 'a near miss'));
			const mails = await readFakeOutbox(dir, { to: 'me@a.example', since: new Date(1500) });
			expect(mails.map((m) => m.subject)).toEqual(['mine again', 'mine']);
		} finally {
			await rm(dir, { recursive: true, force: true });
		}
	});

	it('reads addresses out of a To header', () => {
		expect(addressesIn('A B <a@x.example>, c@y.example')).toEqual(['a@x.example', 'c@y.example']);
	});
});
