import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';

export interface FakeMail {
	file: string;
	to: string;
	subject: string;
	date: string;
	text: string;
}

export interface OutboxFilter {
	/** Only mail addressed to this address (compared without regard to case). */
	to: string;
	/** Only mail the fake received at or after this time (its file name starts with that ms). */
	since: Date;
	limit?: number;
}

/**
 * Reads what the local SMTP fake kept for one address (development only), newest first. A small
 * reader of our own plain-text mails — headers, then a 7bit or quoted-printable body — so
 * production needs no mail parser.
 */
export async function readFakeOutbox(dir: string, filter: OutboxFilter): Promise<FakeMail[]> {
	const since = filter.since.getTime();
	const files = (await readdir(dir).catch(() => [] as string[]))
		.filter((f) => f.endsWith('.eml') && receivedAt(f) >= since)
		.sort((a, b) => receivedAt(b) - receivedAt(a) || b.localeCompare(a));
	const mails: FakeMail[] = [];
	for (const file of files) {
		const mail = parseMail(file, await readFile(join(dir, file), 'utf8').catch(() => ''));
		if (addressesIn(mail.to).includes(filter.to.toLowerCase())) mails.push(mail);
		if (mails.length >= (filter.limit ?? 50)) break;
	}
	return mails;
}

/** The fake names each file `<ms since 1970>-<pid>-<n>.eml` (scripts/fakes/mail.ts). */
function receivedAt(file: string): number {
	const ms = Number(file.split('-')[0]);
	return Number.isFinite(ms) ? ms : 0;
}

/** The bare addresses of a To header ("A <a@x>, b@y" → ["a@x", "b@y"]), lower case. */
export function addressesIn(header: string): string[] {
	return header
		.split(',')
		.map((part) => (/<([^>]*)>/.exec(part)?.[1] ?? part).trim().toLowerCase())
		.filter(Boolean);
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
