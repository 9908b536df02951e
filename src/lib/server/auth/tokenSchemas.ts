import { z } from 'zod';
import { TOKEN_MAX_DAYS } from './apiTokens';

export const createTokenSchema = z.object({
	name: z.string().trim().min(1, 'Give the token a name.').max(80, 'Use at most 80 characters.'),
	expiresInDays: z.coerce
		.number('Enter a number of days.')
		.int('Enter a whole number of days.')
		.min(1, 'At least 1 day.')
		.max(TOKEN_MAX_DAYS, `At most ${TOKEN_MAX_DAYS} days.`)
		.default(90)
});

export const idParamSchema = z.coerce.number().int().positive().max(4_294_967_295);
