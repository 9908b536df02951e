/**
 * The report PDF of an approved assessment. The same snapshot and annex always give the same
 * content: the document's info and dates are fixed from the assessment, and the only thing
 * that changes between runs is the visible "Generated …" line on the cover page.
 */
import PDFDocument from 'pdfkit';
import type { AssessedSource } from '$lib/server/risk';
import { CAUTION_TEXT, CAUTION_TITLE } from './caution';
import { registerReportFonts } from './fonts';
import { MARGIN, ReportWriter } from './layout';
import { appendices } from './sections/appendices';
import { coverPage, ownerSummary } from './sections/front';
import { lowAreaSection } from './sections/lowAreas';
import { customSection } from './sections/custom';
import { methodStatement } from './sections/method';
import { populationSections } from './sections/populations';
import { riskSection } from './sections/risk';
import { pdfText } from './text';

/** Fixed document dates: the approval (or computation) time, never the time of generation. */
function documentDate(source: AssessedSource): Date {
	return new Date(source.header.approvedAt ?? source.snapshot.computedAt);
}

function footers(doc: PDFKit.PDFDocument, title: string): void {
	const range = doc.bufferedPageRange();
	for (let i = range.start; i < range.start + range.count; i++) {
		doc.switchToPage(i);
		const y = doc.page.height - MARGIN + 10;
		doc.font('Body').fontSize(7.5).fillColor('#555555');
		// Writing below the bottom margin would add a page: lift the margin while we do.
		doc.page.margins.bottom = 0;
		doc.text(pdfText(`${title} · ${CAUTION_TITLE}`), MARGIN, y, { width: 360, lineBreak: false });
		doc.text(`Page ${i + 1} of ${range.count}`, doc.page.width - MARGIN - 100, y, {
			width: 100,
			align: 'right',
			lineBreak: false
		});
		doc.page.margins.bottom = MARGIN;
	}
}

export function reportFileName(source: AssessedSource): string {
	const slug = source.snapshot.asset.name
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-|-$/g, '');
	return `fractile-${slug}-assessment-${source.header.id}.pdf`;
}

/** Build the report; `generatedAt` is printed on the cover and nowhere else. */
export function buildReportPdf(
	source: AssessedSource,
	generatedAt = new Date().toISOString()
): Promise<Buffer> {
	const when = documentDate(source);
	const doc = new PDFDocument({
		size: 'A4',
		margin: MARGIN,
		bufferPages: true,
		info: {
			Title: pdfText(`${source.snapshot.asset.name}: ${source.header.title}`),
			Author: pdfText(source.header.approvedBy ?? 'Fractile'),
			Subject: 'Concrete cover assessment',
			Creator: 'Fractile',
			Producer: 'Fractile (pdfkit)',
			CreationDate: when,
			ModDate: when
		}
	});
	const chunks: Buffer[] = [];
	doc.on('data', (c: Buffer) => chunks.push(c));
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});
	registerReportFonts(doc);
	doc.font('Body');
	const w = new ReportWriter(doc);
	coverPage(w, source, generatedAt);
	ownerSummary(w, source);
	lowAreaSection(w, source);
	customSection(w, source);
	methodStatement(w, source);
	populationSections(w, source);
	riskSection(w, source);
	appendices(w, source);
	w.heading('Caution');
	w.paragraph(`${CAUTION_TITLE} ${CAUTION_TEXT}`);
	footers(doc, source.snapshot.asset.name);
	doc.end();
	return done;
}
