/**
 * The report's typeface. pdfkit's built-in Helvetica covers WinAnsi only, so √, ≤, Δ, β, Φ⁻¹
 * and subscripts printed as "sqrt" or "?"; DejaVu Sans covers them and ships as an npm package
 * (dejavu-fonts-ttf), so the report needs no system font. The same files are registered with
 * @napi-rs/canvas for the report's charts.
 */
import { createRequire } from 'node:module';
import { GlobalFonts } from '@napi-rs/canvas';

const require = createRequire(import.meta.url);

export const REPORT_FONT = {
	regular: require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf'),
	bold: require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans-Bold.ttf')
};

/** The family name chart.js asks the canvas for. */
export const CHART_FONT_FAMILY = 'DejaVu Sans';

let chartFontsRegistered = false;
export function registerChartFonts(): void {
	if (chartFontsRegistered) return;
	GlobalFonts.registerFromPath(REPORT_FONT.regular, CHART_FONT_FAMILY);
	GlobalFonts.registerFromPath(REPORT_FONT.bold, CHART_FONT_FAMILY);
	chartFontsRegistered = true;
}

/** Names the report's fonts in a pdfkit document: 'Body' and 'Body-Bold'. */
export function registerReportFonts(doc: PDFKit.PDFDocument): void {
	doc.registerFont('Body', REPORT_FONT.regular);
	doc.registerFont('Body-Bold', REPORT_FONT.bold);
}
