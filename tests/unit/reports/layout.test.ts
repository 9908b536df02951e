import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { registerReportFonts } from '../../../src/lib/server/reports/fonts';
import { ReportWriter } from '../../../src/lib/server/reports/layout';
import { overlappingLines, textLines } from '../../helpers/pdfLayout';

async function render(draw: (w: ReportWriter) => void): Promise<string> {
	const doc = new PDFDocument({ size: 'A4', margin: 56 });
	const chunks: Buffer[] = [];
	doc.on('data', (c: Buffer) => chunks.push(c));
	const done = new Promise<Buffer>((resolve) =>
		doc.on('end', () => resolve(Buffer.concat(chunks)))
	);
	registerReportFonts(doc);
	draw(new ReportWriter(doc));
	doc.end();
	const file = join(mkdtempSync(join(tmpdir(), 'fractile-layout-')), 'layout.pdf');
	writeFileSync(file, await done);
	return file;
}

describe('the report writer', () => {
	it('gives a key that wraps over several lines the height it needs, so the next row does not print over it', async () => {
		const file = await render((w) =>
			w.keyValues([
				['Readings below minimum cover', '5.4 %'],
				['Projected share without protection (depassivated) at the design life', '82.8 %'],
				['Area at this level', 'about 540 m² (scanned grid extent)']
			])
		);
		const lines = textLines(file);
		expect(lines.map((l) => l.text).join(' ')).toContain('Area at this level');
		expect(overlappingLines(lines)).toEqual([]);
	});

	it('prints the signs of the method statement in its typeface (k·√t, ≤, Δc_dev, β = −Φ⁻¹(P))', async () => {
		const file = await render((w) => w.paragraph('x = k·√t; c ≤ c_min; Δc_dev; β = −Φ⁻¹(P); C₀'));
		const text = textLines(file)
			.map((l) => l.text)
			.join(' ');
		expect(text).toContain('k·√t');
		expect(text).toContain('≤');
		expect(text).toContain('Δc_dev');
		expect(text).toContain('β = −Φ⁻¹(P)');
		expect(text).toContain('C₀');
	});

	it('finds text printed over text (the checker itself: two lines drawn at one place)', async () => {
		const file = await render((w) => {
			w.doc.font('Body').fontSize(10).text('first line of text', 56, 100);
			w.doc.text('second line of text', 60, 103);
		});
		expect(overlappingLines(textLines(file)).length).toBeGreaterThan(0);
	});
});
