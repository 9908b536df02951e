import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';

export interface ReceivedMail {
	to: string;
	subject: string;
	text: string;
}

function mailDir(): string {
	const dir = process.env.MAIL_FAKE_DIR;
	if (!dir) throw new Error('MAIL_FAKE_DIR is not set: run the suite with `npm test`');
	return dir;
}

/** Every message the SMTP fake has kept for an address, oldest first. */
export async function mailsTo(address: string): Promise<ReceivedMail[]> {
	const files = (await readdir(mailDir()).catch(() => [] as string[]))
		.filter((f) => f.endsWith('.eml'))
		.sort();
	const mails: ReceivedMail[] = [];
	for (const file of files) {
		const parsed = await simpleParser(await readFile(join(mailDir(), file)));
		const to = parsed.to
			? (Array.isArray(parsed.to) ? parsed.to : [parsed.to]).map((t) => t.text).join(', ')
			: '';
		if (to.toLowerCase().includes(address.toLowerCase())) {
			mails.push({ to, subject: parsed.subject ?? '', text: parsed.text ?? '' });
		}
	}
	return mails;
}

/** Waits for the `count`-th message to an address (sending is asynchronous to the fake). */
export async function waitForMail(
	address: string,
	count = 1,
	timeoutMs = 10_000
): Promise<ReceivedMail> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const mails = await mailsTo(address);
		if (mails.length >= count) return mails[count - 1];
		if (Date.now() > deadline)
			throw new Error(`no mail #${count} to ${address} within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

/** The first link into the app in a mail's text, as a path (to follow with our clients). */
export function linkIn(mail: ReceivedMail, pathStart: string): string {
	const match = new RegExp(`https?://[^\\s]+(${pathStart}[^\\s]+)`).exec(mail.text);
	if (!match) throw new Error(`no ${pathStart} link in: ${mail.text}`);
	return match[1];
}
