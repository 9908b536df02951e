import { zxcvbn, zxcvbnOptions } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import { z } from 'zod';

// zxcvbn-ts with its maintained common-password and diceware dictionaries: it catches the list
// entries themselves and their near variants ("password1234", "qwerty123456").
zxcvbnOptions.setOptions({
	dictionary: { ...common.dictionary },
	graphs: common.adjacencyGraphs
});

export const PASSWORD_MIN_LENGTH = 12;
/** Long passphrases are welcome; the cap only stops a megabyte "password" reaching argon2. */
export const PASSWORD_MAX_LENGTH = 200;
/** zxcvbn's score runs 0–4; 3 is "safely unguessable" in its own terms. */
const MIN_GUESS_SCORE = 3;

export function isCommonPassword(password: string): boolean {
	return zxcvbn(password.slice(0, 100)).score < MIN_GUESS_SCORE;
}

/** A password someone is choosing now (sign-up, reset, change, invitation). */
export const newPasswordSchema = z
	.string()
	.min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
	.max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`)
	.refine(
		(password) => !isCommonPassword(password),
		'This password is on, or close to, a list of commonly used passwords. Choose a longer, less common one — a few unrelated words work well.'
	);
