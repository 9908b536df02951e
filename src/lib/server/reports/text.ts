/**
 * Words and figures for the report. The report's typeface (fonts.ts) has the glyphs of
 * mathematical notation, so text passes through as written: only control characters, which
 * would print as boxes, are dropped, and the text is composed (NFC) so accents keep one glyph.
 */
export function pdfText(text: string): string {
	return text.normalize('NFC').replace(/(?![\t\n])\p{Cc}/gu, ''); // Cc: U+0000–001F, U+007F–009F
}

export const pct = (share: number | null | undefined, digits = 1) =>
	share === null || share === undefined ? '–' : `${(share * 100).toFixed(digits)} %`;
export const mm = (value: number | null | undefined, digits = 1) =>
	value === null || value === undefined ? '–' : `${value.toFixed(digits)} mm`;
export const num = (value: number | null | undefined, digits = 2) =>
	value === null || value === undefined ? '–' : value.toFixed(digits);
