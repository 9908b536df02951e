/**
 * Text for the report (its figures are formatted by $lib/format, as on the pages). The report's typeface (fonts.ts) has the glyphs of
 * mathematical notation, so text passes through as written: only control characters, which
 * would print as boxes, are dropped, and the text is composed (NFC) so accents keep one glyph.
 */
export function pdfText(text: string): string {
	return text.normalize('NFC').replace(/(?![\t\n])\p{Cc}/gu, ''); // Cc: U+0000–001F, U+007F–009F
}
