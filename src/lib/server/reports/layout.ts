/**
 * A small writer over pdfkit: headings, paragraphs, key–value lists and tables that break
 * across pages, in the report's own typeface (fonts.ts), which prints √, ≤, Δ, β and Φ⁻¹.
 */
import type PDFDocument from 'pdfkit';
import { pdfText } from './text';

export const MARGIN = 56;
const FOOTER_SPACE = 40;

export class ReportWriter {
	constructor(readonly doc: PDFKit.PDFDocument) {}

	get width(): number {
		return this.doc.page.width - 2 * MARGIN;
	}

	/** Start a new page when fewer than `height` points are left above the footer. */
	ensureSpace(height: number): void {
		if (this.doc.y + height > this.doc.page.height - MARGIN - FOOTER_SPACE) this.doc.addPage();
	}

	heading(text: string, level: 1 | 2 = 1): void {
		this.ensureSpace(60);
		this.doc.moveDown(level === 1 ? 0.8 : 0.5);
		this.doc
			.font('Body-Bold')
			.fontSize(level === 1 ? 16 : 12)
			.fillColor('#111111');
		this.doc.text(pdfText(text), MARGIN, this.doc.y, { width: this.width });
		this.doc.moveDown(0.3);
	}

	paragraph(text: string, options: { size?: number; bold?: boolean } = {}): void {
		this.doc
			.font(options.bold ? 'Body-Bold' : 'Body')
			.fontSize(options.size ?? 10)
			.fillColor('#222222');
		this.ensureSpace(this.doc.heightOfString(pdfText(text), { width: this.width }) + 4);
		this.doc.text(pdfText(text), MARGIN, this.doc.y, { width: this.width });
		this.doc.moveDown(0.4);
	}

	keyValues(rows: [string, string][]): void {
		const keyWidth = 150;
		for (const [key, value] of rows) {
			// The key may wrap too (a long label over two or three lines): the row is as tall as the
			// taller of the two, or the next row's text would print over the key's last line.
			this.doc.font('Body-Bold').fontSize(10);
			const keyHeight = this.doc.heightOfString(pdfText(key), { width: keyWidth - 8 });
			this.doc.font('Body');
			const valueHeight = this.doc.heightOfString(pdfText(value), {
				width: this.width - keyWidth
			});
			const height = Math.max(14, keyHeight, valueHeight);
			this.ensureSpace(height + 2);
			const y = this.doc.y;
			this.doc.font('Body-Bold').text(pdfText(key), MARGIN, y, { width: keyWidth - 8 });
			this.doc
				.font('Body')
				.text(pdfText(value), MARGIN + keyWidth, y, { width: this.width - keyWidth });
			this.doc.y = y + height + 2;
		}
		this.doc.moveDown(0.3);
	}

	/** A table; column widths are fractions of the text width. Rows break across pages. */
	table(
		columns: { title: string; width: number; align?: 'left' | 'right' }[],
		rows: string[][]
	): void {
		const widths = columns.map((c) => c.width * this.width);
		const drawRow = (cells: string[], bold: boolean) => {
			this.doc.font(bold ? 'Body-Bold' : 'Body').fontSize(8.5);
			const height =
				Math.max(
					...cells.map((c, i) => this.doc.heightOfString(pdfText(c), { width: widths[i] - 8 }))
				) + 4;
			this.ensureSpace(height);
			const y = this.doc.y;
			let x = MARGIN;
			cells.forEach((cell, i) => {
				this.doc.text(pdfText(cell), x + 4, y + 2, {
					width: widths[i] - 8,
					align: columns[i].align ?? 'left'
				});
				x += widths[i];
			});
			this.doc
				.moveTo(MARGIN, y + height)
				.lineTo(MARGIN + this.width, y + height)
				.lineWidth(0.3)
				.strokeColor('#999999')
				.stroke();
			this.doc.y = y + height;
		};
		drawRow(
			columns.map((c) => c.title),
			true
		);
		for (const row of rows) drawRow(row, false);
		this.doc.x = MARGIN;
		this.doc.moveDown(0.6);
	}

	/** A chart image across the text width; `aspect` is its height over its width in pixels. */
	image(png: Buffer, alt: string, aspect = 420 / 900): void {
		const height = this.width * aspect;
		this.ensureSpace(height + 24);
		this.doc.image(png, MARGIN, this.doc.y, { width: this.width });
		this.doc.y += height + 4;
		this.paragraph(alt, { size: 8 });
	}
}

export type PdfDoc = InstanceType<typeof PDFDocument>;
