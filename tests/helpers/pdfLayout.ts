/**
 * Where each line of text sits on a PDF's pages, read back with poppler's
 * `pdftotext -bbox-layout`, to find text printed over other text.
 */
import { execFileSync } from 'node:child_process';

export interface TextLine {
	page: number;
	text: string;
	xMin: number;
	yMin: number;
	xMax: number;
	yMax: number;
}

export function textLines(file: string): TextLine[] {
	const xhtml = execFileSync('pdftotext', ['-bbox-layout', file, '-'], {
		encoding: 'utf8',
		maxBuffer: 64 * 1024 * 1024
	});
	const lines: TextLine[] = [];
	const pages = xhtml.split(/<page [^>]*>/).slice(1);
	pages.forEach((pageXml, index) => {
		const linePattern =
			/<line xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([\s\S]*?)<\/line>/g;
		for (const m of pageXml.matchAll(linePattern)) {
			const words = [...m[5].matchAll(/<word[^>]*>([^<]*)<\/word>/g)].map((w) => w[1]);
			lines.push({
				page: index + 1,
				text: words.join(' '),
				xMin: Number(m[1]),
				yMin: Number(m[2]),
				xMax: Number(m[3]),
				yMax: Number(m[4])
			});
		}
	});
	return lines;
}

/**
 * Pairs of lines on the same page whose boxes overlap by more than `tolerancePt` in both
 * directions. A glyph box includes its ascent and descent, so lines set one under the other
 * touch; text printed over text overlaps by several points.
 */
export function overlappingLines(lines: readonly TextLine[], tolerancePt = 1.5) {
	const out: [TextLine, TextLine][] = [];
	for (let i = 0; i < lines.length; i++) {
		for (let j = i + 1; j < lines.length; j++) {
			const a = lines[i];
			const b = lines[j];
			if (a.page !== b.page) continue;
			const dx = Math.min(a.xMax, b.xMax) - Math.max(a.xMin, b.xMin);
			const dy = Math.min(a.yMax, b.yMax) - Math.max(a.yMin, b.yMin);
			if (dx > tolerancePt && dy > tolerancePt) out.push([a, b]);
		}
	}
	return out;
}
