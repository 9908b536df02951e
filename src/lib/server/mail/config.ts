import { env } from '$env/dynamic/private';
import { z } from 'zod';

/**
 * Mail settings. Production points SMTP_* at any relay; development and tests point them at
 * the local fake (scripts/fakes/mail.ts), which `npm start` and `npm test` run.
 */
const mailEnvSchema = z.object({
	SMTP_HOST: z.string().min(1).default('127.0.0.1'),
	SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(25),
	SMTP_SECURE: z
		.enum(['0', '1', 'true', 'false'])
		.default('0')
		.transform((v) => v === '1' || v === 'true'),
	SMTP_USER: z.string().default(''),
	SMTP_PASSWORD: z.string().default(''),
	MAIL_FROM: z.string().min(3).default('Fractile <no-reply@fractile.example>'),
	/** How often the retry loop looks for mail that is due. */
	MAIL_RETRY_INTERVAL_MS: z.coerce.number().int().min(100).default(15_000),
	/** The wait after the first failure; each later failure doubles it. */
	MAIL_RETRY_FIRST_DELAY_MS: z.coerce.number().int().min(100).default(30_000),
	MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
	ORIGIN: z.string().default('http://127.0.0.1:3000')
});

export type MailSettings = z.infer<typeof mailEnvSchema>;

export function mailSettings(): MailSettings {
	const parsed = mailEnvSchema.safeParse(env);
	if (!parsed.success) {
		const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
		throw new Error(`Mail settings are wrong: ${problems.join('; ')}`);
	}
	return parsed.data;
}

/** An absolute link into the app for a mail (ORIGIN is where the app is reached). */
export function appLink(path: string): string {
	return new URL(path, mailSettings().ORIGIN).toString();
}
