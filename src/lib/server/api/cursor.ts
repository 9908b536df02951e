import { z } from 'zod';

/**
 * Cursor pagination: a page answers `nextCursor`, an opaque string the caller sends back as
 * `cursor` for the following page (keyset: "readings after this one"), null on the last page.
 * Opaque so we may change what it holds; it is base64url JSON, not a secret.
 */
const cursorBody = z.object({
	after: z.number().int().min(0),
	/** The member of that reading, where pages run across members (readings are kept by member). */
	member: z.number().int().min(0).default(0)
});

export type Cursor = { after: number; member: number };

export function encodeCursor(afterId: number, memberId?: number): string {
	const body = memberId === undefined ? { after: afterId } : { after: afterId, member: memberId };
	return Buffer.from(JSON.stringify(body)).toString('base64url');
}

export const cursorSchema = z
	.string()
	.max(200)
	.transform((text, ctx) => {
		try {
			return cursorBody.parse(
				JSON.parse(Buffer.from(text, 'base64url').toString('utf8'))
			) as Cursor;
		} catch {
			ctx.addIssue({ code: 'custom', message: 'cursor is not one this API gave out' });
			return z.NEVER;
		}
	})
	.describe('The nextCursor of the previous page; leave out for the first page.');

export const pageQuerySchema = z.object({
	cursor: cursorSchema.optional(),
	limit: z.coerce.number().int().min(1).max(5000).default(1000).describe('Rows a page (1–5000).')
});
