export type DecimalMark = '.' | ',';

/** Why a cell could not be read as a number. */
export type NumberProblem = 'not-a-number' | 'wrong-decimal-mark';

/** The grammar of a plain number; isPlainNumber is the same test, faster. */
export const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const HAS_DOT_DECIMAL = /\d\.\d/;
const HAS_COMMA_DECIMAL = /\d,\d/;

const isDigit = (code: number) => code >= 48 && code <= 57;

/**
 * Whether `text` is what PLAIN_NUMBER matches: optional sign, digits with an optional fraction
 * (or a fraction alone), optional exponent. Our own loop because the regular expression cost
 * ≈ 0.5 s of the million-row import (one test per length cell); numbers.test.ts holds the two
 * to the same answers.
 */
export function isPlainNumber(text: string): boolean {
	const n = text.length;
	let i = 0;
	let code = text.charCodeAt(0);
	if (code === 43 || code === 45) i++; // + or -
	let digits = 0;
	while (i < n && isDigit(text.charCodeAt(i))) {
		i++;
		digits++;
	}
	if (i < n && text.charCodeAt(i) === 46) {
		i++; // .
		while (i < n && isDigit(text.charCodeAt(i))) {
			i++;
			digits++;
		}
	}
	if (digits === 0) return false;
	code = text.charCodeAt(i);
	if (code === 101 || code === 69) {
		i++; // e or E
		code = text.charCodeAt(i);
		if (code === 43 || code === 45) i++;
		let exponentDigits = 0;
		while (i < n && isDigit(text.charCodeAt(i))) {
			i++;
			exponentDigits++;
		}
		if (exponentDigits === 0) return false;
	}
	return i === n;
}

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
	if (!isPlainNumber(normal)) return 'not-a-number';
	const value = Number(normal);
	return Number.isFinite(value) ? value : 'not-a-number';
}

export function looksNumeric(raw: string): boolean {
	const text = raw.trim();
	return text !== '' && PLAIN_NUMBER.test(text.replace(',', '.'));
}

/** 1 inch = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;
