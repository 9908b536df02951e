export type DecimalMark = '.' | ',';

/** Why a cell could not be read as a number. */
export type NumberProblem = 'not-a-number' | 'wrong-decimal-mark';

const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const HAS_DOT_DECIMAL = /\d\.\d/;
const HAS_COMMA_DECIMAL = /\d,\d/;

/**
 * Reads a decimal number written with `mark` as its decimal separator. Empty → null.
 * A number written with the other mark is refused rather than guessed: "1.250" in a file that
 * uses decimal commas may be a thousands separator (1250) or a decimal (1.25).
 */
export function parseDecimal(raw: string, mark: DecimalMark): number | null | NumberProblem {
	const text = raw.trim();
	if (text === '') return null;
	let normal = text;
	if (mark === ',') {
		if (text.includes('.') && HAS_DOT_DECIMAL.test(text)) return 'wrong-decimal-mark';
		normal = text.replace(',', '.');
	} else if (text.includes(',') && HAS_COMMA_DECIMAL.test(text)) {
		return 'wrong-decimal-mark';
	}
	if (!PLAIN_NUMBER.test(normal)) return 'not-a-number';
	const value = Number(normal);
	return Number.isFinite(value) ? value : 'not-a-number';
}

export function looksNumeric(raw: string): boolean {
	const text = raw.trim();
	return text !== '' && PLAIN_NUMBER.test(text.replace(',', '.'));
}

/** 1 inch = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;
