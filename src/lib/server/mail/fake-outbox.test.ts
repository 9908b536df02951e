import { describe, expect, it } from 'vitest';
import { parseMail } from './fake-outbox';

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
