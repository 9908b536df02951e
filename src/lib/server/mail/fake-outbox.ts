import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';

export interface FakeMail {
	file: string;
	to: string;
	subject: string;
	date: string;
	text: string;
}

/**
 * Reads what the local SMTP fake kept (development only). A small reader of our own plain-text
 * mails — headers, then a 7bit or quoted-printable body — so production needs no mail parser.
 */
export async function readFakeOutbox(dir: string, limit = 50): Promise<FakeMail[]> {
	const files = (await readdir(dir).catch(() => [] as string[]))
		.filter((f) => f.endsWith('.eml'))
		.sort()
		.reverse()
		.slice(0, limit);
	return Promise.all(
		files.map(async (file) => parseMail(file, await readFile(join(dir, file), 'utf8')))
	);
}

export function parseMail(file: string, raw: string): FakeMail {
	const split = raw.indexOf('\r\n\r\n') >= 0 ? raw.indexOf('\r\n\r\n') : raw.indexOf('\n\n');
	const head = raw.slice(0, split).replace(/\r?\n[ \t]+/g, ' ');
	const body = raw.slice(split).trim();
	const header = (name: string) =>
		new RegExp(`^${name}:\\s*(.*)$`, 'im').exec(head)?.[1]?.trim() ?? '';
	const quoted = /quoted-printable/i.test(header('Content-Transfer-Encoding'));
	return {
		file,
		to: header('To'),
		subject: header('Subject'),
		date: header('Date'),
		text: quoted ? decodeQuotedPrintable(body) : body
	};
}

function decodeQuotedPrintable(text: string): string {
	const joined = text.replace(/=\r?\n/g, '');
	const bytes = joined.replace(/=([0-9A-F]{2})/gi, (_, hex: string) => `%${hex}`);
	try {
		return decodeURIComponent(bytes.replace(/%(?![0-9A-F]{2})/gi, '%25'));
	} catch {
		return joined;
	}
}
